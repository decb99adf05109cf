import { useEffect, useId, useState } from "react";
import { parseFall } from "~/engine";
import { fallDetail, formatRatio } from "./format";

interface Props {
  label: string;
  value: string | number | undefined;
  onCommit: (value: string | undefined) => void;
  optional?: boolean;
  placeholder?: string;
  disabled?: boolean;
  testId?: string;
}

/**
 * A fall typed the way people say it: 1:40, 1 in 40, 2°, 2.5%, 25 mm/m. The text itself goes into
 * the spec, so the roof keeps the user's notation; the parsed forms show underneath.
 */
export function FallField({ label, value, onCommit, optional, placeholder, disabled, testId }: Props) {
  const id = useId();
  const [text, setText] = useState(value == null ? "" : String(value));
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    if (String(value ?? "") !== text) {
      setText(value == null ? "" : String(value));
      setError(null);
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [value]);

  const parsed = text.trim() ? parseFall(text) : null;

  function change(next: string) {
    setText(next);
    if (next.trim() === "") {
      if (optional) {
        setError(null);
        onCommit(undefined);
      } else setError("needs a fall, such as 1:40, 2°, 2.5% or 25 mm/m");
      return;
    }
    const result = parseFall(next);
    if (!result.ok) return setError(`${next.trim()} ${result.error}`);
    setError(null);
    onCommit(next.trim());
  }

  return (
    <div>
      <label htmlFor={id} className="label">
        {label}
      </label>
      <input
        id={id}
        className={`field ${error ? "border-bad" : ""}`}
        value={text}
        placeholder={placeholder}
        disabled={disabled}
        spellCheck={false}
        autoComplete="off"
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-note`}
        onChange={(e) => change(e.target.value)}
        data-testid={testId}
      />
      {error ? (
        <p id={`${id}-note`} className="field-error text-xs" role="alert">
          {error}
        </p>
      ) : (
        <p id={`${id}-note`} className="mt-1 text-xs tabular-nums text-ink-soft">
          {parsed?.ok ? `${formatRatio(parsed.ratio)} · ${fallDetail(parsed.ratio)}` : optional ? "rule set default" : " "}
        </p>
      )}
    </div>
  );
}
