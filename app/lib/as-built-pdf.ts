/**
 * The as-built check report as a PDF made on the server with pdf-lib, as the check sheet is
 * (docs/as-built.md, "Saved checks"): the roof, the day, who measured and who checked, the
 * verdict and worst deviation in the page's own words (verdictLine, worstLine), the caution,
 * the as-built plan drawn from the same drawing as the page, the worst places with their fixes,
 * and every point. Standard Helvetica (WinAnsi).
 */
import { PDFDocument, type PDFFont, type PDFPage, rgb, StandardFonts, type RGB } from "pdf-lib";
import { formatRatio, type AsBuiltResult, type Point } from "~/engine";
import { CAUTION_LINE } from "~/lib/caution";
import { fallColour } from "~/lib/fall-colour";
import { checkDrawing, deviationColour } from "~/lib/as-built-drawing";
import { fixLine, verdictLine, worstLine } from "~/lib/as-built-check";

const INK = rgb(0.12, 0.16, 0.2);
const SOFT = rgb(0.32, 0.38, 0.43);
const ACCENT = rgb(0.71, 0.28, 0.12);
const PASS = rgb(0.1, 0.45, 0.2);
const FAIL = rgb(0.7, 0.1, 0.1);
const MARGIN = 40;
/** A4, 210 × 297 mm (ISO 216), in PDF points. */
const A4: [number, number] = [595.28, 841.89];

export interface CheckReport {
  roofName: string;
  measuredOn: string;
  measuredBy: string;
  checkedBy: string;
  roofVersion: number;
  outline: Point[];
  result: AsBuiltResult;
}

const cssRgb = (css: string): RGB => {
  const [r, g, b] = (css.match(/\d+/g) ?? ["0", "0", "0"]).map(Number);
  return rgb(r / 255, g / 255, b / 255);
};

