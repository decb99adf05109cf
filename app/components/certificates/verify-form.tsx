import { Form } from "react-router";
import { FieldRow } from "~/components/field-row";

/**
 * The code on a printed certificate, typed in to check it: a GET form to /verify, which opens
 * /verify/:code. Keeps what was typed when it cannot be a code.
 */
export function VerifyForm({ typed = "", error }: { typed?: string; error?: string | null }) {
  return (
    <Form method="get" action="/verify" className="flex flex-wrap items-end gap-2" data-testid="verify-form">
      <FieldRow
        label="Verification code"
        error={error}
        hint="12 letters and digits, as printed on the certificate, e.g. 7Q2K-9XPM-4RTA"
        className="min-w-0 flex-1"
      >
        {(control) => (
          <input
            name="code"
            defaultValue={typed}
            className="field font-mono uppercase"
            autoComplete="off"
            autoCapitalize="characters"
            spellCheck={false}
            maxLength={64}
            required
            {...control}
          />
        )}
      </FieldRow>
      <button type="submit" className="btn-primary">
        Check
      </button>
    </Form>
  );
}
