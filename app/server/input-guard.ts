/**
 * One check for every input, before any route's loader or action runs (docs/security.md,
 * "Input"): route parameters, query parameters, form fields (urlencoded and multipart, file
 * names included) and JSON bodies. Text PostgreSQL cannot store (NUL, unpaired surrogates),
 * JSON nested deeper than MAX_JSON_DEPTH (JSON bodies and form fields holding JSON, like a
 * lesson's `spec`) and ids that are not UUIDs get a 400 naming the field (a malformed `:id` in
 * the path: 404), never a database error. Applied by wrapping the server build's route modules,
 * so a new route is covered without remembering to call anything.
 */
import type { ServerBuild } from "react-router";
import { parseJsonBytes, readStreamCapped, rememberBody } from "../lib/body.ts";
import { ID_FIELDS, isUuid, jsonProblem, textProblem, type InputProblem } from "../lib/input.ts";

type DataFn = (args: { request: Request; params: Record<string, string | undefined>; context: unknown }) => unknown;

const FORM = /^(application\/x-www-form-urlencoded|multipart\/form-data)/i;
const JSON_TYPE = /^application\/(.+\+)?json/i;

function fieldProblem(name: string, value: string): InputProblem | null {
  const inName = textProblem(name);
  if (inName)
    return {
      path: name.replaceAll("\u0000", "�").replace(/[\uD800-\uDFFF]/g, "�"),
      message: `is a field name that ${inName}`,
    };
  const inValue = textProblem(value);
  if (inValue) return { path: name, message: inValue };
  if (ID_FIELDS.has(name) && value !== "" && !isUuid(value)) return { path: name, message: "must be an id (a UUID)" };
  // A form field that holds JSON (a roof spec, underlay settings) obeys the JSON body's rules.
  const head = value.trimStart()[0];
  if (head === "{" || head === "[") {
    let parsed: unknown;
    try {
      parsed = JSON.parse(value);
    } catch {
      return null; // not JSON after all: the route says what it expected
    }
    return jsonProblem(parsed, name);
  }
  return null;
}

function urlProblem(
  url: URL,
  params: Record<string, string | undefined>,
): { status: 400 | 404; problem: InputProblem } | null {
  for (const [name, value] of Object.entries(params)) {
    if (value === undefined) continue;
    const p = textProblem(value);
    if (p) return { status: 404, problem: { path: `:${name}`, message: p } };
    if (name === "id" && !isUuid(value))
      return { status: 404, problem: { path: ":id", message: "is not an id (a UUID)" } };
  }
  for (const [name, value] of url.searchParams) {
    const p = fieldProblem(name, value);
    if (p) return { status: 400, problem: p };
  }
  return null;
}

/** Bodies are read here once (within the host's cap), checked, and handed on as a fresh Request. */
async function bodyProblem(
  request: Request,
  limit: number,
): Promise<{ request: Request; problem: InputProblem | null; tooLarge?: boolean }> {
  const type = request.headers.get("content-type") ?? "";
  if (!request.body || !(FORM.test(type) || JSON_TYPE.test(type))) return { request, problem: null };
  const bytes = await readStreamCapped(request.body, limit);
  if (!bytes) return { request, problem: null, tooLarge: true };
  const copy = new Request(request.url, {
    method: request.method,
    headers: request.headers,
    body: bytes as Uint8Array<ArrayBuffer>,
    signal: request.signal,
  });
  if (JSON_TYPE.test(type)) {
    // Parsed once, the strict way the API reads it, and handed to the route with the bytes; only
    // bytes that are not UTF-8 are parsed again, leniently, to check what a lenient reader would see.
    const strict = parseJsonBytes(bytes);
    rememberBody(copy, { bytes, json: strict });
    const json = strict.ok ? strict : parseJsonBytes(bytes, "lenient");
    // Not JSON: the route answers "not valid JSON".
    return { request: copy, problem: json.ok ? jsonProblem(json.value) : null };
  }
  rememberBody(copy, { bytes });
  let form: FormData;
  try {
    form = await new Response(bytes as Uint8Array<ArrayBuffer>, { headers: { "Content-Type": type } }).formData();
  } catch {
    return { request: copy, problem: null }; // the route answers "could not be read"
  }
  for (const [name, value] of form) {
    const p =
      typeof value === "string"
        ? fieldProblem(name, value)
        : (fieldProblem(name, "") ??
          (textProblem(value.name)
            ? { path: name, message: `has a file name that ${textProblem(value.name)}` }
            : null));
    if (p) return { request: copy, problem: p };
  }
  return { request: copy, problem: null };
}

function refusal(status: 400 | 404 | 413, problem: InputProblem, json: boolean): Response {
  const message =
    status === 413
      ? problem.message
      : problem.path === "(body)"
        ? `The request body ${problem.message}.`
        : `The field "${problem.path}" ${problem.message}.`;
  // No "Connection: close" on a 413: the host reads and throws away the rest of an oversized body
  // (capBodySize's lingering close), so the client reads this answer instead of a reset.
  const headers: Record<string, string> = {};
  if (json) return Response.json({ error: { message, issues: status === 413 ? [] : [problem] } }, { status, headers });
  return new Response(message, { status, headers: { ...headers, "Content-Type": "text/plain; charset=utf-8" } });
}

const checkedUrls = new WeakMap<Request, ReturnType<typeof urlProblem>>();

function guard(fn: DataFn, o: { action: boolean; resource: boolean; bodyLimit: number }): DataFn {
  return async (args) => {
    let found = checkedUrls.get(args.request);
    if (found === undefined) {
      found = urlProblem(new URL(args.request.url), args.params);
      checkedUrls.set(args.request, found);
    }
    if (found) throw refusal(found.status, found.problem, o.resource);
    if (!o.action) return fn(args);
    const body = await bodyProblem(args.request, o.bodyLimit);
    if (body.tooLarge) {
      const mb = Math.round(o.bodyLimit / 1024 / 1024);
      throw refusal(413, { path: "(body)", message: `The request body is over ${mb} MB.` }, o.resource);
    }
    if (body.problem) throw refusal(400, body.problem, o.resource);
    return fn({ ...args, request: body.request });
  };
}

const guarded = new WeakMap<ServerBuild, ServerBuild>();

/** The build with every loader and action behind the input guard. */
export function guardInput(build: ServerBuild, bodyLimit: number): ServerBuild {
  const known = guarded.get(build);
  if (known) return known;
  const routes: ServerBuild["routes"] = {};
  for (const [id, route] of Object.entries(build.routes)) {
    if (!route) continue;
    const m = route.module;
    // Resource routes (no page) answer in the JSON API's error shape; pages show the message.
    const resource = !m.default;
    const module = { ...m };
    if (m.loader) module.loader = guard(m.loader as DataFn, { action: false, resource, bodyLimit }) as typeof m.loader;
    if (m.action) module.action = guard(m.action as DataFn, { action: true, resource, bodyLimit }) as typeof m.action;
    routes[id] = { ...route, module };
  }
  const out = { ...build, routes };
  guarded.set(build, out);
  return out;
}
