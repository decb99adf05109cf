import Drawing from "dxf-writer";
import { CAUTION_LINE } from "~/lib/caution";
import { openingsOf, ridgesOf } from "./extras";
import { datumText, directionDegrees, isoDate, mmOf, packOutlets, type PackRoof } from "./facts";

/** Layer names, each saying what it holds (AutoCAD colour index beside). */
export const DXF_LAYERS = {
  outline: ["ROOF-OUTLINE", 7],
  openings: ["ROOF-OPENINGS", 6],
  ridges: ["ROOF-RIDGES", 1],
  outlets: ["OUTLETS", 1],
  joists: ["JOISTS", 8],
  joistLevels: ["JOIST-END-LEVELS-MM", 5],
  notes: ["NOTES-NORTH-DATUM", 3],
} as const;

/** DXF text must stay in plain ASCII for older readers (the file is DXF R12-style text). */
const ascii = (s: string) =>
  s
    .normalize("NFKD")
    .replace(/°/g, " deg")
    .replace(/[^\x20-\x7E]/g, "?");

/**
 * The plan as DXF in metres for a drawing office: outline, openings and ridges where the roof has
 * them, outlets, every joist span as a LINE with its end levels (mm above datum) as TEXT, and a
 * north and datum note with the caution.
 */
export function planDxf(p: PackRoof): string {
  const d = new Drawing();
  d.setUnits("Meters");
  for (const [name, colour] of Object.values(DXF_LAYERS)) d.addLayer(name, colour, "CONTINUOUS");
  const s = p.analysis.shaped;
  const xs = p.spec.outline.map((q) => q[0]);
  const ys = p.spec.outline.map((q) => q[1]);
  const minX = Math.min(...xs),
    maxX = Math.max(...xs),
    minY = Math.min(...ys),
    maxY = Math.max(...ys);
  const size = Math.max(maxX - minX, maxY - minY, 1);
  const textH = Math.min(0.12, s.setOut.spacing * 0.3);

  d.setActiveLayer(DXF_LAYERS.outline[0]);
  d.drawPolyline(
    p.spec.outline.map((q) => [q[0], q[1]]),
    true,
  );
  const openings = openingsOf(p.spec);
  if (openings.length) {
    d.setActiveLayer(DXF_LAYERS.openings[0]);
    for (const o of openings)
      d.drawPolyline(
        o.map((q) => [q[0], q[1]]),
        true,
      );
  }
  const ridges = ridgesOf(p.spec, p.analysis);
  if (ridges.length) {
    d.setActiveLayer(DXF_LAYERS.ridges[0]);
    for (const r of ridges)
      d.drawPolyline(
        r.map((q) => [q[0], q[1]]),
        false,
      );
  }

  d.setActiveLayer(DXF_LAYERS.joists[0]);
  for (const j of s.joists) for (const sp of j.spans) d.drawLine(sp.start[0], sp.start[1], sp.end[0], sp.end[1]);
  // Each end's level sits just inside the span, turned along the joist so neighbours do not collide.
  d.setActiveLayer(DXF_LAYERS.joistLevels[0]);
  const angle = directionDegrees(s.joistDirection);
  for (const j of s.joists) {
    for (const sp of j.spans) {
      const len = Math.hypot(sp.end[0] - sp.start[0], sp.end[1] - sp.start[1]) || 1;
      const ux = (sp.end[0] - sp.start[0]) / len;
      const uy = (sp.end[1] - sp.start[1]) / len;
      const inset = Math.min(textH * 1.5, len / 4);
      d.drawText(
        sp.start[0] + ux * inset,
        sp.start[1] + uy * inset,
        textH,
        angle,
        String(mmOf(sp.startLevel)),
        "left",
        "bottom",
      );
      d.drawText(
        sp.end[0] - ux * inset,
        sp.end[1] - uy * inset,
        textH,
        angle,
        String(mmOf(sp.endLevel)),
        "right",
        "bottom",
      );
    }
  }

  d.setActiveLayer(DXF_LAYERS.outlets[0]);
  for (const o of packOutlets(p)) {
    const size = p.spec.outlets[o.number - 1]?.size ?? 0.1;
    d.drawCircle(o.at[0], o.at[1], size / 2);
    d.drawText(o.at[0] + size, o.at[1] + size, textH * 1.5, 0, ascii(`O${o.number} level ${o.level} mm, ${o.joist}`));
  }

  d.setActiveLayer(DXF_LAYERS.notes[0]);
  const noteH = Math.max(size / 120, 0.08);
  const north = [maxX + size * 0.08, maxY] as const;
  d.drawLine(north[0], north[1] - size * 0.1, north[0], north[1]);
  d.drawText(north[0], north[1] + noteH * 0.5, noteH * 1.5, 0, "N (plan +y)", "center", "bottom");
  const notes = [
    ascii(`${p.name}: plan of the shaped roof, ${isoDate(p.date)}`),
    "Units: metres on plan; levels in millimetres",
    ascii(`Datum: ${datumText(p)}`),
    `North: plan +y is up (grid north of the drawing); joists at ${directionDegrees(s.joistDirection).toFixed(1)} deg from +x, ${mmOf(s.setOut.spacing)} mm apart`,
    ascii(CAUTION_LINE),
  ];
  notes.forEach((t, i) => d.drawText(minX, minY - size * 0.06 - i * noteH * 1.8, noteH, 0, t));
  return d.toDxfString();
}
