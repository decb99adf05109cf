import { Link } from "react-router";
import { CheckList, type CheckListItem } from "~/components/as-built/check-list";

/** The roof's history: its design (the current version), then its as-built checks. */
export function RoofHistory({
  roofId,
  version,
  checks,
  canEdit,
}: {
  roofId: string;
  version: number;
  checks: CheckListItem[];
  canEdit: boolean;
}) {
  return (
    <section aria-labelledby="roof-history" className="space-y-2">
      <h2 id="roof-history" className="text-lg font-semibold">
        History: design, then as-built checks
      </h2>
      <ol className="space-y-2">
        <li className="text-sm">
          <strong>Design</strong>: version {version} (below).
        </li>
        <li className="space-y-1">
          <p className="text-sm">
            <strong>As-built checks</strong>: levels measured on the deck against the design.{" "}
            <Link to={`/roofs/${roofId}/checks`}>{canEdit ? "All checks and a new one" : "All checks"}</Link>
          </p>
          <CheckList roofId={roofId} checks={checks} limit={5} />
        </li>
      </ol>
    </section>
  );
}
