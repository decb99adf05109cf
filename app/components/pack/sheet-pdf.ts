/**
 * The check sheet and drop schedule as a PDF made on the server with pdf-lib: the plan drawn as
 * vectors (lines, circles, text), the same figures and tables as the sheet page (sheetData),
 * tables kept whole where they fit on a page and otherwise broken between rows with the heading
 * repeated; A4 or US Letter; one caution, on the first page. Standard Helvetica (WinAnsi).
 */
import { PDFDocument, type PDFFont, type PDFPage, rgb, StandardFonts, type RGB } from "pdf-lib";
import { CAUTION_LINE } from "~/lib/caution";
import type { PackRoof, PackWriter } from "~/lib/pack/facts";
import { figureExtent, planLabels, type PlanFigure } from "~/lib/pack/plan-figure";
import { sheetData, type SheetTable } from "~/lib/pack/sheet-data";
import { MeshSampler } from "~/components/sandbox/view-3d/mesh-sample";

export type PaperSize = "a4" | "letter";
/** Page sizes in PDF points (1/72 in): A4 210 × 297 mm (ISO 216), US Letter 8.5 × 11 in. */
export const PAPER: Record<PaperSize, [number, number]> = { a4: [595.28, 841.89], letter: [612, 792] };

const INK = rgb(0.12, 0.16, 0.2);
const SOFT = rgb(0.32, 0.38, 0.43);
const ACCENT = rgb(0.71, 0.28, 0.12);
const RULE = rgb(0.8, 0.77, 0.7);
const MARGIN = 40;

interface Fonts {
  regular: PDFFont;
  bold: PDFFont;
}

/** Text the standard font can encode: common symbols spelled out, anything else as "?". */
function encodable(font: PDFFont): (s: string) => string {
  const set = new Set(font.getCharacterSet());
  const swap: Record<string, string> = { "→": "->", "≥": ">=", "≤": "<=", "−": "-", "≈": "~", "\u00a0": " " };
  return (s) => [...s].map((ch) => (set.has(ch.codePointAt(0)!) ? ch : (swap[ch] ?? "?"))).join("");
}

class Writer {
  page!: PDFPage;
  y = 0;
  pages: PDFPage[] = [];
  readonly clean: (s: string) => string;
  constructor(
    readonly doc: PDFDocument,
    readonly size: [number, number],
    readonly fonts: Fonts,
    readonly title: string,
  ) {
    this.clean = encodable(fonts.regular);
    this.newPage();
  }
  get width() {
    return this.size[0] - 2 * MARGIN;
  }
  newPage() {
    this.page = this.doc.addPage(this.size);
    this.pages.push(this.page);
    this.y = this.size[1] - MARGIN;
  }
  /** Room left above the bottom margin (the footer sits inside it). */
  get room() {
    return this.y - MARGIN;
  }
  ensure(height: number) {
    if (height > this.room) this.newPage();
  }
  text(s: string, x: number, y: number, size: number, font = this.fonts.regular, color: RGB = INK) {
    this.page.drawText(this.clean(s), { x, y, size, font, color });
  }
  wrap(s: string, size: number, width: number, font = this.fonts.regular): string[] {
    const words = this.clean(s).split(/\s+/);
    const lines: string[] = [];
    let line = "";
    for (const w of words) {
      const next = line ? `${line} ${w}` : w;
      if (font.widthOfTextAtSize(next, size) > width && line) {
        lines.push(line);
        line = w;
      } else line = next;
    }
    if (line) lines.push(line);
    return lines;
  }
  paragraph(s: string, size: number, opts: { font?: PDFFont; color?: RGB; indent?: number; gap?: number } = {}) {
    const font = opts.font ?? this.fonts.regular;
    const indent = opts.indent ?? 0;
    const lines = this.wrap(s, size, this.width - indent, font);
    const lh = size * 1.3;
    this.ensure(lines.length * lh);
    for (const l of lines) {
      this.y -= lh;
      this.text(l, MARGIN + indent, this.y + size * 0.25, size, font, opts.color ?? INK);
    }
    this.y -= opts.gap ?? 0;
  }
  heading(s: string) {
    this.y -= 10;
    this.y -= 13;
    this.text(s, MARGIN, this.y + 3, 10.5, this.fonts.bold);
    this.page.drawLine({
      start: { x: MARGIN, y: this.y },
      end: { x: MARGIN + this.width, y: this.y },
      thickness: 1.2,
      color: INK,
    });
    this.y -= 3;
  }
}

