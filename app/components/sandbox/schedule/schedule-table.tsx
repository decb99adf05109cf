import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import { ArrowDown, ArrowUp } from "lucide-react";
import { useEffect, useMemo, useState } from "react";
import type { UnitSystem } from "~/lib/units";
import type { ScheduleRow } from "~/lib/pack/schedule-rows";
import { SCHEDULE_PAGE, scheduleColumns } from "./schedule-columns";

const helper = createColumnHelper<ScheduleRow>();

/** The drop schedule's rows as a sortable table (loaded when the schedule comes into view). */
export default function ScheduleTable({ rows, system = "metric" }: { rows: ScheduleRow[]; system?: UnitSystem }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [all, setAll] = useState(false);
  const source = useMemo(() => scheduleColumns(rows, system), [rows, system]);
  const columns = useMemo(
    () =>
      source.map((c) => helper.accessor(c.value, { id: c.id, header: c.header, cell: (x) => c.cell(x.row.original) })),
    [source],
  );
  const byId = useMemo(() => new Map(source.map((c) => [c.id, c])), [source]);
  // A printout carries every span, not the first page of them.
  useEffect(() => {
    const showAll = () => setAll(true);
    window.addEventListener("beforeprint", showAll);
    return () => window.removeEventListener("beforeprint", showAll);
  }, []);
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const shown = table.getRowModel().rows.slice(0, all ? undefined : SCHEDULE_PAGE);
  const sortKey = sorting[0] ? `${sorting[0].id}:${sorting[0].desc ? "desc" : "asc"}` : "";
  return (
    <>
      {/* On a phone the headings are hidden behind the cards, so the order is chosen here. */}
      <label className="mb-2 flex items-center gap-2 text-sm sm:hidden print:hidden">
        Sort by
        <select
          className="field w-auto flex-1"
          value={sortKey}
          onChange={(e) => {
            const [id, dir] = e.target.value.split(":");
            setSorting(id ? [{ id, desc: dir === "desc" }] : []);
          }}
        >
          <option value="">Joist order</option>
          {source.map((c) => [
            <option key={`${c.id}:asc`} value={`${c.id}:asc`}>
              {`${c.header}, ${c.id === "fall" ? "steepest" : "lowest"} first`}
            </option>,
            <option key={`${c.id}:desc`} value={`${c.id}:desc`}>
              {`${c.header}, ${c.id === "fall" ? "flattest" : "highest"} first`}
            </option>,
          ])}
        </select>
      </label>
      <div
        className="max-h-[28rem] overflow-auto print:max-h-none print:overflow-visible"
        // A scrolling box is reached by Tab so its rows can be scrolled from the keyboard (WCAG 2.1.1).
        tabIndex={0}
        role="region"
        aria-label="Drop schedule rows"
      >
        <table className="data-table card-table w-full" data-testid="schedule-table">
          <thead className="sticky top-0 bg-sheet">
            {table.getHeaderGroups().map((g) => (
              <tr key={g.id}>
                {g.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th
                      key={h.id}
                      scope="col"
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
                    >
                      <button
                        type="button"
                        className="inline-flex items-center gap-1 uppercase"
                        onClick={h.column.getToggleSortingHandler()}
                      >
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        {sorted === "asc" ? (
                          <ArrowUp size={12} aria-hidden="true" />
                        ) : sorted === "desc" ? (
                          <ArrowDown size={12} aria-hidden="true" />
                        ) : null}
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {shown.map((row) => (
              <tr key={row.id}>
                {row.getVisibleCells().map((cell) => {
                  const c = byId.get(cell.column.id);
                  return (
                    <td key={cell.id} data-label={c?.header} className={c?.cardWide ? "card-wide" : undefined}>
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {rows.length > SCHEDULE_PAGE && (
        <button type="button" className="btn mt-2 print:hidden" onClick={() => setAll((a) => !a)}>
          {all ? `Show the first ${SCHEDULE_PAGE}` : `Show all ${rows.length} spans`}
        </button>
      )}
    </>
  );
}
