import { useRef, useState } from "react";
import { FieldRow } from "~/components/field-row";
import { useUnits } from "~/components/units";
import {
  bareUnit,
  formatLength,
  formatLevel,
  lengthInputText,
  loadLengthReader,
  readLength,
  type LengthKind,
  type UnitSystem,
} from "~/lib/units";

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
  /**
   * A length in metres shown in the chosen units: "length" is m or feet and inches, "level" is mm
   * or inches. Any length unit may be typed (12' 6", 150 mm, 6 1/2 in); `min`/`max` stay in the
   * metric unit (`scale`), `unit` and `digits` are then unused.
   */
  length?: LengthKind;
}

function show(value: number | undefined, scale: number, digits: number) {
  if (value == null) return "";
  const v = value * scale;
  return String(Number(v.toFixed(digits)));
}

function showIn(
  value: number | undefined,
  scale: number,
  digits: number,
  length: LengthKind | undefined,
  system: UnitSystem,
) {
  return length ? lengthInputText(value, system, length) : show(value, scale, digits);
}

/**
 * The typed text as the stored value, or why it is not one; `pending` while text beyond a plain
 * number waits for the length reader (mathjs), which loads when the field is first focused.
 */
function read(
  text: string,
  scale: number,
  length: LengthKind | undefined,
  system: UnitSystem,
): { value: number } | { error: string } | { pending: true } {
  if (length) {
    const r = readLength(text, system, length);
    if (!r) return { pending: true };
    return r.ok ? { value: r.metres } : { error: r.error };
  }
  const n = Number(text.replace(",", "."));
  return Number.isFinite(n) ? { value: n / scale } : { error: "is not a number" };
}

/**
 * A number typed by hand. Valid input is committed as it is typed; invalid input stays in the
 * box with the reason beside it, and the roof keeps its last good value.
 */
export function NumberField({
  label,
  value,
  onCommit,
  unit: metricUnit,
  scale = 1,
  min,
  max,
  digits = 3,
  optional,
  placeholder,
  disabled,
  compact,
  hint,
  testId,
  length,
}: Props) {
  const system = useUnits();
  const unit = length ? (system === "us" && length === "length" ? "ft, in" : bareUnit(system, length)) : metricUnit;
  const [text, setText] = useState(() => showIn(value, scale, digits, length, system));
  const [error, setError] = useState<string | null>(null);
  const latest = useRef(text);

  // Only an outside change of the value (undo, drag, apply) or of the unit system rewrites the box:
  // both are compared with the ones last seen while rendering (React's "adjust state when a prop changes").
  const [seen, setSeen] = useState({ value, system });
  if (seen.value !== value || seen.system !== system) {
    const systemChanged = seen.system !== system;
    setSeen({ value, system });
    const r = text.trim() === "" ? { value: undefined } : read(text.trim(), scale, length, system);
    const typed = "value" in r ? r.value : Number.NaN;
    // What is shown rounds (to 1/16 in): a value within that of the typed text is the same.
    const tolerance = length && system === "us" ? 0.0254 / 32 : 1e-9;
    const same =
      !(systemChanged && length) &&
      (typed === value || (typed != null && value != null && Math.abs(typed - value) < tolerance));
    if (!same) {
      setText(showIn(value, scale, digits, length, system));
      setError(null);
    }
  }

  const limit = (v: number) => {
    if (!length) return `${v}${unit ? ` ${unit}` : ""}`;
    return (length === "level" ? formatLevel(v / scale, system) : formatLength(v / scale, system)).replace(
      /\u00a0/g,
      " ",
    );
  };

  function change(next: string) {
    setText(next);
    latest.current = next;
    const trimmed = next.trim().replace(",", ".");
    if (trimmed === "") {
      if (optional) {
        setError(null);
        onCommit(undefined);
      } else setError("needs a value");
      return;
    }
    const r = read(trimmed, scale, length, system);
    if ("pending" in r) {
      loadLengthReader().then(
        () => latest.current === next && change(next),
        () => latest.current === next && setError("could not load the unit reader: type a plain number"),
      );
      return;
    }
    if ("error" in r) return setError(r.error);
    const n = r.value * scale;
    if (min != null && n < min - 1e-9) return setError(`must be at least ${limit(min)}`);
    if (max != null && n > max + 1e-9) return setError(`must be at most ${limit(max)}`);
    setError(null);
    onCommit(r.value);
  }

  return (
    <FieldRow
      className={compact ? "min-w-0" : ""}
      label={label}
      unit={compact ? undefined : unit}
      hideLabel={compact}
      error={error && (compact ? `${label} ${error}` : error)}
      hint={compact ? undefined : hint}
    >
      {(control) => (
        <input
          {...control}
          className={`field tabular-nums ${error ? "border-bad" : ""} ${compact ? "px-1.5 py-1" : ""}`}
          inputMode={length && system === "us" ? "text" : "decimal"}
          value={text}
          placeholder={placeholder}
          disabled={disabled}
          onChange={(e) => change(e.target.value)}
          onFocus={length ? () => void loadLengthReader().catch(() => {}) : undefined}
          data-testid={testId}
        />
      )}
    </FieldRow>
  );
}
