import { Link } from "react-router";

export interface CheckListItem {
  id: string;
  measuredOn: string;
  measuredBy: string;
  checkedBy: string;
  passed: boolean;
  failures: number;
  points: number;
  roofVersion: number;
}

/** A roof's as-built checks, newest first, each linking to its page and PDF. */
export function CheckList({ roofId, checks, limit }: { roofId: string; checks: CheckListItem[]; limit?: number }) {
  if (!checks.length) return <p className="text-sm text-ink-soft">No as-built checks yet.</p>;
  const shown = limit ? checks.slice(0, limit) : checks;
  return (
    <ul className="divide-y divide-rule rounded border border-rule bg-sheet" aria-label="As-built checks">
      {shown.map((c) => (
        <li key={c.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2">
          <Link to={`/roofs/${roofId}/checks/${c.id}`} className="font-medium">
            {c.measuredOn}: measured by {c.measuredBy}, checked by {c.checkedBy}
          </Link>
          <span className="flex items-center gap-3 text-sm">
            <span className={c.passed ? "font-semibold text-ok" : "font-semibold text-bad"}>
              {c.passed ? "PASS" : `FAIL (${c.failures})`}
            </span>
            <span className="text-ink-soft">
              {c.points} points · design v{c.roofVersion}
            </span>
            <a href={`/roofs/${roofId}/checks/${c.id}.pdf`} download>
              PDF
            </a>
          </span>
        </li>
      ))}
    </ul>
  );
}
