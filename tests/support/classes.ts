/** Fixtures for the class, gradebook, review and live tests. */
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import { db } from "~/lib/db.server";

export const DEMO_CLASS = "Parapet roofs, spring cohort";

/** Another test run starting on this machine empties the shared spool folder, which the SMTP fake makes only at start. */
export function ensureSpool() {
  if (process.env.MAIL_SPOOL_DIR) fs.mkdirSync(process.env.MAIL_SPOOL_DIR, { recursive: true });
}

export async function demoClassId(): Promise<string> {
  const row = await db()("classes").where({ name: DEMO_CLASS }).first("id");
  if (!row) throw new Error("the demo class is missing from the seed");
  return row.id;
}

export const SPEC = {
  outline: [
    [0, 0],
    [12, 0],
    [12, 8],
    [0, 8],
  ],
  outlets: [{ at: [6, 0] }],
  baseFall: "1:60",
  joists: { spacing: 0.4 },
};

/** A lesson row of our own, so the tests do not depend on which course files are synced. */
export async function ensureLesson(slug: string, title: string, position = 900): Promise<void> {
  const content = {
    slug,
    title,
    blocks: [{ type: "roof", figure: { caption: `${title}: figure`, view: "plan", spec: SPEC } }],
    task: { title: "Move the outlet", start: SPEC, reference: { ...SPEC, outlets: [{ at: [6, 4] }] } },
  };
  await db()("lessons")
    .insert({ slug, title, position, version: "test-v1", content: JSON.stringify(content) })
    .onConflict("slug")
    .ignore();
}

export const RESULTS = {
  score: 55,
  passed: false,
  passMark: 70,
  quiz: [
    {
      id: "q1",
      section: "quiz",
      label: "Convert 1:40 to %",
      passed: true,
      score: 1,
      weight: 1,
      feedback: "Right: 2.5 %.",
      measured: "2.5 %",
    },
  ],
  task: [
    {
      id: "fall-line",
      section: "task",
      label: "Longest fall line no flatter than 1:100",
      passed: false,
      score: 0,
      weight: 2,
      feedback: "1:140 is flatter than 1:100.",
      measured: "1:140",
    },
  ],
  roof: null,
};

/** An attempt row as the lesson player would leave it (graded 55, not passed, unless told). */
export async function insertAttempt(
  traineeId: string,
  lessonSlug: string,
  o: { score?: number; passed?: boolean } = {},
): Promise<string> {
  const [row] = await db()("attempts")
    .insert({
      trainee_id: traineeId,
      lesson_slug: lessonSlug,
      lesson_version: "test-v1",
      idempotency_key: randomUUID(),
      spec: JSON.stringify(SPEC),
      answers: JSON.stringify({ q1: "2.5 %" }),
      results: JSON.stringify({ ...RESULTS, score: o.score ?? 55, passed: o.passed ?? false }),
      score: o.score ?? 55,
      passed: o.passed ?? false,
    })
    .returning("id");
  return row.id;
}

/** A trainee account with an address of our own (mail to it is ours alone), in the given class. */
export async function makeTrainee(email: string, name: string, classId?: string): Promise<string> {
  const org = await db()("organisations").first("id");
  const [u] = await db()("users")
    .insert({ organisation_id: org!.id, email, name, role: "trainee", password_hash: "x" })
    .returning("id");
  if (classId) await db()("class_members").insert({ class_id: classId, user_id: u.id });
  return u.id;
}

export interface SseEvent {
  id: string | null;
  event: string;
  data: string;
}

/** Reads server-sent events from a streamed body, one at a time, with a time limit. */
export function sseReader(body: ReadableStream<Uint8Array>) {
  const reader = body.getReader();
  const decoder = new TextDecoder();
  let buffer = "";
  const queue: SseEvent[] = [];
  const comments: string[] = [];
  // A read left waiting when a time limit ran out is picked up by the next call, never lost.
  let pending: Promise<ReadableStreamReadResult<Uint8Array>> | null = null;
  function parse() {
    let at: number;
    while ((at = buffer.indexOf("\n\n")) >= 0) {
      const block = buffer.slice(0, at);
      buffer = buffer.slice(at + 2);
      const ev: SseEvent = { id: null, event: "message", data: "" };
      let isEvent = false;
      for (const line of block.split("\n")) {
        if (line.startsWith(":")) comments.push(line.slice(1).trim());
        else if (line.startsWith("id: ")) ev.id = line.slice(4);
        else if (line.startsWith("event: ")) {
          ev.event = line.slice(7);
          isEvent = true;
        } else if (line.startsWith("data: ")) {
          ev.data += line.slice(6);
          isEvent = true;
        }
      }
      if (isEvent) queue.push(ev);
    }
  }
  /** Reads the stream until `found` gives something, or fails after `timeoutMs`. */
  async function readUntil<T>(found: () => T | undefined, timeoutMs: number, what: string): Promise<T> {
    const end = Date.now() + timeoutMs;
    for (;;) {
      const hit = found();
      if (hit !== undefined) return hit;
      const left = end - Date.now();
      if (left <= 0) throw new Error(`no ${what} within ${timeoutMs} ms`);
      pending ??= reader.read();
      const chunk = await Promise.race([pending, new Promise<null>((r) => setTimeout(() => r(null), left))]);
      if (chunk === null) continue;
      pending = null;
      if (chunk.done) throw new Error("the stream ended");
      buffer += decoder.decode(chunk.value, { stream: true });
      parse();
    }
  }
  return {
    comments,
    next(timeoutMs = 2000, event = "state"): Promise<SseEvent> {
      return readUntil(
        () => {
          const i = queue.findIndex((e) => e.event === event);
          return i >= 0 ? queue.splice(i, 1)[0] : undefined;
        },
        timeoutMs,
        `"${event}" event`,
      );
    },
    /** Waits for a comment line (": text"), such as the server's "up to date". */
    comment(text: string, timeoutMs = 2000): Promise<string> {
      return readUntil(() => comments.find((c) => c === text), timeoutMs, `": ${text}" comment`);
    },
    /** Events received but not yet taken by next(). */
    get waiting(): readonly SseEvent[] {
      return queue;
    },
    async cancel() {
      await reader.cancel().catch(() => {});
    },
  };
}
