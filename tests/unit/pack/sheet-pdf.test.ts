import { fileURLToPath } from "node:url";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";
import { describe, expect, it } from "vitest";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import { PAPER, sheetPdf } from "~/components/pack/sheet-pdf";
import { CAUTION_LINE } from "~/lib/caution";
import { sheetData } from "~/lib/pack/sheet-data";
import { NASTY_NAME, packOf, U_ROOF } from "./fixtures";

const FONTS = fileURLToPath(new URL("../../../node_modules/pdfjs-dist/standard_fonts/", import.meta.url));

/** Text of each page, read back with pdf.js (an independent reader), items joined with spaces. */
async function readPdf(bytes: Uint8Array) {
  const doc = await getDocument({ data: bytes.slice(), isEvalSupported: false, standardFontDataUrl: FONTS }).promise;
  const pages: { text: string; size: [number, number] }[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const content = await page.getTextContent();
    const [, , w, h] = page.view;
    pages.push({
      text: content.items
        .map((it) => ("str" in it ? it.str : ""))
        .join(" ")
        .replace(/\s+/g, " "),
      size: [w, h],
    });
  }
  await doc.destroy();
  return pages;
}

describe("check sheet PDF", () => {
  it("names the roof, gives H, every outlet and every schedule row, and carries the caution once", async () => {
    const pack = packOf(U_ROOF, "Annex roof", undefined, true);
    const pages = await readPdf(await sheetPdf(pack));
    const all = pages.map((p) => p.text).join(" ");
    expect(pages[0].text).toContain("Annex roof");
    const H = Math.round(pack.analysis.shaped.highLevel * 1000);
    expect(all).toContain(`H = ${H} mm`);
    for (const o of pack.analysis.shaped.setOut.outlets) expect(all).toContain(`O${o.outlet + 1} `);
    expect(all).toContain("O2 · -20");
    // Every span of the drop schedule is there: its start and end levels, row by row.
    const schedule = sheetData(pack).tables.find((t) => t.title.startsWith("Drop schedule"))!;
    let from = 0;
    for (const row of schedule.rows) {
      const text = row.filter((c) => c !== "").join(" ");
      const at = all.indexOf(text, from);
      expect(at, text).toBeGreaterThan(-1);
      from = at;
    }
    // One caution (the text's first words appear once).
    const words = CAUTION_LINE.slice(0, 40);
    expect(all.split(words).length - 1).toBe(1);
    expect(all).toContain("Rule set and sources");
    expect(all).toMatch(/30° from x|0\.0° from x/);
  });

  it("has a stable page count, A4 by default and US Letter on request", async () => {
    const pack = packOf(U_ROOF, "Annex roof", undefined, true);
    const a4 = await readPdf(await sheetPdf(pack));
    const again = await readPdf(await sheetPdf(pack));
    expect(again).toHaveLength(a4.length);
    expect(a4[0].size[0]).toBeCloseTo(PAPER.a4[0], 1);
    expect(a4[0].size[1]).toBeCloseTo(PAPER.a4[1], 1);
    // Pages are numbered "page i of n" in the footer.
    expect(a4[a4.length - 1].text).toContain(`page ${a4.length} of ${a4.length}`);
    const letter = await readPdf(await sheetPdf(pack, "letter"));
    expect(letter[0].size).toEqual(PAPER.letter);
    // 31 joists of the demo roof fit on two A4 pages with everything else.
    const demo = await readPdf(await sheetPdf(packOf(DEMO_ROOF, "Depot", undefined, true)));
    expect(demo).toHaveLength(2);
  });

  it("writes a hostile name as text", async () => {
    const pages = await readPdf(await sheetPdf(packOf(U_ROOF, NASTY_NAME, undefined, true)));
    expect(pages[0].text).toContain(`Annex "B", east`);
  });
});
