import { fileURLToPath } from "node:url";
import Papa from "papaparse";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";
import { beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { BASE, call, cookieFor, getRequest, jsonRequest, SMALL_SPEC } from "../support/roofs";
import { analyse, parseSpec, type RoofSpec } from "~/engine";
import { measurePlaces } from "~/lib/pack/measured-schedule";
import { verdictLine, worstLine } from "~/lib/as-built-check";
import { runInPool } from "~/lib/pool.server";
import * as api from "~/routes/api.v1.roofs";
import * as checks from "~/routes/roofs.$id.checks";
import * as checkPage from "~/routes/roofs.$id.checks.$checkId";
import * as checkPdf from "~/routes/roofs.$id.checks.$checkId-pdf";
import * as csvRoute from "~/routes/roofs.$id.schedule-csv";
import * as roofPage from "~/routes/roofs.$id";

// Saved as-built checks through the route modules against a real database: created from the
// joist-by-joist form or an uploaded CSV by whoever may edit the roof, read by whoever may read
// it, and the PDF's verdict and worst deviation the page's own.
const { db } = useTestDatabase();
const FONTS = fileURLToPath(new URL("../../node_modules/pdfjs-dist/standard_fonts/", import.meta.url));

async function pdfText(bytes: Uint8Array): Promise<string> {
  const doc = await getDocument({ data: bytes.slice(), isEvalSupported: false, standardFontDataUrl: FONTS }).promise;
  let text = "";
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    text += `${content.items.map((it) => ("str" in it ? it.str : "")).join(" ")} `;
  }
  await doc.destroy();
  return text.replace(/\s+/g, " ");
}

function post(path: string, fields: Record<string, string | Blob>, cookie?: string) {
  const body = new FormData();
  for (const [k, v] of Object.entries(fields)) body.append(k, v);
  return new Request(BASE + path, { method: "POST", body, headers: cookie ? { cookie } : {} });
}

const META = { measuredBy: "Ines Varga", checkedBy: "Tomas Reyes", measuredOn: "2026-12-02" };

function places() {
  const parsed = parseSpec(SMALL_SPEC);
  if (!parsed.ok) throw new Error("spec");
  return measurePlaces(parsed.spec as RoofSpec, analyse(parsed.spec, { mesh: false, traces: false }).shaped.joists);
}

async function roofFor(cookie: string, name: string) {
  const res = await call(api.action, jsonRequest("POST", "/api/v1/roofs", { name, spec: SMALL_SPEC }, cookie));
  return (await res.json()).id as string;
}

// The engine pool's first thread loads the engine through tsx; on a loaded machine that can take
// longer than a request's 15 s, so it is started here, outside the requests under test.
beforeAll(async () => {
  await runInPool("engine", { kind: "shape", spec: SMALL_SPEC, mesh: false });
}, 120_000);