function drawPlan(w: Writer, f: PlanFigure, box: { x: number; y: number; width: number; height: number }) {
  const e = figureExtent(f);
  const scale = Math.min(box.width / (e.maxX - e.minX), box.height / (e.maxY - e.minY));
  const ox = box.x + (box.width - (e.maxX - e.minX) * scale) / 2;
  const oy = box.y + (box.height - (e.maxY - e.minY) * scale) / 2;
  const P = (p: readonly [number, number]) => ({ x: ox + (p[0] - e.minX) * scale, y: oy + (p[1] - e.minY) * scale });
  const page = w.page;
  const line = (
    a: readonly [number, number],
    b: readonly [number, number],
    thickness: number,
    color: RGB,
    dash?: number[],
  ) => page.drawLine({ start: P(a), end: P(b), thickness, color, dashArray: dash });
  // Deck fill as an SVG path (drawSvgPath's y runs down from its origin).
  const top = oy + (e.maxY - e.minY) * scale;
  const d =
    f.corners
      .map((c, i) => `${i ? "L" : "M"}${(c[0] - e.minX) * scale} ${top - oy - (c[1] - e.minY) * scale}`)
      .join("") + "Z";
  page.drawSvgPath(d, { x: ox, y: top, color: rgb(1, 0.99, 0.97), borderWidth: 0 });
  for (const [a, b] of f.joists) line(a, b, 0.3, rgb(0.7, 0.73, 0.76));
  for (const o of f.openings) o.forEach((p, i) => line(p, o[(i + 1) % o.length], 0.9, INK));
  for (const r of f.ridges) r.slice(1).forEach((p, i) => line(r[i], p, 0.9, ACCENT, [2, 2]));
  if (f.fallLine) f.fallLine.slice(1).forEach((p, i) => line(f.fallLine![i], p, 1.2, ACCENT, [4, 2]));
  for (const ed of f.edges)
    line(ed.from, ed.to, ed.kind === "eaves" ? 0.6 : 1.6, INK, ed.kind === "eaves" ? [3, 2] : undefined);
  for (const c of f.corners) page.drawCircle({ ...P(c), size: f.u * 0.35 * scale, color: INK });
  for (const o of f.outlets)
    page.drawCircle({ ...P(o.at), size: o.r * scale, color: ACCENT, borderColor: INK, borderWidth: 0.6 });
  for (const l of f.labels) {
    const size = l.size * scale;
    const font = l.kind === "edge" ? w.fonts.regular : w.fonts.bold;
    const text = w.clean(l.text);
    const width = font.widthOfTextAtSize(text, size);
    const at = P(l.centre);
    page.drawText(text, {
      x: at.x - width / 2,
      y: at.y - size * 0.35,
      size,
      font,
      color: l.kind === "outlet" ? ACCENT : l.kind === "edge" ? SOFT : INK,
    });
  }
  const s0 = P(f.scale.at);
  const s1 = P([f.scale.at[0] + f.scale.length, f.scale.at[1]]);
  page.drawLine({ start: s0, end: s1, thickness: 1.2, color: INK });
  for (const s of [s0, s1])
    page.drawLine({ start: { x: s.x, y: s.y - 3 }, end: { x: s.x, y: s.y + 3 }, thickness: 0.8, color: INK });
  w.text(`${f.scale.length} m`, s1.x + 4, s1.y - 3, 8);
}

function drawTable(w: Writer, t: SheetTable) {
  const size = 8;
  const rowH = 11.5;
  const font = w.fonts.regular;
  const widths = t.header.map(
    (h, c) =>
      Math.max(
        font.widthOfTextAtSize(w.clean(h), size),
        ...t.rows.map((r) => font.widthOfTextAtSize(w.clean(r[c] ?? ""), size)),
      ) + 8,
  );
  const total = widths.reduce((a, b) => a + b, 0);
  // Squeeze the widest (text) column when the table is wider than the page, wrapping none: cells are short.
  const k = total > w.width ? w.width / total : 1;
  const cols = widths.map((x) => x * k);
  const headerBlock = 23 + 10 + rowH;
  const whole = headerBlock + t.rows.length * rowH + (t.note ? 14 : 0);
  // Keep the table whole: on this page if it fits, else on a fresh page if it fits there.
  if (whole > w.room && whole <= w.size[1] - 2 * MARGIN) w.newPage();
  const head = (continued: boolean) => {
    w.ensure(headerBlock + rowH);
    w.heading(continued ? `${t.title} (continued)` : t.title);
    w.y -= rowH;
    let x = MARGIN;
    t.header.forEach((h, c) => {
      const text = w.clean(h);
      const tw = w.fonts.bold.widthOfTextAtSize(text, size);
      w.text(text, t.numeric[c] ? x + cols[c] - 4 - tw : x + 2, w.y + 3, size, w.fonts.bold, SOFT);
      x += cols[c];
    });
    w.page.drawLine({
      start: { x: MARGIN, y: w.y },
      end: { x: MARGIN + w.width, y: w.y },
      thickness: 0.6,
      color: RULE,
    });
  };
  head(false);
  for (const r of t.rows) {
    if (rowH > w.room) {
      w.newPage();
      head(true);
    }
    w.y -= rowH;
    let x = MARGIN;
    r.forEach((cell, c) => {
      const text = w.clean(cell);
      const tw = font.widthOfTextAtSize(text, size);
      w.text(text, t.numeric[c] ? x + cols[c] - 4 - tw : x + 2, w.y + 3, size);
      x += cols[c];
    });
    w.page.drawLine({
      start: { x: MARGIN, y: w.y },
      end: { x: MARGIN + w.width, y: w.y },
      thickness: 0.3,
      color: RULE,
    });
  }
  if (t.note) w.paragraph(t.note, 7.5, { color: SOFT });
}

