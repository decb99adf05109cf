import { useEffect, useRef, useState } from "react";
import { FieldRow } from "~/components/field-row";
import { fallDetail, useFormat } from "../format";
import { useSandbox } from "../state/store";

interface Props {
  label: string;
  value: string | number | undefined;
  onCommit: (value: string | undefined) => void;
  optional?: boolean;
  placeholder?: string;
  disabled?: boolean;
  testId?: string;
}

const EXAMPLES = "such as 1:40, 1/4:12, 1/4 in/ft, 2°, 2.5% or 25 mm/m";

/**
 * A fall typed the way people say it: 1:40, 1 in 40, 2°, 2.5%, 25 mm/m. The engine (in its worker)
 * reads it; a good reading goes into the spec as typed, so the roof keeps the user's notation, and
 * a bad one stays in the box with the reason, the roof keeping its last good fall.
 */
export function FallField({ label, value, onCommit, optional, placeholder, disabled, testId }: Props) {
  const engine = useSandbox((s) => s.engine);
  const { fall } = useFormat();
  const [text, setText] = useState(value == null ? "" : String(value));
  const [reading, setReading] = useState<{ error: string | null; detail: string | null }>({
    error: null,
    detail: null,
  });
  const ask = useRef(0);
  const current = useRef({ value, onCommit });
  current.current = { value, onCommit };

  // Only an outside change of the value (undo, apply) rewrites the box: the value is compared
  // with the one last seen while rendering (React's "adjust state when a prop changes").
  const [seen, setSeen] = useState(value);
  if (seen !== value) {
    setSeen(value);
    if (String(value ?? "") !== text.trim()) setText(value == null ? "" : String(value));
  }

  useEffect(() => {
    const typed = text.trim();
    const n = ++ask.current;
    if (!typed) {
      setReading({ error: optional ? null : `needs a fall, ${EXAMPLES}`, detail: null });
      return;
    }
    if (!engine) return;
    void engine.parseFall(typed).then((r) => {
      if (n !== ask.current) return;
      if (!r.ok) return setReading({ error: `${typed} ${r.error}`, detail: null });
      setReading({ error: null, detail: `${fall(r.ratio)} · ${fallDetail(r.ratio)}` });
      if (typed !== String(current.current.value ?? "")) current.current.onCommit(typed);
    });
  }, [text, engine, optional, fall]);

  function change(next: string) {
    setText(next);
    if (next.trim() === "" && optional) onCommit(undefined);
  }

  return (
    <FieldRow
      label={label}
      error={reading.error}
      // The line under the box is always there (a space when empty), so the form does not jump.
      hint={text.trim() ? (reading.detail ?? " ") : optional ? "rule set default" : " "}
      hintClassName="tabular-nums"
    >
      {(control) => (
        <input
          {...control}
          className={`field ${reading.error ? "border-bad" : ""}`}
          value={text}
          placeholder={placeholder}
          disabled={disabled}
          spellCheck={false}
          autoComplete="off"
          onChange={(e) => change(e.target.value)}
          data-testid={testId}
        />
      )}
    </FieldRow>
  );
}
