import type { Analysis, Point, RoofSpec } from "~/engine";
import type { UnitSystem } from "~/lib/units";

/** What every file of the builder's pack is made from: the roof as named and analysed. */
export interface PackRoof {
  name: string;
  /** The day the pack is issued (file names and headers use its UTC date). */
  date: Date;
  spec: RoofSpec;
  analysis: Analysis;
  /** The units the file is written in (metric unless asked; the roof's rule set decides by default). */
  units?: UnitSystem;
}

export interface PackOutlet {
  /** 1-based, as the screen labels them (O1, O2…). */
  number: number;
  at: Point;
  /** Level in mm above the datum. */
  level: number;
  /** "on joist 8", or where it needs trimming. */
  joist: string;
}

export const isoDate = (d: Date) => d.toISOString().slice(0, 10);
export const mmOf = (metres: number) => Math.round(metres * 1000);

/**
 * A joist direction as the settings panel enters it: degrees anticlockwise from the plan's x
 * axis, 0 ≤ a < 180 (a joist has no head or tail), one decimal.
 */
export function directionDegrees(d: Point): number {
  const a = ((((Math.atan2(d[1], d[0]) * 180) / Math.PI) % 180) + 180) % 180;
  const r = Math.round(a * 10) / 10;
  return r >= 180 ? 0 : r;
}

/** Where each outlet sits among the joists, as a builder reads it. */
export function packOutlets(p: PackRoof): PackOutlet[] {
  return p.analysis.shaped.setOut.outlets.map((o) => {
    const [a, b] = o.between ?? [null, null];
    const joist =
      o.joist !== null
        ? `on joist ${o.joist}`
        : `trim: ${a !== null && b !== null ? `between joists ${a} and ${b}` : a !== null ? `beyond joist ${a}` : `before joist ${b}`}, ${mmOf(o.gap)} mm from the nearest`;
    return { number: o.outlet + 1, at: o.at, level: mmOf(p.spec.outlets[o.outlet]?.level ?? 0), joist };
  });
}

/** The datum sentence every file repeats. */
export function datumText(p: PackRoof): string {
  const H = mmOf(p.analysis.shaped.highLevel);
  return `levels in mm above datum 0 (outlet level unless an outlet's own level is given); high level H = ${H} mm (${p.analysis.shaped.highLevelSource})`;
}

/**
 * A file name from the roof's name: letters, digits and hyphens only, so no header, path or
 * shell can be tricked by it; then what the file is and the date.
 */
export function packFileName(name: string, what: string, date: Date, ext: string): string {
  const stem = name
    .normalize("NFKD")
    .replace(/[^A-Za-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .toLowerCase()
    .slice(0, 60);
  return `${stem || "roof"}-${what}-${isoDate(date)}.${ext}`;
}

export const PACK_FILES = ["schedule.csv", "sheet.pdf", "plan.dxf", "roof.glb"] as const;
export type PackFile = (typeof PACK_FILES)[number];

/** How one file of the pack is written (each writer module exports one; the glb's lives with the 3D view's colours). */
export interface PackWriter {
  file: PackFile;
  /** File name part after the roof's name. */
  what: string;
  ext: string;
  type: string;
  /** Whether the analysis needs the 3D mesh. */
  mesh: boolean;
  write: (p: PackRoof) => Promise<string | Uint8Array> | string | Uint8Array;
}