/** The PDF bytes of the check sheet and drop schedule. */
export async function sheetPdf(p: PackRoof, paper: PaperSize = "a4"): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  const data = sheetData(p);
  doc.setTitle(`${data.title} · check sheet`);
  doc.setSubject("Check sheet and drop schedule of a shaped parapet roof");
  doc.setCreator("Fallwright");
  doc.setProducer("Fallwright (pdf-lib)");
  doc.setCreationDate(p.date);
  doc.setModificationDate(p.date);
  const fonts = {
    regular: await doc.embedFont(StandardFonts.Helvetica),
    bold: await doc.embedFont(StandardFonts.HelveticaBold),
  };
  const w = new Writer(doc, PAPER[paper], fonts, data.title);

  w.y -= 10;
  w.text("FALLWRIGHT · CHECK SHEET", MARGIN, w.y, 8, fonts.bold, ACCENT);
  for (const l of w.wrap(data.title, 18, w.width, fonts.bold)) {
    w.y -= 22;
    w.text(l, MARGIN, w.y, 18, fonts.bold);
  }
  w.y -= 4;
  w.paragraph(data.subtitle, 9, { color: SOFT, gap: 6 });
  // The one caution, boxed.
  const cautionLines = w.wrap(CAUTION_LINE, 8.5, w.width - 12);
  const cautionH = cautionLines.length * 11 + 8;
  w.page.drawRectangle({
    x: MARGIN,
    y: w.y - cautionH,
    width: w.width,
    height: cautionH,
    borderColor: ACCENT,
    borderWidth: 0.8,
    color: rgb(0.99, 0.95, 0.9),
  });
  cautionLines.forEach((l, i) =>
    w.text(l, MARGIN + 6, w.y - 12 - i * 11, 8.5, i === 0 ? fonts.regular : fonts.regular),
  );
  w.y -= cautionH + 10;

  const sampler = p.analysis.shaped.mesh ? new MeshSampler(p.analysis.shaped.mesh) : null;
  const figure = planLabels(
    p,
    (text, size) => fonts.regular.widthOfTextAtSize(w.clean(text), 1) * size * 1.05,
    (x, y) => sampler?.levelAt(x, y) ?? null,
  );
  const planH = Math.min(w.room * 0.55, w.width * 0.75);
  drawPlan(w, figure, { x: MARGIN, y: w.y - planH, width: w.width, height: planH });
  w.y -= planH + 4;
  w.paragraph(
    "Plan. Levels in mm above datum at corners and outlets (O1, O2…); dashed: the longest fall line; thin lines: joists.",
    7.5,
    { color: SOFT, gap: 4 },
  );

  w.heading("Key figures");
  for (const [k, v] of data.figures) {
    const lines = w.wrap(v, 8.5, w.width * 0.6, fonts.bold);
    w.ensure(lines.length * 11 + 2);
    w.y -= 11;
    w.text(k, MARGIN, w.y + 2, 8.5, fonts.regular, SOFT);
    lines.forEach((l, i) => w.text(l, MARGIN + w.width * 0.4, w.y + 2 - i * 11, 8.5, fonts.bold));
    w.y -= (lines.length - 1) * 11;
  }
  for (const t of data.tables.slice(0, 3)) drawTable(w, t);
  w.ensure(60);
  w.heading("Warnings and advice");
  if (data.warnings.length === 0) w.paragraph("No warnings.", 8.5);
  for (const m of data.warnings) w.paragraph(`• ${m}`, 8.5, { gap: 2 });
  drawTable(w, data.tables[3]);
  w.ensure(40 + data.ruleSet.lines.length * 11);
  w.heading(data.ruleSet.title);
  w.paragraph(data.ruleSet.name, 9, { font: fonts.bold });
  for (const l of data.ruleSet.lines) w.paragraph(`• ${l}`, 8.5);
  for (const n of data.ruleSet.notes) w.paragraph(n, 7.5, { color: SOFT });

  const total = w.pages.length;
  w.pages.forEach((page, i) => {
    const label = w.clean(`${data.title} · check sheet · page ${i + 1} of ${total}`);
    page.drawText(label, { x: MARGIN, y: MARGIN / 2, size: 7, font: fonts.regular, color: SOFT });
  });
  return doc.save();
}

export const SHEET_PDF: PackWriter = {
  file: "sheet.pdf",
  what: "check-sheet",
  ext: "pdf",
  type: "application/pdf",
  mesh: true,
  write: (p) => sheetPdf(p, "a4"),
};
export const SHEET_PDF_LETTER: PackWriter = {
  ...SHEET_PDF,
  what: "check-sheet-letter",
  write: (p) => sheetPdf(p, "letter"),
};
