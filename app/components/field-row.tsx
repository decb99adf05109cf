import { useId, type ReactNode } from "react";

/** What the control inside a FieldRow spreads onto itself: its id and the line that describes it. */
export interface FieldControl {
  id: string;
  "aria-invalid"?: true;
  "aria-describedby"?: string;
}

/**
 * One labelled form control: the label (with its unit), the control, then either its error,
 * announced when it appears, or its hint. The control comes from `children`, which receives the id
 * and the ARIA wiring to spread on it, so an input, a select or a text field all read the same.
 */
export function FieldRow({
  label,
  unit,
  hideLabel,
  error,
  hint,
  hintClassName = "",
  className,
  children,
}: {
  label: ReactNode;
  /** Shown after the label in brackets: "Upstand (mm)". */
  unit?: string;
  /** In a table row or a card: the label is for screen readers only. */
  hideLabel?: boolean;
  error?: string | null;
  hint?: ReactNode;
  hintClassName?: string;
  className?: string;
  children: (control: FieldControl) => ReactNode;
}) {
  const id = useId();
  const described = error ? `${id}-error` : hint ? `${id}-hint` : undefined;
  return (
    <div className={className}>
      <label htmlFor={id} className={hideLabel ? "sr-only" : "label"}>
        {label}
        {unit ? ` (${unit})` : ""}
      </label>
      {children({ id, "aria-invalid": error ? true : undefined, "aria-describedby": described })}
      {error ? (
        <p id={`${id}-error`} className="field-error text-xs" role="alert">
          {error}
        </p>
      ) : hint ? (
        <p id={`${id}-hint`} className={`mt-1 text-xs text-ink-soft ${hintClassName}`}>
          {hint}
        </p>
      ) : null}
    </div>
  );
}
