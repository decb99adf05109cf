import { Day } from "~/components/dates";
import { useMemo, useState } from "react";
import { Link } from "react-router";
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnFiltersState,
  type FilterFn,
  type SortingState,
} from "@tanstack/react-table";
import { ArrowDown, ArrowUp, ArrowUpDown, Search } from "lucide-react";
import {
  cellStatus,
  formatScore,
  STATUS_LABELS,
  type CellStatus,
  type Gradebook,
  type GradebookRow,
} from "~/lib/gradebook";
import { GradeMark } from "~/components/classes/grade-mark";

type StatusFilter = CellStatus | "all";
interface RowFilter {
  q: string;
  status: StatusFilter;
  /** A lesson slug, or "" for any assigned lesson. */
  lesson: string;
}

/** Search by name or e-mail; then keep trainees with the chosen status in the chosen lesson (or in any). */
const traineeFilter: FilterFn<GradebookRow> = (row, _columnId, value: RowFilter) => {
  const r = row.original;
  const q = value.q.trim().toLowerCase();
  if (q && !r.name.toLowerCase().includes(q) && !r.email.toLowerCase().includes(q)) return false;
  if (value.status === "all") return true;
  const slugs = value.lesson ? [value.lesson] : Object.keys(r.cells);
  return slugs.some((s) => cellStatus(r.cells[s]) === value.status);
};

const helper = createColumnHelper<GradebookRow>();

export function GradebookTable({ book, classId }: { book: Gradebook; classId: string }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "trainee", desc: false }]);
  const [filter, setFilter] = useState<RowFilter>({ q: "", status: "all", lesson: "" });
  const columnFilters = useMemo<ColumnFiltersState>(() => [{ id: "trainee", value: filter }], [filter]);

  const columns = useMemo(
    () => [
      helper.accessor((r) => (r.name || r.email).toLowerCase(), {
        id: "trainee",
        header: "Trainee",
        filterFn: traineeFilter,
        cell: (c) => (
          <div>
            <div className="font-medium">{c.row.original.name || "(no name yet)"}</div>
            <div className="text-xs text-ink-soft">{c.row.original.email}</div>
          </div>
        ),
      }),
      helper.accessor((r) => Object.values(r.cells).filter((c) => c?.passed).length, {
        id: "passed",
        header: "Passed",
        sortDescFirst: true,
        cell: (c) => (
          <span className="tabular-nums">
            {c.getValue()} / {book.lessons.length}
          </span>
        ),
      }),
      ...book.lessons.map((l) =>
        helper.accessor((r) => r.cells[l.slug]?.score, {
          id: `lesson:${l.slug}`,
          header: () => (
            <span className="block min-w-28 normal-case tracking-normal">
              <span className="block text-sm font-bold">{l.title}</span>
              <span className="block text-xs font-normal text-ink-soft">
                {l.dueOn ? (
                  <>
                    due <Day iso={l.dueOn} />
                  </>
                ) : (
                  "no due date"
                )}
              </span>
            </span>
          ),
          sortUndefined: "last",
          sortDescFirst: true,
          cell: (c) => {
            const cell = c.row.original.cells[l.slug];
            if (!cell) return <GradeMark cell={null} />;
            const who = c.row.original.name || c.row.original.email;
            return (
              <Link
                to={`/attempts/${cell.attemptId}/review?class=${classId}`}
                className="-m-1 inline-block rounded p-1 hover:bg-paper-deep"
                aria-label={`${who}, ${l.title}: ${formatScore(cell.score)} ${STATUS_LABELS[cellStatus(cell)]}${cell.overridden ? " (override)" : ""}${cell.reason && !cell.passed ? `. ${cell.reason}` : "."} Open the review`}
              >
                <GradeMark cell={cell} />
                <span className="block text-[11px] text-ink-soft">
                  {cell.attempts} attempt{cell.attempts === 1 ? "" : "s"}
                  {cell.versionNumber ? ` · v${cell.versionNumber}` : ""}
                </span>
              </Link>
            );
          },
        }),
      ),
    ],
    [book.lessons, classId],
  );

  const table = useReactTable({
    data: book.rows,
    columns,
    state: { sorting, columnFilters },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const rows = table.getRowModel().rows;

  return (
    <div className="grid gap-3">
      <div className="flex flex-wrap items-end gap-3" role="search" aria-label="Filter the gradebook">
        <div>
          <label className="label" htmlFor="gb-search">
            Search trainees
          </label>
          <div className="relative">
            <Search aria-hidden="true" className="pointer-events-none absolute left-2 top-2 h-4 w-4 text-ink-soft" />
            <input
              id="gb-search"
              type="search"
              className="field pl-8"
              placeholder="Name or e-mail"
              value={filter.q}
              onChange={(e) => setFilter({ ...filter, q: e.target.value })}
            />
          </div>
        </div>
        <div>
          <label className="label" htmlFor="gb-status">
            Show
          </label>
          <select
            id="gb-status"
            className="field"
            value={filter.status}
            onChange={(e) => setFilter({ ...filter, status: e.target.value as StatusFilter })}
          >
            <option value="all">Everyone</option>
            <option value="passed">Passed</option>
            <option value="failed">Not passed</option>
            <option value="not-attempted">Not attempted</option>
          </select>
        </div>
        <div>
          <label className="label" htmlFor="gb-lesson">
            In
          </label>
          <select
            id="gb-lesson"
            className="field"
            value={filter.lesson}
            onChange={(e) => setFilter({ ...filter, lesson: e.target.value })}
            disabled={filter.status === "all"}
          >
            <option value="">any assigned lesson</option>
            {book.lessons.map((l) => (
              <option key={l.slug} value={l.slug}>
                {l.title}
              </option>
            ))}
          </select>
        </div>
        <p className="ml-auto text-sm text-ink-soft" aria-live="polite">
          {rows.length} of {book.rows.length} trainee{book.rows.length === 1 ? "" : "s"}
        </p>
      </div>

      <div className="max-h-[70vh] overflow-auto rounded border border-rule bg-sheet">
        <table className="data-table w-full border-separate border-spacing-0">
          <caption className="sr-only">
            Gradebook: trainees by assigned lesson, best grade in each. Column headers sort.
          </caption>
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h, i) => {
                  const sorted = h.column.getIsSorted();
                  const Icon = sorted === "asc" ? ArrowUp : sorted === "desc" ? ArrowDown : ArrowUpDown;
                  return (
                    <th
                      key={h.id}
                      scope="col"
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
                      className={`sticky top-0 z-10 bg-sheet align-bottom ${i === 0 ? "left-0 z-20" : ""}`}
                    >
                      <button
                        type="button"
                        className="inline-flex items-end gap-1 text-left uppercase"
                        onClick={h.column.getToggleSortingHandler()}
                      >
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <Icon aria-hidden="true" className={`h-3.5 w-3.5 shrink-0 ${sorted ? "" : "opacity-40"}`} />
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className="hover:bg-paper/60">
                {row.getVisibleCells().map((cell, i) =>
                  i === 0 ? (
                    <th key={cell.id} scope="row" className="sticky left-0 z-[1] bg-sheet font-normal">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </th>
                  ) : (
                    <td key={cell.id}>{flexRender(cell.column.columnDef.cell, cell.getContext())}</td>
                  ),
                )}
              </tr>
            ))}
            {rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="py-6 text-center text-ink-soft">
                  {book.rows.length ? "No trainee matches these filters." : "No trainees in this class yet."}
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
    </div>
  );
}
