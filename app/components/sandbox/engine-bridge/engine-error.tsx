import { useSandbox } from "../state/store";

/** Why the current roof cannot be analysed, while the views keep the last good one. */
export function EngineErrorNote() {
  const error = useSandbox((s) => s.engineError);
  if (!error) return null;
  return (
    <div
      role="alert"
      className="rounded border border-bad/50 bg-accent-wash px-3 py-2 text-sm"
      data-testid="engine-error"
    >
      <p className="font-medium text-bad">
        {error.status === 422
          ? "This roof cannot be built yet"
          : error.status === 400
            ? "Something in the roof is not valid"
            : "The engine stopped"}
        : the views show the last roof that worked.
      </p>
      <ul className="mt-1 list-disc pl-5">
        {(error.issues.length ? error.issues : [{ path: "", message: error.message }]).slice(0, 5).map((i, k) => (
          <li key={k}>
            {i.path && i.path !== "(spec)" ? <code className="text-xs">{i.path}</code> : null} {i.message}
          </li>
        ))}
      </ul>
    </div>
  );
}
