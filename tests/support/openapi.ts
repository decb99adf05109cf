/**
 * Holds real API responses to the OpenAPI document (/api/v1/openapi.json), so the description
 * cannot drift from the code: `call()` in tests/support/roofs.ts and the API tests that fetch
 * from a running server pass every /api/v1 response through `checkApiResponse`. The document's
 * schemas are JSON Schema 2020-12 (OpenAPI 3.1), checked here with ajv.
 */
import { Ajv2020, type ValidateFunction } from "ajv/dist/2020.js";
import addFormatsModule from "ajv-formats";
import { openApiDocument, type OpenApiDocument } from "~/lib/openapi.server";

// ajv-formats is CommonJS: its function is the default export's default under some loaders.
const addFormats = ((addFormatsModule as unknown as { default?: typeof addFormatsModule }).default ??
  addFormatsModule) as typeof addFormatsModule;

interface Media {
  schema?: unknown;
}
interface ResponseObject {
  description?: string;
  content?: Record<string, Media>;
}
type Operation = { responses?: Record<string, ResponseObject> };

let state: {
  doc: OpenApiDocument;
  ajv: Ajv2020;
  templates: { path: string; pattern: RegExp; params: number }[];
} | null = null;

function load() {
  if (state) return state;
  const doc = openApiDocument();
  const ajv = new Ajv2020({ strict: false, allErrors: true });
  addFormats(ajv);
  ajv.addSchema(doc as object, "openapi");
  const templates = Object.keys(doc.paths ?? {})
    .map((path) => ({
      path,
      pattern: new RegExp(`^${path.replace(/[.*+?^$()|[\]\\]/g, "\\$&").replace(/\\?\{[^}]+\\?\}/g, "[^/]+")}$`),
      params: (path.match(/\{/g) ?? []).length,
    }))
    .sort((a, b) => a.params - b.params);
  state = { doc, ajv, templates };
  return state;
}

const pointer = (part: string) => part.replace(/~/g, "~0").replace(/\//g, "~1");
const validators = new Map<string, ValidateFunction>();

/** The documented path template a request path falls under, e.g. /api/v1/roofs/{id}. */
export function documentedPath(pathname: string): string | null {
  return load().templates.find((t) => t.pattern.test(pathname))?.path ?? null;
}

/**
 * Throws unless the response is one the document describes for this method and path: the status
 * is listed, the content type is the listed one, and a JSON body matches the listed schema. A
 * method the document does not list must answer 405. Reads a clone: the caller's body is untouched.
 */
export async function checkApiResponse(method: string, url: string, res: Response): Promise<void> {
  const pathname = new URL(url, "http://localhost").pathname.replace(/\/+$/, "") || "/";
  if (!pathname.startsWith("/api/v1")) return;
  const { doc, ajv } = load();
  const template = documentedPath(pathname);
  if (!template)
    throw new Error(
      `${method} ${pathname}: no path in the OpenAPI document matches it (add it to app/lib/openapi.server.ts)`,
    );
  const verb = method.toLowerCase() === "head" ? "get" : method.toLowerCase();
  const operation = (doc.paths![template] as Record<string, Operation | undefined>)[verb];
  if (!operation) {
    if (res.status === 405) return;
    throw new Error(
      `${method} ${template} is not in the OpenAPI document, yet it answered ${res.status} (document it, or answer 405)`,
    );
  }
  const status = String(res.status);
  const response = operation.responses?.[status] ?? operation.responses?.default;
  if (!response) {
    throw new Error(
      `${method} ${template} answered ${status}, which the OpenAPI document does not list (it lists ${Object.keys(operation.responses ?? {}).join(", ")})`,
    );
  }
  const documented = Object.keys(response.content ?? {});
  if (!documented.length) return;
  const type = (res.headers.get("content-type") ?? "").split(";")[0].trim().toLowerCase();
  if (!documented.includes(type))
    throw new Error(
      `${method} ${template} ${status}: content type "${type}", the document says ${documented.join(" or ")}`,
    );
  if (type !== "application/json") return;
  const body: unknown = await res.clone().json();
  const key = `${template} ${verb} ${status}`;
  let validate = validators.get(key);
  if (!validate) {
    const ref = `openapi#/paths/${pointer(template)}/${verb}/responses/${operation.responses?.[status] ? status : "default"}/content/application~1json/schema`;
    validate = ajv.getSchema(ref);
    if (!validate) throw new Error(`no schema at ${ref}`);
    validators.set(key, validate);
  }
  if (!validate(body)) {
    const problems = (validate.errors ?? [])
      .slice(0, 8)
      .map((e) => `${e.instancePath || "(body)"} ${e.message}${e.params ? ` ${JSON.stringify(e.params)}` : ""}`);
    throw new Error(
      `${method} ${template} ${status}: the body does not match the OpenAPI document:\n  ${problems.join("\n  ")}\nbody: ${JSON.stringify(body).slice(0, 400)}`,
    );
  }
}
