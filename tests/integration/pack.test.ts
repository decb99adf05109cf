import DxfParser from "dxf-parser";
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { BASE, call, cookieFor, getRequest, jsonRequest, SMALL_SPEC } from "../support/roofs";
import * as api from "~/routes/api.v1.roofs";
import * as analyses from "~/routes/api.v1.analyses";
import * as editor from "~/routes/roofs.$id";
import * as csvRoute from "~/routes/roofs.$id.schedule-csv";
import * as pdfRoute from "~/routes/roofs.$id.sheet-pdf";
import * as dxfRoute from "~/routes/roofs.$id.plan-dxf";
import * as glbRoute from "~/routes/roofs.$id.roof-glb";
import * as sharePage from "~/routes/s.$token";
import * as shareFile from "~/routes/s.$token.$file";

// The builder's pack of a saved roof and its read-only share links, through the route modules
// against a real database (the permission boundaries are those of the roof itself).
const { db } = useTestDatabase();
const today = () => new Date().toISOString().slice(0, 10);

function form(path: string, fields: Record<string, string>, cookie?: string) {
  const body = new FormData();
  for (const [k, v] of Object.entries(fields)) body.set(k, v);
  return new Request(BASE + path, { method: "POST", body, headers: cookie ? { cookie } : {} });
}

async function roofFor(cookie: string, name: string, spec: unknown = SMALL_SPEC) {
  const res = await call(api.action, jsonRequest("POST", "/api/v1/roofs", { name, spec }, cookie));
  return (await res.json()).id as string;
}

describe("a saved roof's files", () => {
  it("serves the CSV, PDF, DXF and glb named after the roof to the owner, agreeing with the analysis API; 404 to others; sign-in first", async () => {
    const owner = await cookieFor("designer@tidemark.example");
    const other = await cookieFor("trainee2@tidemark.example");
    const id = await roofFor(owner, "Depot, north bay");
    const stem = `depot-north-bay`;
    const screen = await (await call(analyses.action, jsonRequest("POST", "/api/v1/analyses", SMALL_SPEC))).json();

    const csv = await call(csvRoute.loader, getRequest(`/roofs/${id}/schedule.csv`, owner), { id });
    expect(csv.status).toBe(200);
    expect(csv.headers.get("content-disposition")).toBe(`attachment; filename="${stem}-drop-schedule-${today()}.csv"`);
    const rows = Papa.parse<string[]>((await csv.text()).replace(/^\uFEFF/, "")).data;
    expect(rows.find((r) => r[0] === "roof")![1]).toBe("Depot, north bay");
    // The same H as the analysis the screen gets for this spec.
    expect(Number(rows.find((r) => r[0] === "high_level_H_mm")![1])).toBe(Math.round(screen.shaped.highLevel * 1000));

    const pdf = await call(pdfRoute.loader, getRequest(`/roofs/${id}/sheet.pdf`, owner), { id });
    expect(pdf.headers.get("content-type")).toBe("application/pdf");
    expect(pdf.headers.get("content-disposition")).toContain(`${stem}-check-sheet-${today()}.pdf`);
    expect(new TextDecoder().decode((await pdf.arrayBuffer()).slice(0, 5))).toBe("%PDF-");

    const dxf = await call(dxfRoute.loader, getRequest(`/roofs/${id}/plan.dxf`, owner), { id });
    expect(dxf.headers.get("content-disposition")).toContain(`${stem}-plan-${today()}.dxf`);
    const parsed = new DxfParser().parseSync(await dxf.text()) as unknown as {
      entities: { layer: string; type: string }[];
    };
    const joistLines = parsed.entities.filter((e) => e.layer === "JOISTS" && e.type === "LINE");
    expect(joistLines).toHaveLength(
      screen.shaped.joists.reduce((n: number, j: { spans: unknown[] }) => n + j.spans.length, 0),
    );

    const glb = await call(glbRoute.loader, getRequest(`/roofs/${id}/roof.glb`, owner), { id });
    expect(glb.headers.get("content-type")).toBe("model/gltf-binary");
    expect(new TextDecoder().decode((await glb.arrayBuffer()).slice(0, 4))).toBe("glTF");

    for (const route of [csvRoute, pdfRoute, dxfRoute, glbRoute]) {
      expect((await call(route.loader, getRequest(`/roofs/${id}/x`, other), { id })).status).toBe(404);
      const anonymous = await call(route.loader, getRequest(`/roofs/${id}/x`), { id });
      expect(anonymous.status).toBe(302);
      expect(anonymous.headers.get("location")).toMatch(/^\/login/);
    }
  });

  it("answers 422 with the reason for a stored roof the engine can no longer shape, never 500", async () => {
    const owner = await cookieFor("designer@tidemark.example");
    const id = await roofFor(owner, "Will break");
    await db()("roofs")
      .where({ id })
      .update({ spec: JSON.stringify({ ...SMALL_SPEC, baseFall: "steep" }) });
    const res = await call(csvRoute.loader, getRequest(`/roofs/${id}/schedule.csv`, owner), { id });
    expect(res.status).toBe(422);
    expect(await res.text()).toMatch(/baseFall/);
  });
});

