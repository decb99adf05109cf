import { useId, useState } from "react";

interface Props {
  label: string;
  /** Stored value (e.g. metres); `scale` turns it into the shown unit (1000 for mm). */
  value: number | undefined;
  onCommit: (value: number | undefined) => void;
  unit?: string;
  scale?: number;
  min?: number;
  max?: number;
  digits?: number;
  /** Empty is allowed and means "not set". */
  optional?: boolean;
  placeholder?: string;
  disabled?: boolean;
  /** In a table row: the label is for screen readers only. */
  compact?: boolean;
  hint?: string;
  testId?: string;
}

function show(value: number | undefined, scale: number, digits: number) {
  if (value == null) return "";
  const v = value * scale;
  return String(Number(v.toFixed(digits)));
}

/**
 * A number typed by hand. Valid input is committed as it is typed; invalid input stays in the
 * box with the reason beside it, and the roof keeps its last good value.
 */
export function NumberField({ label, value, onCommit, unit, scale = 1, min, max, digits = 3, optional, placeholder, disabled, compact, hint, testId }: Props) {
  const id = useId();
  const [text, setText] = useState(() => show(value, scale, digits));
  const [error, setError] = useState<string | null>(null);

  // Only an outside change of the value (undo, drag, apply) rewrites the box: the value is
  // compared with the one last seen while rendering (React's "adjust state when a prop changes").
  const [seen, setSeen] = useState(value);
  if (seen !== value) {
    setSeen(value);
    const typed = text.trim() === "" ? undefined : Number(text.replace(",", ".")) / scale;
    const same = typed === value || (typed != null && value != null && Math.abs(typed - value) < 1e-9);
    if (!same) {
      setText(show(value, scale, digits));
      setError(null);
    }
  }

  function change(next: string) {
    setText(next);
    const trimmed = next.trim().replace(",", ".");
    if (trimmed === "") {
      if (optional) {
        setError(null);
        onCommit(undefined);
      } else setError("needs a value");
      return;
    }
    const n = Number(trimmed);
    if (!Number.isFinite(n)) return setError("is not a number");
    if (min != null && n < min) return setError(`must be at least ${min}${unit ? ` ${unit}` : ""}`);
    if (max != null && n > max) return setError(`must be at most ${max}${unit ? ` ${unit}` : ""}`);
    setError(null);
    onCommit(n / scale);
  }

  return (
    <div className={compact ? "min-w-0" : ""}>
      <label htmlFor={id} className={compact ? "sr-only" : "label"}>
        {label}
        {unit && !compact ? ` (${unit})` : ""}
      </label>
      <input
        id={id}
        className={`field tabular-nums ${error ? "border-bad" : ""} ${compact ? "px-1.5 py-1" : ""}`}
        inputMode="decimal"
        value={text}
        placeholder={placeholder}
        disabled={disabled}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined}
        onChange={(e) => change(e.target.value)}
        data-testid={testId}
      />
      {error ? (
        <p id={`${id}-error`} className="field-error text-xs" role="alert">
          {compact ? `${label} ` : ""}
          {error}
        </p>
      ) : hint && !compact ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-soft">
          {hint}
        </p>
      ) : null}
    </div>
  );
}
