/** The "choose a password" part shared by invitation, reset, sign-up and account forms. */
import { data } from "react-router";
import { passwordProblem } from "~/lib/password.server";
import { retryAfterHeaders } from "~/lib/rate-limit.server";

export type FieldErrors = Partial<Record<string, string>>;

export type PasswordFormResult =
  | { ok: true; userId: string; setCookie: string }
  | {
      ok: false;
      status: 400 | 404 | 410 | 429;
      formError?: string;
      fieldErrors?: FieldErrors;
      /** What the user typed (never the passwords), to put back in the form. */
      values: Record<string, string>;
      retryAfter?: number;
    };

export type PasswordFormFailure = Extract<PasswordFormResult, { ok: false }>;

export const NAME_MAX = 100;

/** Reads name (optional), password and confirm; returns them or a 400 result with every problem. */
export function newPasswordFields(
  form: FormData,
  opts: { withName?: boolean; email?: string } = {},
):
  | { ok: true; name: string; password: string; values: Record<string, string> }
  | { ok: false; result: PasswordFormFailure } {
  const name = String(form.get("name") ?? "")
    .trim()
    .replace(/\s+/g, " ");
  const password = String(form.get("password") ?? "");
  const confirm = String(form.get("confirm") ?? "");
  const values: Record<string, string> = opts.withName ? { name: name.slice(0, NAME_MAX) } : {};
  const fieldErrors: FieldErrors = {};
  if (opts.withName) {
    if (!name) fieldErrors.name = "Enter your name as trainers and colleagues should see it.";
    else if (name.length > NAME_MAX) fieldErrors.name = `Use at most ${NAME_MAX} characters.`;
  }
  const problem = passwordProblem(password, { email: opts.email });
  if (problem) fieldErrors.password = problem;
  else if (password !== confirm) fieldErrors.confirm = "The two passwords are not the same.";
  if (Object.keys(fieldErrors).length) return { ok: false, result: { ok: false, status: 400, fieldErrors, values } };
  return { ok: true, name, password, values };
}

/** What a page's action returns for a refused form: the errors, what was typed, the status (and Retry-After). */
export function formFailure(r: PasswordFormFailure) {
  return data(
    { formError: r.formError ?? null, fieldErrors: r.fieldErrors ?? {}, values: r.values },
    { status: r.status, headers: retryAfterHeaders(r.retryAfter) },
  );
}
