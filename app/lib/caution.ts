/**
 * The safety caution every results view, printed sheet and downloaded file carries (one text,
 * so the screen, the CSV, the PDF, the DXF and the 3D model say the same).
 */
export const CAUTION_TEXT =
  "these figures are a teaching and early-design aid. Falls, outlets and overflows, structure and fixing must be confirmed by the designer of record against the local building code and by licensed practitioners. Standing water loads roofs; leaks rot structures.";

/** The caution as one line of plain text, for files. */
export const CAUTION_LINE = `Caution: ${CAUTION_TEXT}`;
