import type { ReactNode } from "react";
import type { UnitSystem } from "~/lib/units";
import { hasMultiSpan, type ScheduleRow } from "~/lib/pack/schedule-rows";
import { FallRatio } from "../results/fall-ratio";
import { formatIn } from "../format";

/** One column of the drop schedule on screen: its heading, its sort value and its cell. */
export interface ScheduleColumn {
  id: string;
  header: string;
  value: (r: ScheduleRow) => number;
  cell: (r: ScheduleRow) => ReactNode;
  /**
   * On a phone each span is a card of label and figure pairs, two to a line; a wide column takes
   * a whole line (the joist heads the card) so starts and ends stay side by side.
   */
  cardWide?: boolean;
}

const fixed = (digits: number) => (v: number) => v.toFixed(digits);

/**
 * The schedule's columns in the chosen units (metres and millimetres, or feet-inches and inches to
 * 1/16); the span number only where a joist has more than one and the drainage area only where
 * there are several, as in the CSV. The plain table shown first, the sortable one and the phone's
 * cards all use these, so they cannot differ.
 */
export function scheduleColumns(rows: ScheduleRow[], system: UnitSystem): ScheduleColumn[] {
  const fall: ScheduleColumn = {
    id: "fall",
    header: "Fall",
    value: (r) => r.ratio ?? Infinity,
    cell: (r) => <FallRatio ratio={r.ratio} />,
  };
  const span: ScheduleColumn = { id: "span", header: "Span", value: (r) => r.span ?? 0, cell: (r) => r.span ?? "" };
  const area: ScheduleColumn = { id: "area", header: "Area", value: (r) => r.area, cell: (r) => r.area };
  const joist: ScheduleColumn = {
    id: "joist",
    header: "Joist",
    value: (r) => r.joist,
    cell: (r) => r.joist,
    cardWide: true,
  };
  let columns: ScheduleColumn[];
  if (system === "metric") {
    const level = (key: "startLevel" | "endLevel" | "startDrop" | "endDrop", header: string): ScheduleColumn => ({
      id: key,
      header,
      value: (r) => r[key],
      cell: (r) => r[key],
    });
    columns = [
      joist,
      area,
      { id: "offset", header: "Offset (m)", value: (r) => r.offset, cell: (r) => fixed(2)(r.offset) },
      span,
      { id: "length", header: "Length (m)", value: (r) => r.length, cell: (r) => fixed(2)(r.length) },
      level("startLevel", "Start level (mm)"),
      level("endLevel", "End level (mm)"),
      level("startDrop", "Start drop below H (mm)"),
      level("endDrop", "End drop below H (mm)"),
      fall,
    ];
  } else {
    const f = formatIn(system);
    const inches = (v: number) => f.mm(v).replace(/\u00a0in$/, "");
    const level = (key: "startLevel" | "endLevel" | "startDrop" | "endDrop", header: string): ScheduleColumn => ({
      id: key,
      header,
      value: (r) => r.metres[key],
      cell: (r) => inches(r.metres[key]),
    });
    columns = [
      joist,
      area,
      { id: "offset", header: "Offset", value: (r) => r.offset, cell: (r) => f.metres(r.offset) },
      span,
      { id: "length", header: "Length", value: (r) => r.length, cell: (r) => f.metres(r.length) },
      level("startLevel", "Start level (in)"),
      level("endLevel", "End level (in)"),
      level("startDrop", "Start drop below H (in)"),
      level("endDrop", "End drop below H (in)"),
      fall,
    ];
  }
  // As in the CSV: the span column only where a joist has more than one span, the area column
  // only where ridges divide the roof into drainage areas (docs/roof-method-plans.md P4).
  const areas = new Set(rows.map((r) => r.area)).size > 1;
  const kept = columns.filter((c) => (c.id !== "span" || hasMultiSpan(rows)) && (c.id !== "area" || areas));
  // One of area and span alone would sit beside the offset and push every start out of line with its end.
  const extra = kept.filter((c) => c.id === "span" || c.id === "area");
  return extra.length === 1 ? kept.map((c) => (c === extra[0] ? { ...c, cardWide: true } : c)) : kept;
}

/** How many spans the schedule shows before "Show all". */
export const SCHEDULE_PAGE = 60;
