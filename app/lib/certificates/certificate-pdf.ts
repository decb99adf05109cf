/**
 * A certificate as a one-page PDF made on the server with pdf-lib, as the check sheet and the
 * as-built report are: the same lines as the page (certificateLines), landscape A4, standard
 * Helvetica (WinAnsi). A certificate is not a results sheet, so it carries no roof caution.
 */
import { PDFDocument, rgb, StandardFonts, type PDFFont } from "pdf-lib";
import { certificateLines, type CertificateFacts } from "~/lib/certificates/certificate-text";

const INK = rgb(0.12, 0.16, 0.2);
const SOFT = rgb(0.32, 0.38, 0.43);
const ACCENT = rgb(0.71, 0.28, 0.12);
const REVOKED = rgb(0.7, 0.1, 0.1);
/** A4 landscape, 297 × 210 mm (ISO 216), in PDF points. */
const PAGE: [number, number] = [841.89, 595.28];

export async function certificatePdf(c: CertificateFacts, origin: string): Promise<Uint8Array> {
  const lines = certificateLines(c, origin);
  const doc = await PDFDocument.create();
  doc.setTitle(`${lines.title}: ${c.courseName}`);
  doc.setCreator("Fallwright");
  doc.setProducer("Fallwright (pdf-lib)");
  const regular = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  const set = new Set(regular.getCharacterSet());
  const clean = (s: string) => [...s].map((ch) => (set.has(ch.codePointAt(0)!) ? ch : "?")).join("");
  const page = doc.addPage(PAGE);
  const [w, h] = PAGE;
  page.drawRectangle({ x: 24, y: 24, width: w - 48, height: h - 48, borderColor: ACCENT, borderWidth: 2 });
  let y = h - 90;
  const centred = (s: string, size: number, font: PDFFont, color = INK, gap = 14) => {
    const text = clean(s);
    // A long name or course is set smaller rather than cut: every word stays on the page.
    const fit = Math.min(size, (size * (w - 120)) / Math.max(1, font.widthOfTextAtSize(text, size)));
    page.drawText(text, { x: (w - font.widthOfTextAtSize(text, fit)) / 2, y, size: fit, font, color });
    y -= size + gap;
  };
  centred("FALLWRIGHT", 10, bold, ACCENT, 18);
  centred(lines.title, 30, bold, INK, 30);
  centred(lines.intro, 13, regular, SOFT);
  centred(lines.name, 26, bold, INK, 16);
  centred(lines.passed, 13, regular, SOFT);
  centred(lines.course, 20, bold, INK, 30);
  centred(lines.organisation, 12, regular);
  centred(lines.date, 12, regular, INK, 26);
  centred(lines.code, 12, bold);
  centred(lines.verify, 10, regular, SOFT);
  if (lines.revoked) {
    y -= 10;
    centred(lines.revoked, 14, bold, REVOKED);
  }
  return doc.save();
}
