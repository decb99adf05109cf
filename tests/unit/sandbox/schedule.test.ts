import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { action, loader } from "~/routes/sandbox.schedule-csv";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import { decodeSpec, encodeSpec, sheetHref, SHEET_LINK_LIMIT } from "~/lib/sheet-link";
import { readLinkedSpec } from "~/lib/linked-spec.server";
import { formatIn } from "~/components/sandbox/format";
import { scheduleColumns } from "~/components/sandbox/schedule/schedule-columns";
import { scheduleRows } from "~/lib/pack/schedule-rows";
import { analyse, parseSpec, type RoofSpec } from "~/engine";
import { scheduleCsv } from "~/lib/pack/schedule-csv";
import { packOf } from "../pack/fixtures";

function parseOk(input: unknown): RoofSpec {
  const r = parseSpec(input);
  if (!r.ok) throw new Error(r.error.message);
  return r.spec;
}

/** The table below the CSV's header block. */
function tableOf(text: string): string {
  const t = text.replace(/^\uFEFF/, "").trim();
  return t.slice(t.indexOf("\r\n,") + 2).replace(/^,*\r\n/, "");
}

type ActionArgs = Parameters<typeof action>[0];

function post(body: BodyInit, type: string) {
  const request = new Request("http://localhost/sandbox/schedule.csv", {
    method: "POST",
    body,
    headers: { "Content-Type": type },
  });
  return action({ request, params: {}, context: {} } as unknown as ActionArgs);
}

const form = (spec: string) => post(new URLSearchParams({ spec }), "application/x-www-form-urlencoded");

