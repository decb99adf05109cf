import { useEffect, useRef } from "react";
import { Form } from "react-router";
import type { InviteReport } from "~/lib/roster";
import { FormError, SubmitButton } from "~/components/form-field";

function Group({ title, items, tone }: { title: string; items: string[]; tone?: "ok" | "bad" }) {
  if (!items.length) return null;
  return (
    <div>
      <p className={`font-medium ${tone === "ok" ? "text-ok" : tone === "bad" ? "text-bad" : ""}`}>
        {title} ({items.length})
      </p>
      <ul className="ml-5 list-disc break-all">
        {items.map((e) => (
          <li key={e}>{e}</li>
        ))}
      </ul>
    </div>
  );
}

/** What happened to each pasted address, grouped. */
export function InviteReportView({ report }: { report: InviteReport }) {
  return (
    <div role="status" className="grid gap-2 rounded border border-rule bg-paper px-3 py-2 text-sm">
      <Group title="Invitation e-mailed" items={report.invited} tone="ok" />
      <Group
        title="Already had an account: asked by e-mail to join (they join when they accept)"
        items={report.askedToJoin}
        tone="ok"
      />
      <Group title="Not valid e-mail addresses (left in the box to fix)" items={report.invalid} tone="bad" />
      <Group title="Refused" items={report.refused.map((r) => `${r.email}: ${r.message}`)} tone="bad" />
      <Group
        title="E-mail could not be sent (the invitation stands; resend later)"
        items={report.mailFailed}
        tone="bad"
      />
      <Group title="Already in the class (skipped)" items={report.alreadyMember} />
      <Group title="Already invited and not yet answered (skipped)" items={report.alreadyInvited} />
      <Group title="Pasted more than once (invited once)" items={report.repeated} />
      {report.truncated ? (
        <p className="text-bad">Only the first 200 addresses were taken. Paste the rest again.</p>
      ) : null}
    </div>
  );
}

export function InviteForm({ report, text, error }: { report?: InviteReport; text?: string; error?: string }) {
  const box = useRef<HTMLTextAreaElement>(null);
  // After a send, show what is left to fix (the invalid lines) rather than the old list.
  useEffect(() => {
    if (box.current && text !== undefined) box.current.value = text;
  }, [text, report]);
  return (
    <Form method="post" className="grid gap-3" noValidate>
      <input type="hidden" name="intent" value="invite" />
      <div>
        <label className="label" htmlFor="addresses">
          E-mail addresses
        </label>
        <textarea
          ref={box}
          id="addresses"
          name="addresses"
          rows={5}
          className="field font-mono"
          defaultValue={text ?? ""}
          placeholder={"ana@example.org, ben@example.org\nCleo Daye <cleo@example.org>"}
          aria-describedby="addresses-hint"
          aria-invalid={error ? true : undefined}
        />
        <p id="addresses-hint" className="mt-1 text-xs text-ink-soft">
          Paste a list: commas, semicolons or one per line. Each new address gets a single-use link valid for 7 days.
        </p>
      </div>
      <FormError message={error} />
      {report ? <InviteReportView report={report} /> : null}
      <div>
        <SubmitButton intent="invite" pendingText="Sending invitations…">
          Send invitations
        </SubmitButton>
      </div>
    </Form>
  );
}
