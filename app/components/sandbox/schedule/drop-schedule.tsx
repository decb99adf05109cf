import { Box, Download, FileText, PenTool } from "lucide-react";
import { lazy, Suspense, useMemo } from "react";
import { useFormat } from "../format";
import { scheduleRows, type ScheduleRow } from "~/lib/pack/schedule-rows";
import type { UnitSystem } from "~/lib/units";
import { SCHEDULE_PAGE, scheduleColumns } from "./schedule-columns";
import { useSandbox } from "../state/store";
import { useNearViewport } from "../use-near-viewport";

// The sortable table (and its table library) loads when the schedule scrolls near the screen, so
// the sandbox opens faster; until then the same rows show as a plain table, so a printout or a
// full-page capture never meets an empty box.
const ScheduleTable = lazy(() => import("./schedule-table"));

/** The schedule without sorting: the same columns and rows as the sortable table, all of them in print. */
function PlainSchedule({ rows, system }: { rows: ScheduleRow[]; system: UnitSystem }) {
  const columns = scheduleColumns(rows, system);
  return (
    <>
      <div
        className="max-h-[28rem] overflow-auto print:max-h-none print:overflow-visible"
        // A scrolling box is reached by Tab so its rows can be scrolled from the keyboard (WCAG 2.1.1).
        tabIndex={0}
        role="region"
        aria-label="Drop schedule rows"
      >
        <table className="data-table card-table w-full" data-testid="schedule-table-plain">
          <thead className="sticky top-0 bg-sheet">
            <tr>
              {columns.map((c) => (
                <th key={c.id} scope="col" className="uppercase">
                  {c.header}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => (
              <tr key={i} className={i < SCHEDULE_PAGE ? undefined : "hidden print:table-row"}>
                {columns.map((c) => (
                  <td key={c.id} data-label={c.header} className={c.cardWide ? "card-wide" : undefined}>
                    {c.cell(r)}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {rows.length > SCHEDULE_PAGE && (
        <p className="mt-2 text-sm text-ink-soft print:hidden">
          The first {SCHEDULE_PAGE} of {rows.length} spans; scroll here to sort them or show them all.
        </p>
      )}
    </>
  );
}

/** The drop schedule: every joist's spans with levels and drops below H, sortable, with a CSV download. */
export function DropSchedule() {
  const { mm, system } = useFormat();
  const analysis = useSandbox((s) => s.analysis);
  const spec = useSandbox((s) => s.analysedSpec);
  const [anchor, near] = useNearViewport();
  const rows = useMemo(() => (analysis ? scheduleRows(analysis.shaped.joists) : []), [analysis]);
  if (!analysis) return null;
  return (
    <section aria-labelledby="drop-schedule-title" className="card min-w-0" data-testid="drop-schedule">
      <div className="mb-3 flex flex-wrap items-center gap-3">
        <h2 id="drop-schedule-title" className="text-lg font-bold">
          Drop schedule
        </h2>
        <p className="text-sm text-ink-soft">
          {analysis.shaped.joists.length} joists, {rows.length} spans. High level H = {mm(analysis.shaped.highLevel)};
          drops are measured down from H at each bearing.
        </p>
        <form
          method="post"
          action="/sandbox/schedule.csv"
          className="ml-auto flex flex-wrap gap-2"
          data-testid="csv-form"
        >
          <input type="hidden" name="spec" value={JSON.stringify(spec)} />
          <input type="hidden" name="units" value={system} />
          {/* The builder's pack for the roof on screen: each button posts it to its file's address. */}
          <button type="submit" className="btn" data-testid="download-csv">
            <Download size={16} aria-hidden="true" /> Download CSV
          </button>
          <button type="submit" className="btn" formAction="/sandbox/sheet.pdf" data-testid="download-pdf">
            <FileText size={16} aria-hidden="true" /> PDF (A4)
          </button>
          <button
            type="submit"
            className="btn"
            formAction="/sandbox/sheet.pdf?paper=letter"
            data-testid="download-pdf-letter"
          >
            <FileText size={16} aria-hidden="true" /> PDF (Letter)
          </button>
          <button type="submit" className="btn" formAction="/sandbox/plan.dxf" data-testid="download-dxf">
            <PenTool size={16} aria-hidden="true" /> DXF
          </button>
          <button type="submit" className="btn" formAction="/sandbox/roof.glb" data-testid="download-glb">
            <Box size={16} aria-hidden="true" /> 3D model
          </button>
        </form>
      </div>
      <div ref={anchor}>
        {near ? (
          <Suspense fallback={<PlainSchedule rows={rows} system={system} />}>
            <ScheduleTable rows={rows} system={system} />
          </Suspense>
        ) : (
          <PlainSchedule rows={rows} system={system} />
        )}
      </div>
    </section>
  );
}
