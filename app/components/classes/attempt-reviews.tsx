import { When } from "~/components/dates";
import { MessageSquareText, PenLine } from "lucide-react";
import { formatScore, type AttemptReview } from "~/lib/gradebook";

/**
 * Trainers' comments and grade changes on one attempt, newest first. The lessons pages can
 * include this beside the trainee's own attempt (loader: reviewsForAttempt(attemptId)).
 */
export function AttemptReviews({
  reviews,
  automatic,
}: {
  reviews: AttemptReview[];
  automatic?: { score: number; passed: boolean };
}) {
  if (!reviews.length) return <p className="text-sm text-ink-soft">No trainer has commented on this attempt yet.</p>;
  const inForce = reviews.find((r) => r.overrideScore !== null || r.overridePassed !== null)?.id;
  return (
    <ol className="grid gap-3" aria-label="Trainer reviews, newest first">
      {reviews.map((r) => {
        const overrides = r.overrideScore !== null || r.overridePassed !== null;
        return (
          <li key={r.id} className="rounded border border-rule bg-paper/60 p-3">
            <p className="flex flex-wrap items-center gap-x-2 text-sm">
              {overrides ? (
                <PenLine aria-hidden="true" className="h-4 w-4" />
              ) : (
                <MessageSquareText aria-hidden="true" className="h-4 w-4" />
              )}
              <strong>{r.reviewerName}</strong>
              <time dateTime={r.at} className="text-ink-soft">
                <When iso={r.at} />
              </time>
              {r.id === inForce ? (
                <span className="rounded bg-ink px-1.5 text-xs text-sheet">grade in force</span>
              ) : null}
            </p>
            {r.comment ? <p className="mt-1 whitespace-pre-wrap">{r.comment}</p> : null}
            {overrides ? (
              <p className="mt-2 text-sm">
                Grade changed to{" "}
                <strong>{r.overrideScore !== null ? `${formatScore(r.overrideScore)}/100` : "—"}</strong>,{" "}
                <strong>{r.overridePassed === null ? "—" : r.overridePassed ? "passed" : "not passed"}</strong>
                {automatic ? (
                  <span className="text-ink-soft">
                    {" "}
                    (automatic grade {formatScore(automatic.score)}/100, {automatic.passed ? "passed" : "not passed"})
                  </span>
                ) : null}
                .{r.reason ? <> Reason: {r.reason}</> : null}
              </p>
            ) : null}
          </li>
        );
      })}
    </ol>
  );
}
