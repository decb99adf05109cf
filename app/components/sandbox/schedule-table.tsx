import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import { ArrowDown, ArrowUp } from "lucide-react";
import { useMemo, useState } from "react";
import type { UnitSystem } from "~/lib/units";
import { FallRatio } from "./fall-ratio";
import { formatIn } from "./format";
import { hasMultiSpan, type ScheduleRow } from "~/lib/pack/schedule-rows";

const column = createColumnHelper<ScheduleRow>();
const num = (digits: number) => (v: number) => v.toFixed(digits);

/** The columns in the chosen units: metres and millimetres, or feet-inches and inches to 1/16. */
function columnsIn(system: UnitSystem) {
  if (system === "metric") {
    return [
      column.accessor("joist", { header: "Joist" }),
      column.accessor("offset", { header: "Offset (m)", cell: (c) => num(2)(c.getValue()) }),
      column.accessor((r) => r.span ?? 0, { id: "span", header: "Span", cell: (c) => c.row.original.span ?? "" }),
      column.accessor("length", { header: "Length (m)", cell: (c) => num(2)(c.getValue()) }),
      column.accessor("startLevel", { header: "Start level (mm)" }),
      column.accessor("endLevel", { header: "End level (mm)" }),
      column.accessor("startDrop", { header: "Start drop below H (mm)" }),
      column.accessor("endDrop", { header: "End drop below H (mm)" }),
      column.accessor((r) => r.ratio ?? Infinity, {
        id: "fall",
        header: "Fall",
        cell: (c) => <FallRatio ratio={c.row.original.ratio} />,
      }),
    ];
  }
  const f = formatIn(system);
  const level = (v: number) => f.mm(v).replace(/\u00a0in$/, "");
  return [
    column.accessor("joist", { header: "Joist" }),
    column.accessor("offset", { header: "Offset", cell: (c) => f.metres(c.getValue()) }),
    column.accessor((r) => r.span ?? 0, { id: "span", header: "Span", cell: (c) => c.row.original.span ?? "" }),
    column.accessor("length", { header: "Length", cell: (c) => f.metres(c.getValue()) }),
    column.accessor((r) => r.metres.startLevel, {
      id: "startLevel",
      header: "Start level (in)",
      cell: (c) => level(c.getValue()),
    }),
    column.accessor((r) => r.metres.endLevel, {
      id: "endLevel",
      header: "End level (in)",
      cell: (c) => level(c.getValue()),
    }),
    column.accessor((r) => r.metres.startDrop, {
      id: "startDrop",
      header: "Start drop below H (in)",
      cell: (c) => level(c.getValue()),
    }),
    column.accessor((r) => r.metres.endDrop, {
      id: "endDrop",
      header: "End drop below H (in)",
      cell: (c) => level(c.getValue()),
    }),
    column.accessor((r) => r.ratio ?? Infinity, {
      id: "fall",
      header: "Fall",
      cell: (c) => <FallRatio ratio={c.row.original.ratio} />,
    }),
  ];
}

const PAGE = 60;

/** The drop schedule's rows as a sortable table (loaded when the schedule comes into view). */
export default function ScheduleTable({ rows, system = "metric" }: { rows: ScheduleRow[]; system?: UnitSystem }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [all, setAll] = useState(false);
  // The span number only means something where a joist has more than one (the CSV does the same).
  const columns = useMemo(() => {
    const all = columnsIn(system);
    return hasMultiSpan(rows) ? all : all.filter((c) => c.id !== "span");
  }, [rows, system]);
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const shown = table.getRowModel().rows.slice(0, all ? undefined : PAGE);
  return (
    <>
      <div className="max-h-[28rem] overflow-auto">
        <table className="data-table w-full" data-testid="schedule-table">
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
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id}>{flexRender(cell.column.columnDef.cell, cell.getContext())}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {rows.length > PAGE && (
        <button type="button" className="btn mt-2" onClick={() => setAll((a) => !a)}>
          {all ? `Show the first ${PAGE}` : `Show all ${rows.length} spans`}
        </button>
      )}
    </>
  );
}