describe("saved as-built checks", () => {
  it("the form makes a check kept with the roof; its page and PDF agree on the verdict and worst deviation", async () => {
    const owner = await cookieFor("designer@tidemark.example");
    const id = await roofFor(owner, "Check roof");
    const levels: Record<string, string> = {};
    for (const p of places()) levels[`level:${p.label}`] = String(Math.round(p.design * 1000));
    levels["level:J5 start"] = String(Number(levels["level:J5 start"]) - 15);
    const res = await call(checks.action, post(`/roofs/${id}/checks`, { intent: "form", ...META, ...levels }, owner), {
      id,
    });
    expect(res.status).toBe(302);
    const checkId = /\/checks\/([0-9a-f-]{36})\?saved=1$/.exec(res.headers.get("location") ?? "")![1];

    const page = await (
      await call(checkPage.loader, getRequest(`/roofs/${id}/checks/${checkId}`, owner), { id, checkId })
    ).json();
    const r = page.check.result;
    expect(page.check).toMatchObject({ measuredBy: "Ines Varga", checkedBy: "Tomas Reyes", measuredOn: "2026-12-02" });
    expect(r.verdict.passed).toBe(false);
    expect(worstLine(r)).toBe("Worst deviation: -15 mm at J5 start");
    expect(r.fixes.map((f: { joist: number; end: string; change: number }) => [f.joist, f.end, f.change])).toEqual([
      [4, "start", 0.015],
    ]);

    const pdf = await call(checkPdf.loader, getRequest(`/roofs/${id}/checks/${checkId}.pdf`, owner), { id, checkId });
    expect(pdf.headers.get("content-type")).toBe("application/pdf");
    expect(pdf.headers.get("content-disposition")).toBe(
      'attachment; filename="check-roof-as-built-check-2026-12-02.pdf"',
    );
    const text = await pdfText(new Uint8Array(await pdf.arrayBuffer()));
    expect(text).toContain(verdictLine(r));
    expect(text).toContain(worstLine(r));
    expect(text).toContain("Measured by: Ines Varga");
    expect(text).toContain("Checked by: Tomas Reyes");
    expect(text).toContain("Date measured: 2026-12-02");
    expect(text).toContain("Pack up J5 start by 15 mm");
    expect(text).toContain("Caution:");

    // The roof's page lists its history: the design, then this check.
    const roof = await (await call(roofPage.loader, getRequest(`/roofs/${id}`, owner), { id })).json();
    expect(roof.checks.map((c: { id: string; passed: boolean }) => [c.id, c.passed])).toEqual([[checkId, false]]);
    const row = await db()("as_built_checks").where({ id: checkId }).first("source", "roof_version", "passed");
    expect(row).toEqual({ source: "form", roof_version: 1, passed: false });
  });

  it("a bad form is 400 naming each field, with everything typed sent back", async () => {
    const owner = await cookieFor("designer@tidemark.example");
    const id = await roofFor(owner, "Check roof 2");
    const res = await call(
      checks.action,
      post(
        `/roofs/${id}/checks`,
        {
          intent: "form",
          measuredBy: "",
          checkedBy: "T",
          measuredOn: "2026-02-30",
          "level:J1 start": "4 in",
          "level:J2 end": "41",
        },
        owner,
      ),
      { id },
    );
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.errors.measuredBy).toBe("Say who measured the levels.");
    expect(body.errors.measuredOn).toBe("That day does not exist.");
    expect(body.errors["level:J1 start"]).toMatch(/in feet or inches/);
    expect(body.values).toMatchObject({ "level:J1 start": "4 in", "level:J2 end": "41", checkedBy: "T" });
    expect(await db()("as_built_checks").whereIn("roof_id", [id]).count({ n: "*" })).toEqual([{ n: "0" }]);
  });

  it("the roof's own measured schedule download, filled and uploaded, makes a passing check; a bad row is named", async () => {
    const owner = await cookieFor("designer@tidemark.example");
    const id = await roofFor(owner, "Check roof 3");
    const csv = (
      await (await call(csvRoute.loader, getRequest(`/roofs/${id}/schedule.csv`, owner), { id })).text()
    ).replace(/^\uFEFF/, "");
    const rows = Papa.parse<string[]>(csv).data;
    const h = rows.findIndex((r) => r[0] === "joist");
    const col = (n: string) => rows[h].indexOf(n);
    const fill = (bad: boolean) =>
      Papa.unparse(
        rows.map((r, i) => {
          const o = [...r];
          if (r[0] === "check_point") o[7] = r[6];
          if (i > h && r[0] !== "") {
            o[col("start_measured_mm")] = r[col("start_level_mm")];
            o[col("end_measured_mm")] = bad && i === h + 2 ? "" : r[col("end_level_mm")];
          }
          return o;
        }),
      );
    const bad = await call(
      checks.action,
      post(`/roofs/${id}/checks`, { intent: "upload", ...META, file: new File([fill(true)], "schedule.csv") }, owner),
      { id },
    );
    expect(bad.status).toBe(400);
    const badBody = await bad.json();
    expect(badBody.errors.file).toBe(`Row ${h + 3}: J2 end has no measured level.`);
    // What the file held comes back for the form: nothing is lost.
    expect(badBody.values["level:J2 start"]).toBe(rows[h + 2][col("start_level_mm")]);

    const good = await call(
      checks.action,
      post(`/roofs/${id}/checks`, { intent: "upload", ...META, file: new File([fill(false)], "schedule.csv") }, owner),
      { id },
    );
    expect(good.status).toBe(302);
    const checkId = /\/checks\/([0-9a-f-]{36})/.exec(good.headers.get("location")!)![1];
    const page = await (
      await call(checkPage.loader, getRequest(`/roofs/${id}/checks/${checkId}`, owner), { id, checkId })
    ).json();
    expect(verdictLine(page.check.result)).toBe("Verdict: PASS");
    expect(page.check.source).toBe("csv");
  });

  it("whoever may read the roof reads its checks; only whoever may edit it adds one; others get 404", async () => {
    // trainee@ is in the designer's organisation: a colleague once the roof is shared.
    const owner = await cookieFor("designer@tidemark.example");
    const colleague = await cookieFor("trainee@tidemark.example");
    const id = await roofFor(owner, "Shared check roof");
    const levels: Record<string, string> = {};
    for (const p of places().slice(0, 6)) levels[`level:${p.label}`] = String(Math.round(p.design * 1000));
    const made = await call(checks.action, post(`/roofs/${id}/checks`, { intent: "form", ...META, ...levels }, owner), {
      id,
    });
    const checkId = /\/checks\/([0-9a-f-]{36})/.exec(made.headers.get("location")!)![1];

    // Not shared yet: a colleague is told nothing exists.
    expect((await call(checks.loader, getRequest(`/roofs/${id}/checks`, colleague), { id })).status).toBe(404);
    expect(
      (await call(checkPage.loader, getRequest(`/roofs/${id}/checks/${checkId}`, colleague), { id, checkId })).status,
    ).toBe(404);
    expect(
      (await call(checkPdf.loader, getRequest(`/roofs/${id}/checks/${checkId}.pdf`, colleague), { id, checkId }))
        .status,
    ).toBe(404);
    await db()("roofs").where({ id }).update({ shared: true });

    const list = await (await call(checks.loader, getRequest(`/roofs/${id}/checks`, colleague), { id })).json();
    expect(list.checks).toHaveLength(1);
    expect(list.places).toEqual([]);
    expect(
      (await call(checkPage.loader, getRequest(`/roofs/${id}/checks/${checkId}`, colleague), { id, checkId })).status,
    ).toBe(200);
    expect(
      (await call(checkPdf.loader, getRequest(`/roofs/${id}/checks/${checkId}.pdf`, colleague), { id, checkId }))
        .status,
    ).toBe(200);
    const refused = await call(
      checks.action,
      post(`/roofs/${id}/checks`, { intent: "form", ...META, ...levels }, colleague),
      { id },
    );
    expect(refused.status).toBe(403);

    // A check id under another roof is not found.
    const other = await roofFor(owner, "Other roof");
    expect(
      (await call(checkPage.loader, getRequest(`/roofs/${other}/checks/${checkId}`, owner), { id: other, checkId }))
        .status,
    ).toBe(404);
    const anonymous = await call(checks.loader, getRequest(`/roofs/${id}/checks`), { id });
    expect(anonymous.status).toBe(302);
  });
});
