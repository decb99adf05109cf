import type { SessionUser } from "../auth.server";
import { db } from "../db.server";
import { createAttempt, submissionSchema, type CreateOutcome } from "./attempts.server";
import { lessonForViewer } from "./access.server";
import { issueCertificatesAfterGrade } from "../certificates/certificates.server";

export type SubmitOutcome =
  CreateOutcome | { status: 400; message: string; issues: { path: string; message: string }[] };

const issuesOf = (issues: readonly { path: readonly PropertyKey[]; message: string }[]) =>
  issues.map((i) => ({ path: i.path.length ? i.path.map(String).join(".") : "(body)", message: i.message }));

/** Validates a submission from the API or the player, grades it on the server and stores it once. */
export async function submitAttempt(user: SessionUser, body: unknown): Promise<SubmitOutcome> {
  const parsed = submissionSchema.safeParse(body);
  if (!parsed.success)
    return { status: 400, message: "The attempt is malformed.", issues: issuesOf(parsed.error.issues) };
  const entry = await lessonForViewer(db(), parsed.data.lesson, user);
  if (!entry) return { status: 404, message: `There is no lesson "${parsed.data.lesson}".` };
  if (entry.status === "draft")
    return {
      status: 409,
      message: "This lesson is a draft: publish it before attempts are kept (Preview grades a trial attempt).",
    };
  const outcome = await createAttempt(db(), user.id, parsed.data, (slug) =>
    slug === entry.lesson.slug ? entry.lesson : null,
  );
  // A new grade may complete a course (docs/product.md capability 10).
  if (outcome.status === 201) await issueCertificatesAfterGrade(user.id, parsed.data.lesson);
  return outcome;
}

/** The player's form, read into the API's body: answers from fields `q:<id>`, the roof from `spec` (JSON). */
export function submissionFromForm(slug: string, form: FormData): unknown {
  const answers: Record<string, string | string[]> = {};
  for (const [name, value] of form) {
    if (!name.startsWith("q:") || typeof value !== "string") continue;
    const id = name.slice(2);
    const prev = answers[id];
    answers[id] = prev === undefined ? value : Array.isArray(prev) ? [...prev, value] : [prev, value];
  }
  let spec: unknown = null;
  try {
    spec = JSON.parse(String(form.get("spec") ?? "null"));
  } catch {
    spec = null;
  }
  const time = Number(form.get("timeSpentSeconds"));
  const version = String(form.get("version") ?? "");
  return {
    lesson: slug,
    version: version || undefined,
    answers,
    spec,
    idempotencyKey: String(form.get("idempotencyKey") ?? ""),
    timeSpentSeconds: Number.isFinite(time) && time >= 0 ? time : 0,
  };
}
