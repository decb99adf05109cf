import { useEffect, useMemo, useRef, useState } from "react";
import { Form, useNavigation } from "react-router";
import { FormError } from "~/components/form-field";

export interface MeasuredPlace {
  label: string;
  joist: number;
  kind: "end" | "check";
  at: [number, number];
  designMm: number;
}

/** Field errors by field name (`measuredBy`, `level:J4 start`, `file`, ...) and `form` for the whole form. */
export type CheckFormErrors = Record<string, string>;

type MetaField = "measuredBy" | "checkedBy" | "measuredOn" | "deviationMm" | "pondDepthMm";

/** Where the form keeps what was typed on this device (per roof and design version). */
export const draftKey = (roofId: string, version: number) => `fallwright:as-built:${roofId}:v${version}`;

/**
 * The measured-levels form (docs/as-built.md, "Saved checks"): joist by joist on a phone, large
 * inputs, every value kept in localStorage as it is typed so a dropped connection or a closed
 * tab loses nothing; offline, a submit waits for the connection and then goes. A CSV upload (a
 * filled measured schedule, or a survey) is the other way in.
 */
export function MeasuredForm({
  roofId,
  version,
  places,
  outline,
  today,
  errors,
  values,
}: {
  roofId: string;
  version: number;
  places: MeasuredPlace[];
  /** The roof's corners, to pick a reference point's position on the plan. */
  outline: [number, number][];
  today: string;
  errors?: CheckFormErrors;
  values?: Record<string, string>;
}) {
  const joists = useMemo(() => {
    const m = new Map<number, MeasuredPlace[]>();
    for (const p of places) m.set(p.joist, [...(m.get(p.joist) ?? []), p]);
    return [...m.entries()].sort((a, b) => a[0] - b[0]);
  }, [places]);
  const key = draftKey(roofId, version);
  const [typed, setTyped] = useState<Record<string, string>>(() => ({
    measuredOn: today,
    deviationMm: "10",
    pondDepthMm: "5",
    ...(values ?? {}),
  }));
  const [step, setStep] = useState(0);
  const [waiting, setWaiting] = useState(false);
  const [restored, setRestored] = useState(false);
  const formRef = useRef<HTMLFormElement>(null);
  const navigation = useNavigation();
  const busy = navigation.state === "submitting";

  // Restore a draft kept on this device (the server's echo, after an error, wins).
  useEffect(() => {
    try {
      const saved = JSON.parse(localStorage.getItem(key) ?? "null") as Record<string, string> | null;
      if (saved && typeof saved === "object") {
        setTyped((t) => ({ ...t, ...saved, ...(values ?? {}) }));
        if (Object.keys(saved).some((k) => k.startsWith("level:") && saved[k])) setRestored(true);
      }
    } catch {
      // A draft that cannot be read is left alone.
    }
  }, [key, values]);

  // Jump to the first joist with an error.
  useEffect(() => {
    if (!errors) return;
    const first = joists.findIndex(([, ps]) => ps.some((p) => errors[`level:${p.label}`]));
    if (first >= 0) setStep(first);
  }, [errors, joists]);

  // Offline: send when the connection is back.
  useEffect(() => {
    if (!waiting) return;
    const go = () => {
      setWaiting(false);
      formRef.current?.requestSubmit();
    };
    window.addEventListener("online", go);
    return () => window.removeEventListener("online", go);
  }, [waiting]);

  const set = (name: string, value: string) =>
    setTyped((t) => {
      const next = { ...t, [name]: value };
      try {
        localStorage.setItem(key, JSON.stringify(next));
      } catch {
        // Storage full or blocked: the form still works, only without the draft.
      }
      return next;
    });

  const filled = places.filter((p) => (typed[`level:${p.label}`] ?? "").trim() !== "").length;
  const [joist, here] = joists[step] ?? [0, []];
  const meta = (name: MetaField, label: string, type = "text", extra: Record<string, string> = {}) => (
    <div>
      <label className="label" htmlFor={`m-${name}`}>
        {label}
      </label>
      <input
        id={`m-${name}`}
        name={name}
        type={type}
        className="field text-lg"
        value={typed[name] ?? ""}
        onChange={(e) => set(name, e.target.value)}
        aria-invalid={errors?.[name] ? true : undefined}
        aria-describedby={errors?.[name] ? `m-${name}-error` : undefined}
        {...extra}
      />
      {errors?.[name] ? (
        <p id={`m-${name}-error`} className="field-error">
          {errors[name]}
        </p>
      ) : null}
    </div>
  );

  return (
    <section className="card space-y-4" aria-labelledby="new-check">
      <h2 id="new-check" className="text-xl font-semibold">
        New check
      </h2>
      <FormError message={errors?.form} />
      {restored ? (
        <p role="status" className="text-sm text-ok">
          Levels typed earlier on this device were kept and are filled in below.
        </p>
      ) : null}
      <Form
        method="post"
        encType="multipart/form-data"
        ref={formRef}
        className="space-y-4"
        onSubmit={(e) => {
          if (typeof navigator !== "undefined" && navigator.onLine === false) {
            e.preventDefault();
            setWaiting(true);
          }
        }}
      >
        <div className="grid gap-3 sm:grid-cols-3">
          {meta("measuredBy", "Measured by", "text", { autoComplete: "name", maxLength: "120" })}
          {meta("checkedBy", "Checked by", "text", { maxLength: "120" })}
          {meta("measuredOn", "Day measured", "date")}
          {meta("deviationMm", "Deviation tolerance (± mm)", "number", { inputMode: "decimal", step: "any" })}
          {meta("pondDepthMm", "Standing water tolerance (mm)", "number", { inputMode: "decimal", step: "any" })}
        </div>
        <p className="text-xs text-ink-soft">
          Tolerances: ±10 mm and 5 mm are common practice, no source; the minimum fall is the roof&apos;s own.
        </p>

        <fieldset className="space-y-3" aria-describedby="walk-help">
          <legend className="text-lg font-semibold">Measured levels, joist by joist</legend>
          <p id="walk-help" className="text-sm text-ink-soft">
            Levels in millimetres above the datum, as the drop schedule gives them. {filled} of {places.length} entered.
          </p>
          <div className="flex items-center justify-between gap-2">
            <button
              type="button"
              className="btn min-h-12 min-w-24 text-lg"
              onClick={() => setStep((s) => Math.max(0, s - 1))}
              disabled={step === 0}
            >
              ← Previous
            </button>
            <p className="text-lg font-semibold" aria-live="polite">
              Joist {joist}{" "}
              <span className="text-sm font-normal text-ink-soft">
                ({step + 1} of {joists.length})
              </span>
            </p>
            <button
              type="button"
              className="btn min-h-12 min-w-24 text-lg"
              onClick={() => setStep((s) => Math.min(joists.length - 1, s + 1))}
              disabled={step >= joists.length - 1}
            >
              Next →
            </button>
          </div>
          {/* Every joist's inputs stay in the form (the others hidden), so one submit sends them all. */}
          {joists.map(([j, ps], k) => (
            <div key={j} hidden={k !== step} className="grid gap-3 sm:grid-cols-2">
              {ps.map((p) => {
                const name = `level:${p.label}`;
                const id = `lvl-${p.label.replace(/[^A-Za-z0-9]/g, "-")}`;
                return (
                  <div key={p.label}>
                    <label className="label text-base" htmlFor={id}>
                      {p.kind === "end" ? p.label : `${p.label} on joist ${p.joist}`}{" "}
                      <span className="font-normal text-ink-soft">
                        at ({p.at[0].toFixed(2)}, {p.at[1].toFixed(2)}) m · design {p.designMm} mm
                      </span>
                    </label>
                    <input
                      id={id}
                      name={name}
                      inputMode="decimal"
                      autoComplete="off"
                      className="field min-h-12 text-2xl"
                      value={typed[name] ?? ""}
                      onChange={(e) => set(name, e.target.value)}
                      aria-invalid={errors?.[name] ? true : undefined}
                      aria-describedby={errors?.[name] ? `${id}-error` : undefined}
                    />
                    {errors?.[name] ? (
                      <p id={`${id}-error`} className="field-error">
                        {errors[name]}
                      </p>
                    ) : null}
                  </div>
                );
              })}
            </div>
          ))}
        </fieldset>
        {here.length === 0 ? <p className="text-sm">This roof has no joists to measure.</p> : null}
        {waiting ? (
          <p role="status" className="rounded border border-warn/40 bg-accent-wash px-3 py-2 text-sm">
            No connection: the levels are kept on this device and will be sent when the connection is back.
          </p>
        ) : null}
        <button
          type="submit"
          name="intent"
          value="form"
          className="btn btn-primary min-h-12 w-full text-lg sm:w-auto"
          disabled={busy}
        >
          {busy ? "Checking…" : "Check these levels"}
        </button>

        <details
          className="space-y-3 rounded border border-rule p-3"
          open={Boolean(errors?.file || errors?.refA || errors?.refB)}
        >
          <summary className="cursor-pointer font-medium">Or upload a CSV</summary>
          <p className="text-sm text-ink-soft">
            The roof&apos;s drop schedule download with its measured columns filled in, or a survey of points (x, y,
            level, with an optional label; metres, or feet and inches).
          </p>
          <div>
            <label className="label" htmlFor="m-file">
              CSV file
            </label>
            <input
              id="m-file"
              name="file"
              type="file"
              accept=".csv,text/csv"
              className="field"
              aria-invalid={errors?.file ? true : undefined}
              aria-describedby={errors?.file ? "m-file-error" : undefined}
            />
            {errors?.file ? (
              <p id="m-file-error" className="field-error whitespace-pre-line">
                {errors.file}
              </p>
            ) : null}
          </div>
          <fieldset className="space-y-2">
            <legend className="text-sm font-medium">A survey&apos;s positions are</legend>
            <label className="flex items-center gap-2">
              <input
                type="radio"
                name="align"
                value="roof"
                checked={(typed.align ?? "roof") === "roof"}
                onChange={() => set("align", "roof")}
              />
              in the roof&apos;s own plan coordinates
            </label>
            <label className="flex items-center gap-2">
              <input
                type="radio"
                name="align"
                value="points"
                checked={typed.align === "points"}
                onChange={() => set("align", "points")}
              />
              placed by two reference points (named in the file, positions on the plan)
            </label>
            {typed.align === "points" ? (
              <div className="grid gap-2 sm:grid-cols-3">
                {(["A", "B"] as const).map((r) => (
                  <ReferenceFields key={r} r={r} typed={typed} set={set} errors={errors} outline={outline} />
                ))}
              </div>
            ) : null}
          </fieldset>
          <button type="submit" name="intent" value="upload" className="btn min-h-12" disabled={busy}>
            Upload and check
          </button>
        </details>
      </Form>
    </section>
  );
}