export async function checkReportPdf(c: CheckReport): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.setTitle(`${c.roofName} · as-built check ${c.measuredOn}`);
  doc.setCreator("Fallwright");
  doc.setProducer("Fallwright (pdf-lib)");
  const regular = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  const set = new Set(regular.getCharacterSet());
  const swap: Record<string, string> = { "→": "->", "≥": ">=", "≤": "<=", "−": "-", "±": "±", "²": "2", "\u00a0": " " };
  const clean = (s: string) => [...s].map((ch) => (set.has(ch.codePointAt(0)!) ? ch : (swap[ch] ?? "?"))).join("");
  const pages: PDFPage[] = [];
  let page!: PDFPage;
  let y = 0;
  const width = A4[0] - 2 * MARGIN;
  const newPage = () => {
    page = doc.addPage(A4);
    pages.push(page);
    y = A4[1] - MARGIN;
  };
  const ensure = (h: number) => {
    if (y - h < MARGIN) newPage();
  };
  const wrap = (s: string, size: number, w: number, font: PDFFont) => {
    const lines: string[] = [];
    let line = "";
    for (const word of clean(s).split(/\s+/)) {
      const next = line ? `${line} ${word}` : word;
      if (font.widthOfTextAtSize(next, size) > w && line) {
        lines.push(line);
        line = word;
      } else line = next;
    }
    if (line) lines.push(line);
    return lines;
  };
  const para = (s: string, size = 9, o: { font?: PDFFont; color?: RGB; gap?: number; indent?: number } = {}) => {
    const font = o.font ?? regular;
    for (const l of wrap(s, size, width - (o.indent ?? 0), font)) {
      ensure(size + 4);
      y -= size + 3;
      page.drawText(l, { x: MARGIN + (o.indent ?? 0), y, size, font, color: o.color ?? INK });
    }
    y -= o.gap ?? 2;
  };
  const heading = (s: string) => {
    ensure(40);
    y -= 10;
    para(s, 12, { font: bold, gap: 4 });
  };

  newPage();
  const r = c.result;
  y -= 8;
  page.drawText("FALLWRIGHT · AS-BUILT CHECK", { x: MARGIN, y, size: 8, font: bold, color: ACCENT });
  y -= 4;
  para(c.roofName, 18, { font: bold, gap: 4 });
  para(`Date measured: ${c.measuredOn}`, 10);
  para(`Measured by: ${c.measuredBy}`, 10);
  para(`Checked by: ${c.checkedBy}`, 10);
  para(`Design version: ${c.roofVersion}. Points measured: ${r.deviations.length}.`, 9, { color: SOFT, gap: 8 });
  para(verdictLine(r), 16, { font: bold, color: r.verdict.passed ? PASS : FAIL, gap: 2 });
  para(worstLine(r), 11, { font: bold, gap: 2 });
  const mm = (m: number) => `${Math.round(m * 1000)} mm`;
  para(
    `Tolerances: deviation ±${mm(r.tolerance.deviation)}, standing water ${mm(r.tolerance.pondDepth)}, finished fall at least ${formatRatio(r.tolerance.minFall)}.`,
    9,
    { color: SOFT, gap: 8 },
  );
  // The caution, boxed, on the first page.
  const cautionLines = wrap(CAUTION_LINE, 8.5, width - 12, regular);
  const cautionH = cautionLines.length * 11 + 8;
  page.drawRectangle({
    x: MARGIN,
    y: y - cautionH,
    width,
    height: cautionH,
    borderColor: ACCENT,
    borderWidth: 0.8,
    color: rgb(0.99, 0.95, 0.9),
  });
  cautionLines.forEach((l, i) => page.drawText(l, { x: MARGIN + 6, y: y - 12 - i * 11, size: 8.5, font: regular }));
  y -= cautionH + 12;

  // The as-built plan: triangles by fall, ponds, points by deviation (the page's drawing).
  const d = checkDrawing(c.outline, r);
  const planH = Math.min(y - MARGIN - 40, width * 0.6);
  const scale = Math.min(width / d.box.w, planH / d.box.h);
  const ox = MARGIN + (width - d.box.w * scale) / 2;
  const oy = y - planH + (planH - d.box.h * scale) / 2;
  const at = (p: Point) => ({ x: ox + (p[0] - d.box.x) * scale, y: oy + (p[1] - d.box.y) * scale });
  const path = (ps: Point[]) => {
    const q = ps.map((p) => [(p[0] - d.box.x) * scale, (d.box.h - (p[1] - d.box.y)) * scale]);
    return `M ${q.map((v) => `${v[0].toFixed(2)} ${v[1].toFixed(2)}`).join(" L ")} Z`;
  };
  // drawSvgPath takes y down from its origin: put the origin at the plan's top-left.
  const top = { x: ox, y: oy + d.box.h * scale };
  for (const t of d.triangles) {
    const [cr, cg, cb] = fallColour(t.builtRatio);
    const colour = rgb(cr / 255, cg / 255, cb / 255);
    page.drawSvgPath(path(t.corners), { ...top, color: colour, borderColor: colour, borderWidth: 0.2 });
  }
  page.drawSvgPath(path(d.outline), { ...top, borderColor: INK, borderWidth: 1.2 });
  for (const p of d.ponds) {
    const o = at(p.at);
    page.drawCircle({
      ...o,
      size: Math.max(4, Math.sqrt(p.area / Math.PI) * scale),
      color: rgb(0.16, 0.43, 0.86),
      opacity: 0.35,
      borderColor: rgb(0.08, 0.27, 0.67),
      borderWidth: 0.8,
    });
  }
  for (const p of d.points) {
    const o = at(p.at);
    page.drawCircle({
      ...o,
      size: 2.6,
      color: cssRgb(deviationColour(p.delta, d.tolerance)),
      borderColor: INK,
      borderWidth: 0.4,
    });
    if (Math.abs(p.delta) > d.tolerance + 1e-9) {
      const v = Math.round(p.delta * 1000);
      page.drawText(`${v > 0 ? "+" : ""}${v}`, { x: o.x + 3.5, y: o.y + 3, size: 7, font: bold, color: INK });
    }
  }
  y -= planH + 4;
  para(
    "As built: fall map of the measured surface (dark steep, yellow flat); points blue where low, red where high past the tolerance, grey within it (figures in mm); ponds ringed in blue.",
    7.5,
    { color: SOFT, gap: 4 },
  );

  heading("Worst places");
  if (!r.verdict.failures.length) para("Nothing outside the tolerances.");
  const size = (m: string) => Number(/(\d+) mm/.exec(m)?.[1] ?? 0);
  const worst = r.verdict.failures
    .map((f, i) => ({ ...f, i }))
    .sort((a, b) => size(b.message) - size(a.message) || a.i - b.i)
    .slice(0, 10);
  worst.forEach((f, k) => para(`${k + 1}. ${f.message}`, 9, { gap: 1 }));
  heading("Suggested fixes");
  if (!r.fixes.length) para("No joist needs packing up or planing down.");
  for (const f of r.fixes) para(`• ${fixLine(f, r.deviations)}`, 9, { gap: 1 });
  if (r.surface.ponds.length) {
    heading("Ponds");
    for (const p of r.surface.ponds)
      para(
        `At (${p.at[0].toFixed(2)}, ${p.at[1].toFixed(2)}) m: ${mm(p.depth)} deep over ${p.area.toFixed(2)} m², ${(p.volume * 1000).toFixed(1)} L.`,
        9,
        { gap: 1 },
      );
  }
  heading("Every measured point (design, built, deviation in mm)");
  for (const p of r.deviations)
    para(
      `${p.label ?? `(${p.at[0].toFixed(2)}, ${p.at[1].toFixed(2)})`}: ${Math.round(p.design * 1000)}, ${Math.round(p.measured * 1000)}, ${Math.round(p.delta * 1000)}`,
      8,
      { gap: 0 },
    );

  const total = pages.length;
  pages.forEach((pg, i) =>
    pg.drawText(clean(`${c.roofName} · as-built check ${c.measuredOn} · page ${i + 1} of ${total}`), {
      x: MARGIN,
      y: MARGIN / 2,
      size: 7,
      font: regular,
      color: SOFT,
    }),
  );
  return doc.save();
}