describe("read-only share links", () => {
  it("the owner makes a link that works without signing in, stores only its hash, and revoking stops it", async () => {
    const owner = await cookieFor("designer@tidemark.example");
    const id = await roofFor(owner, "Shared annex");
    const made = await call(editor.action, form(`/roofs/${id}`, { intent: "share-link-create" }, owner), { id });
    expect(made.status).toBe(200);
    const { shareLink } = await made.json();
    const token = /^\/s\/([A-Za-z0-9_-]{43})$/.exec(shareLink.path)![1];
    const row = await db()("share_links").where({ id: shareLink.id }).first();
    expect(row!.token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(JSON.stringify(row)).not.toContain(token);

    const page = await call(sharePage.loader, getRequest(`/s/${token}`), { token });
    expect(page.status).toBe(200);
    expect(await page.json()).toMatchObject({ name: "Shared annex", spec: { outline: SMALL_SPEC.outline } });
    const file = await call(shareFile.loader, getRequest(`/s/${token}/schedule.csv`), { token, file: "schedule.csv" });
    expect(file.status).toBe(200);
    expect(await file.text()).toContain("roof,Shared annex");
    expect(
      (await call(shareFile.loader, getRequest(`/s/${token}/secrets.txt`), { token, file: "secrets.txt" })).status,
    ).toBe(404);

    const listed = await (await call(editor.loader, getRequest(`/roofs/${id}`, owner), { id })).json();
    expect(listed.shareLinks.map((l: { id: string }) => l.id)).toEqual([shareLink.id]);

    // Someone else cannot make or revoke links on it.
    const colleague = await cookieFor("trainee@tidemark.example");
    await call(editor.action, form(`/roofs/${id}`, { intent: "share", shared: "true" }, owner), { id });
    expect(
      (await call(editor.action, form(`/roofs/${id}`, { intent: "share-link-create" }, colleague), { id })).status,
    ).toBe(403);
    expect(
      (
        await call(
          editor.action,
          form(`/roofs/${id}`, { intent: "share-link-revoke", linkId: shareLink.id }, colleague),
          { id },
        )
      ).status,
    ).toBe(403);

    const revoked = await call(
      editor.action,
      form(`/roofs/${id}`, { intent: "share-link-revoke", linkId: shareLink.id }, owner),
      { id },
    );
    expect(revoked.status).toBe(200);
    expect((await call(sharePage.loader, getRequest(`/s/${token}`), { token })).status).toBe(404);
    expect(
      (await call(shareFile.loader, getRequest(`/s/${token}/sheet.pdf`), { token, file: "sheet.pdf" })).status,
    ).toBe(404);
  });

  it("answers 404 for a guessed or malformed token, and stops a deleted roof's links", async () => {
    expect((await call(sharePage.loader, getRequest(`/s/${"A".repeat(43)}`), { token: "A".repeat(43) })).status).toBe(
      404,
    );
    expect((await call(sharePage.loader, getRequest(`/s/x'--`), { token: "x'--" })).status).toBe(404);
    const owner = await cookieFor("designer@tidemark.example");
    const id = await roofFor(owner, "Soon gone");
    const { shareLink } = await (
      await call(editor.action, form(`/roofs/${id}`, { intent: "share-link-create" }, owner), { id })
    ).json();
    const token = shareLink.path.slice(3);
    await db()("roofs").where({ id }).update({ deleted_at: new Date() });
    expect((await call(sharePage.loader, getRequest(`/s/${token}`), { token })).status).toBe(404);
  });
});