function ReferenceFields({
  r,
  typed,
  set,
  errors,
  outline,
}: {
  r: "A" | "B";
  outline: [number, number][];
  typed: Record<string, string>;
  set: (name: string, value: string) => void;
  errors?: CheckFormErrors;
}) {
  const f = (name: string, label: string) => (
    <div>
      <label className="label" htmlFor={`m-${name}`}>
        {label}
      </label>
      <input
        id={`m-${name}`}
        name={name}
        className="field"
        value={typed[name] ?? ""}
        onChange={(e) => set(name, e.target.value)}
        aria-invalid={errors?.[name] ? true : undefined}
      />
      {errors?.[name] ? <p className="field-error">{errors[name]}</p> : null}
    </div>
  );
  const n = r === "A" ? "first" : "second";
  const picked = outline.findIndex((c) => String(c[0]) === typed[`ref${r}x`] && String(c[1]) === typed[`ref${r}y`]);
  return (
    <>
      <div className="sm:col-span-3">
        <label className="label" htmlFor={`m-ref${r}-corner`}>
          The {n} point on the plan
        </label>
        <select
          id={`m-ref${r}-corner`}
          className="field"
          value={picked >= 0 ? String(picked) : ""}
          onChange={(e) => {
            const c = outline[Number(e.target.value)];
            if (!c) return;
            set(`ref${r}x`, String(c[0]));
            set(`ref${r}y`, String(c[1]));
          }}
        >
          <option value="">a corner of the roof, or type x and y</option>
          {outline.map((c, i) => (
            <option key={i} value={i}>
              corner {i + 1} at ({c[0]}, {c[1]}) m
            </option>
          ))}
        </select>
      </div>
      {f(`ref${r}`, `The ${n} point's label`)}
      {f(`ref${r}x`, "its x on the plan (m)")}
      {f(`ref${r}y`, "its y on the plan (m)")}
    </>
  );
}
