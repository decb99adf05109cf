import SwaggerParser from "@apidevtools/swagger-parser";
import { Ajv2020 } from "ajv/dist/2020.js";
import { describe, expect, it } from "vitest";
import { openApiDocument } from "~/lib/openapi.server";
import { loader as jsonLoader } from "~/routes/api.v1.openapi-json";
import { loader as pageLoader } from "~/routes/api.v1.docs";
import { checkApiResponse, documentedPath } from "../support/openapi";
import { allRoutePaths } from "../support/routes";

// The OpenAPI 3.1 description of /api/v1 (docs/api.md): valid by an independent parser, complete
// against app/routes.ts, served as built, and strict enough to catch a response that drifts.
const doc = openApiDocument();
const ROOF = {
  id: "0f5c2c4e-7a59-4c1e-9a55-2f1d3c4b5a69",
  name: "Workshop roof",
  version: 2,
  shared: false,
  canEdit: true,
  owner: { id: "5b0b8c59-0d8e-4a7e-8f0e-6a2f3f1b9c11", name: "Dana Example" },
  spec: {
    outline: [
      [0, 0],
      [10, 0],
      [10, 6],
      [0, 6],
    ],
    outlets: [{ at: [5, 0] }],
    baseFall: "1:60",
  },
  underlay: null,
  hasUnderlayImage: false,
  createdAt: "2026-12-01T10:00:00.000Z",
  updatedAt: "2026-12-02T09:30:00.000Z",
};
const asJson = (body: unknown, status = 200) => Response.json(body, { status });

describe("the OpenAPI document", () => {
  it("is a valid OpenAPI 3.1 document by @apidevtools/swagger-parser", async () => {
    const api = (await SwaggerParser.validate(structuredClone(doc) as never)) as { openapi?: string; paths?: object };
    expect(api.openapi).toBe("3.1.0");
    expect(Object.keys(api.paths ?? {}).length).toBeGreaterThanOrEqual(10);
    // The same parser refuses a broken copy, so the pass above means something.
    const broken = structuredClone(doc) as unknown as {
      info: { title?: string };
      paths: Record<string, Record<string, { parameters?: unknown }>>;
    };
    delete broken.info.title;
    await expect(SwaggerParser.validate(broken as never)).rejects.toThrow();
    broken.info.title = "Fallwright API";
    broken.paths["/api/v1/roofs/{id}"].get.parameters = [{ name: "id", in: "body" }];
    await expect(SwaggerParser.validate(broken as never)).rejects.toThrow();
  });

  it("describes every /api/v1 route of app/routes.ts, and no route that is not there", () => {
    const routes = allRoutePaths()
      .filter((r) => r.path.startsWith("/api/v1"))
      .map((r) => r.path.replace(/:(\w+)/g, "{$1}"));
    expect(Object.keys(doc.paths ?? {}).sort()).toEqual([...new Set(routes)].sort());
  });

  it("takes the roof spec from the engine's own schema", () => {
    const ajv = new Ajv2020({ strict: false });
    const validate = ajv.compile(doc.components!.schemas!.RoofSpec as object);
    expect(validate(ROOF.spec)).toBe(true);
    expect(
      validate({
        ...ROOF.spec,
        outline: [
          [0, 0],
          [1, 1],
        ],
      }),
    ).toBe(false); // the engine's 3-vertex minimum
    expect(validate({ ...ROOF.spec, joists: { spacing: 0.01 } })).toBe(false); // and its 0.05 m spacing minimum
    expect(validate({ outline: ROOF.spec.outline })).toBe(false); // baseFall is required
  });

  it("is what GET /api/v1/openapi.json serves", async () => {
    const res = jsonLoader();
    expect(res.status).toBe(200);
    expect(await res.clone().json()).toEqual(doc);
    await checkApiResponse("GET", "/api/v1/openapi.json", res);
  });

  it("reads as a page at GET /api/v1/docs: every operation and schema, nothing loaded from elsewhere", async () => {
    const res = pageLoader();
    expect(res.headers.get("content-type")).toMatch(/^text\/html/);
    const html = await res.text();
    for (const [path, item] of Object.entries(doc.paths ?? {})) {
      for (const method of Object.keys(item as object)) expect(html).toContain(`${method.toUpperCase()} ${path}`);
    }
    for (const name of Object.keys(doc.components?.schemas ?? {}))
      expect(html).toContain(`id="schema-${name.toLowerCase()}"`);
    expect(html).not.toMatch(/<script|<link|src="http|href="http/i);
    expect(html).toContain('<a href="#schema-roofspec">RoofSpec</a>');
  });
});

describe("checkApiResponse holds real answers to the document", () => {
  it("passes an answer that matches", async () => {
    await expect(checkApiResponse("GET", `/api/v1/roofs/${ROOF.id}`, asJson(ROOF))).resolves.toBeUndefined();
    expect(documentedPath(`/api/v1/roofs/${ROOF.id}`)).toBe("/api/v1/roofs/{id}");
    expect(documentedPath("/api/v1/roofs")).toBe("/api/v1/roofs");
  });

  it("fails an answer missing a documented key, or with one the document does not know", async () => {
    const { canEdit: _gone, ...missing } = ROOF;
    await expect(checkApiResponse("GET", `/api/v1/roofs/${ROOF.id}`, asJson(missing))).rejects.toThrow(/canEdit/);
    await expect(
      checkApiResponse("GET", `/api/v1/roofs/${ROOF.id}`, asJson({ ...ROOF, colour: "red" })),
    ).rejects.toThrow(/additional/);
    await expect(
      checkApiResponse("GET", `/api/v1/roofs/${ROOF.id}`, asJson({ ...ROOF, version: "2" })),
    ).rejects.toThrow(/version/);
  });

  it("fails a status, content type or method the document does not list", async () => {
    await expect(checkApiResponse("GET", "/api/v1/roofs", asJson({ roofs: [] }, 418))).rejects.toThrow(/418/);
    await expect(
      checkApiResponse("GET", "/api/v1/roofs", new Response("{}", { headers: { "Content-Type": "text/plain" } })),
    ).rejects.toThrow(/content type/);
    await expect(checkApiResponse("PATCH", "/api/v1/roofs", asJson({}))).rejects.toThrow(/not in the OpenAPI document/);
    await expect(checkApiResponse("GET", "/api/v1/nowhere", asJson({}))).rejects.toThrow(/no path/);
  });

  it("accepts 405 for a method the document does not list, and errors in the one error shape", async () => {
    await expect(
      checkApiResponse("PATCH", "/api/v1/roofs", asJson({ error: { message: "no", issues: [] } }, 405)),
    ).resolves.toBeUndefined();
    await expect(
      checkApiResponse("GET", "/api/v1/roofs", asJson({ error: { message: "Sign in first.", issues: [] } }, 401)),
    ).resolves.toBeUndefined();
    await expect(checkApiResponse("GET", "/api/v1/roofs", asJson({ message: "Sign in first." }, 401))).rejects.toThrow(
      /error/,
    );
  });

  it("leaves the caller's body readable", async () => {
    const res = asJson(ROOF);
    await checkApiResponse("GET", `/api/v1/roofs/${ROOF.id}`, res);
    expect((await res.json()).name).toBe("Workshop roof");
  });
});
