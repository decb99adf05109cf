import { type ComponentProps, type ReactNode } from "react";
import { FieldRow } from "~/components/field-row";
import { useNavigation } from "react-router";

/** A labelled input with its hint or error wired up for screen readers (a FieldRow holding an input). */
export function Field({
  label,
  name,
  error,
  hint,
  ...input
}: { label: string; name: string; error?: string; hint?: ReactNode } & ComponentProps<"input">) {
  return (
    <FieldRow label={label} error={error} hint={hint}>
      {(control) => <input name={name} className="field" {...control} {...input} />}
    </FieldRow>
  );
}

/** A problem with the whole form (not one field): announced when it appears. */
export function FormError({ message }: { message?: string | null }) {
  if (!message) return null;
  return (
    <p role="alert" className="rounded border border-bad/40 bg-bad/5 px-3 py-2 text-sm text-bad">
      {message}
    </p>
  );
}

/** A success or information line after a form was handled. */
export function FormNotice({ message }: { message?: string | null }) {
  if (!message) return null;
  return (
    <p role="status" className="rounded border border-ok/40 bg-ok/5 px-3 py-2 text-sm text-ok">
      {message}
    </p>
  );
}

/** A submit button that says what it is doing while its form is on the way. */
export function SubmitButton({
  children,
  pendingText,
  intent,
  className = "btn-primary",
}: {
  children: ReactNode;
  pendingText: string;
  intent?: string;
  className?: string;
}) {
  const navigation = useNavigation();
  const pending =
    navigation.state === "submitting" && (intent === undefined || navigation.formData?.get("intent") === intent);
  return (
    <button
      type="submit"
      className={className}
      name={intent ? "intent" : undefined}
      value={intent}
      disabled={pending}
      aria-busy={pending || undefined}
    >
      {pending ? pendingText : children}
    </button>
  );
}

/** The narrow centred card the sign-in, sign-up, reset and invitation pages share. */
export function AuthCard({ title, lead, children }: { title: string; lead?: ReactNode; children: ReactNode }) {
  return (
    <section className="mx-auto mt-4 w-full max-w-md sm:mt-10">
      <div className="card p-6">
        <h1 className="text-2xl font-bold tracking-tight">{title}</h1>
        {lead ? <div className="mt-2 text-sm text-ink-soft">{lead}</div> : null}
        <div className="mt-5">{children}</div>
      </div>
    </section>
  );
}
