import type { Analysis } from "~/engine";

/** One span of one joist, as the builder reads it. Levels and drops in millimetres. */
export interface ScheduleRow {
  joist: number;
  /** Drainage area (docs/roof-method-plans.md P4), numbered from 1. */
  area: number;
  offset: number;
  /** Span number along its joist (from 1), null when the joist has only the one span. */
  span: number | null;
  startX: number;
  startY: number;
  endX: number;
  endY: number;
  length: number;
  startLevel: number;
  endLevel: number;
  startDrop: number;
  endDrop: number;
  /** Fall ratio N, null when level. */
  ratio: number | null;
  /** The same levels and drops in metres, unrounded, for showing in other units. */
  metres: { startLevel: number; endLevel: number; startDrop: number; endDrop: number };
}

const r3 = (v: number) => Math.round(v * 1000) / 1000;
const mm = (v: number) => Math.round(v * 1000);

/** The drop schedule (docs/roof-method.md §5) flattened to rows, joists and spans numbered from 1. */
export function scheduleRows(joists: Analysis["shaped"]["joists"]): ScheduleRow[] {
  const rows: ScheduleRow[] = [];
  for (const j of joists) {
    j.spans.forEach((s, k) => {
      rows.push({
        joist: j.index + 1,
        area: (j.area ?? 0) + 1,
        offset: r3(j.offset),
        span: j.spans.length > 1 ? k + 1 : null,
        startX: r3(s.start[0]),
        startY: r3(s.start[1]),
        endX: r3(s.end[0]),
        endY: r3(s.end[1]),
        length: r3(s.length),
        startLevel: mm(s.startLevel),
        endLevel: mm(s.endLevel),
        startDrop: mm(s.startDrop),
        endDrop: mm(s.endDrop),
        ratio: s.ratio,
        metres: { startLevel: s.startLevel, endLevel: s.endLevel, startDrop: s.startDrop, endDrop: s.endDrop },
      });
    });
  }
  return rows;
}

/** True when some joist has more than one span, so the span column means something. */
export const hasMultiSpan = (rows: ScheduleRow[]) => rows.some((r) => r.span !== null);