describe("POST /sandbox/schedule.csv", () => {
  it("answers the drop schedule as a CSV attachment named after the roof and the day", async () => {
    const res = await post(
      new URLSearchParams({ spec: JSON.stringify(DEMO_ROOF), name: "Depot, east wing" }),
      "application/x-www-form-urlencoded",
    );
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    const today = new Date().toISOString().slice(0, 10);
    expect(res.headers.get("content-disposition")).toBe(
      `attachment; filename="depot-east-wing-drop-schedule-${today}.csv"`,
    );
    const text = (await res.text()).replace(/^\uFEFF/, "").trim();
    // The same writer as the roof's download and the CLI: the same file for the same roof and day.
    expect(text).toBe(scheduleCsv(packOf(DEMO_ROOF, "Depot, east wing", new Date())).trim());
    const table = text.slice(text.indexOf("\r\n,") + 2).replace(/^,*\r\n/, "");
    const parsed = Papa.parse<Record<string, string>>(table, { header: true });
    expect(parsed.errors).toEqual([]);
    // Joists every 0.4 m across 12 m: 31 lines, one span each on a rectangle (so no span column).
    expect(parsed.data).toHaveLength(31);
    expect(parsed.meta.fields).not.toContain("span");
    const H = Math.round(8 * Math.tan((2 * Math.PI) / 180) * 1000);
    // docs/roof-method.md §3: the joist through the outlet falls exactly at the base fall (2° = 1:28.6).
    const through = parsed.data.find((r) => Number(r.offset_m) === 6)!;
    expect(through).toMatchObject({
      start_level_mm: "0",
      end_level_mm: String(H),
      start_drop_below_H_mm: String(H),
      end_drop_below_H_mm: "0",
      fall: "1:28.6",
    });
    // The joist against the end wall lies on the level rim: level, no drop.
    expect(parsed.data[0]).toMatchObject({
      joist: "1",
      offset_m: "0",
      start_level_mm: String(H),
      end_level_mm: String(H),
      fall: "level",
    });
  });

  it("answers in US customary when asked (units=us), or for a US rule set, agreeing with the screen's figures", async () => {
    const res = await post(
      new URLSearchParams({ spec: JSON.stringify(DEMO_ROOF), units: "us" }),
      "application/x-www-form-urlencoded",
    );
    expect(res.status).toBe(200);
    const parsed = Papa.parse<Record<string, string>>(tableOf(await res.text()), { header: true });
    const analysis = analyse(parseOk(DEMO_ROOF), { mesh: false, traces: false });
    const rows = scheduleRows(analysis.shaped.joists);
    expect(parsed.data).toHaveLength(rows.length);
    const through = parsed.data.find((r) => Math.abs(Number(r.offset_ft) - 6 / 0.3048) < 0.001)!;
    const row = rows.find((r) => r.offset === 6)!;
    // The screen writes the same level to 1/16 in: 5 7/8 in is 5.875 in the file.
    const screen = formatIn("us")
      .mm(row.metres.endLevel)
      .replace(/\u00a0in$/, "");
    const [whole, frac] = screen.includes(" ")
      ? screen.split(" ")
      : screen.includes("/")
        ? ["0", screen]
        : [screen, "0/1"];
    const [a, b] = frac.split("/").map(Number);
    expect(Number(through.end_level_in)).toBeCloseTo(Number(whole) + a / b, 9);
    // 1 in = 25.4 mm exactly (NIST SP 811): the level in inches is the level in metres / 0.0254, to 1/16.
    expect(Number(through.end_level_in)).toBeCloseTo(Math.round((row.metres.endLevel / 0.0254) * 16) / 16, 9);
    expect(through.fall).toBe("1:28.6");
    expect(Number(through.fall_in_per_ft)).toBeCloseTo(12 / (1 / Math.tan((2 * Math.PI) / 180)), 2);
    const ibc = await form(JSON.stringify({ ...DEMO_ROOF, ruleSet: "us-ibc-2018" }));
    expect(tableOf(await ibc.text()).split("\n")[0]).toContain("offset_ft");
    expect(
      (
        await post(
          new URLSearchParams({ spec: JSON.stringify(DEMO_ROOF), units: "imperial" }),
          "application/x-www-form-urlencoded",
        )
      ).status,
    ).toBe(400);
  });

  it("calls an unnamed roof the sandbox roof, and refuses an over-long name naming the field", async () => {
    const res = await form(JSON.stringify(DEMO_ROOF));
    expect(res.headers.get("content-disposition")).toMatch(
      /filename="sandbox-roof-drop-schedule-\d{4}-\d{2}-\d{2}\.csv"/,
    );
    const long = await post(
      new URLSearchParams({ spec: JSON.stringify(DEMO_ROOF), name: "x".repeat(121) }),
      "application/x-www-form-urlencoded",
    );
    expect(long.status).toBe(400);
    expect(await long.text()).toMatch(/`name`/);
  });

  it("takes the spec as a JSON body too", async () => {
    const res = await post(JSON.stringify(DEMO_ROOF), "application/json");
    expect(res.status).toBe(200);
  });

  it("refuses bad input with 400/422 and a plain message, never 500", async () => {
    expect((await form("{not json")).status).toBe(400);
    expect((await form(JSON.stringify({ outline: "nope" }))).status).toBe(400);
    expect((await post("spec=", "application/x-www-form-urlencoded")).status).toBe(400);
    expect((await post("hello", "text/plain")).status).toBe(400);
    const crossing = await form(
      JSON.stringify({
        ...DEMO_ROOF,
        outline: [
          [0, 0],
          [10, 10],
          [10, 0],
          [0, 10],
        ],
        outlets: [],
      }),
    );
    expect(crossing.status).toBe(422);
    expect(await crossing.text()).toMatch(/cannot be built/i);
    expect((await form("x".repeat(300 * 1024))).status).toBe(413);
  });

  it("answers GET with 405", async () => {
    const res = loader();
    expect(res.status).toBe(405);
    expect(res.headers.get("allow")).toBe("POST");
  });
});

describe("check sheet hand-over", () => {
  it("round-trips a spec through base64url, non-ASCII included", () => {
    const spec = { ...DEMO_ROOF, baseFall: "2°" };
    const encoded = encodeSpec(spec);
    expect(encoded).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(decodeSpec(encoded)).toEqual(spec);
    expect(sheetHref(spec)).toEqual({ href: `/sandbox/sheet?spec=${encoded}`, viaSession: false });
  });

  it("rejects text that is not base64url JSON, and sends long specs through sessionStorage", () => {
    expect(decodeSpec("%%%")).toBeNull();
    expect(decodeSpec(btoa("not json"))).toBeNull();
    const big = { ...DEMO_ROOF, probes: Array.from({ length: 900 }, (_, i) => [i / 100, 1] as [number, number]) };
    expect(encodeSpec(big).length).toBeGreaterThan(SHEET_LINK_LIMIT);
    expect(sheetHref(big).viaSession).toBe(true);
  });
});

describe("a roof carried in a link (?spec=, as the classroom's copy link and the check sheet send it)", () => {
  const url = (spec: string | null) => new URL(`http://localhost/sandbox${spec == null ? "" : `?spec=${spec}`}`);

  it("opens a valid roof, says why for a broken or impossible one", () => {
    expect(readLinkedSpec(url(null))).toEqual({ spec: null, error: null });
    expect(readLinkedSpec(url(encodeSpec(DEMO_ROOF))).spec?.outline).toEqual(DEMO_ROOF.outline);
    expect(readLinkedSpec(url("not*base64"))).toMatchObject({ spec: null, error: { status: 400 } });
    expect(readLinkedSpec(url(encodeSpec({ ...DEMO_ROOF, baseFall: "steep" })))).toMatchObject({
      error: { status: 400 },
    });
    const crossing = {
      ...DEMO_ROOF,
      outline: [
        [0, 0],
        [10, 10],
        [10, 0],
        [0, 10],
      ] as typeof DEMO_ROOF.outline,
      outlets: [],
    };
    expect(readLinkedSpec(url(encodeSpec(crossing)))).toMatchObject({ error: { status: 422 } });
  });
});

describe("the screen's schedule columns (table and phone cards) against the CSV's", () => {
  // The L-shape of tests/unit/engine/plans-areas.test.ts: a ridge from (10,10) to (0,10) makes two drainage areas.
  const lShape = parseOk({
    outline: [
      [0, 0],
      [20, 0],
      [20, 10],
      [10, 10],
      [10, 20],
      [0, 20],
    ],
    outlets: [{ at: [10, 0] }, { at: [5, 20] }],
    baseFall: "1:40",
    ridges: [
      {
        line: [
          [10, 10],
          [0, 10],
        ],
      },
    ],
  });
  const csvHeader = (spec: RoofSpec) =>
    tableOf(scheduleCsv(packOf(spec)))
      .split("\r\n")[0]
      .split(",");

  it("shows the area where ridges divide the roof, as the CSV does, and heads each card with the joist", () => {
    const a = analyse(lShape, { mesh: false, traces: false });
    const rows = scheduleRows(a.shaped.joists);
    const ids = scheduleColumns(rows, "metric").map((c) => c.id);
    expect(csvHeader(lShape)).toContain("area");
    expect(ids.slice(0, 2)).toEqual(["joist", "area"]);
    const columns = scheduleColumns(rows, "metric");
    expect(columns.find((c) => c.id === "joist")?.cardWide).toBe(true);
    // The area's figure is the row's, for every span.
    const area = columns.find((c) => c.id === "area")!;
    expect(new Set(rows.map((r) => area.cell(r)))).toEqual(new Set([1, 2]));
  });

  it("leaves the area out of one undivided roof, as the CSV does; starts and ends pair up on the cards", () => {
    const a = analyse(DEMO_ROOF, { mesh: false, traces: false });
    const columns = scheduleColumns(scheduleRows(a.shaped.joists), "metric");
    expect(csvHeader(DEMO_ROOF)).not.toContain("area");
    expect(columns.map((c) => c.id)).not.toContain("area");
    // Below the joist's full line, two figures a line: each start sits beside its end.
    const paired = columns.filter((c) => !c.cardWide).map((c) => c.id);
    expect(paired.indexOf("endLevel") - paired.indexOf("startLevel")).toBe(1);
    expect(paired.indexOf("startLevel") % 2).toBe(0);
    expect(paired.indexOf("startDrop") % 2).toBe(0);
  });
});
