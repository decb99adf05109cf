import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { linkIn, sessionCookie, uniqueAddress, userIdOf, waitForMail } from "../support/accounts";
import { allRoutePaths } from "../support/routes";
import { startServer, type RunningServer } from "../support/server";
import { createInvitation } from "~/lib/invitations.server";
import { issueToken } from "~/lib/tokens.server";

/**
 * Hostile-input sweep (issue 13; docs/quality.md, Reliability → Bad input): every route in
 * app/routes.ts, each of its form fields, JSON fields and query parameters in turn given NUL,
 * an over-long string, control characters, numbers out of range, ids that are not UUIDs, deep
 * nesting and an array where a scalar belongs, the other fields left valid so the request gets
 * as deep as it can. Allowed answers: 2xx, 3xx, or 4xx with a message; never 5xx, never a stack.
 *
 * ADDING A ROUTE, FIELD OR PARAMETER? Add it to SWEEP below (the first test fails until you do).
 */
type Who = "anonymous" | "admin" | "trainer" | "trainee" | "designer";
type Fields = Record<string, string>;

interface Probe {
  who: Who;
  method: "GET" | "POST" | "PUT" | "DELETE";
  /** Path with {placeholders} (see IDS). */
  path: string;
  query?: Fields;
  form?: Fields;
  json?: Record<string, unknown>;
  multipart?: boolean;
}

const SPEC = {
  outline: [
    [0, 0],
    [18, 0],
    [18, 9],
    [0, 9],
  ],
  outlets: [{ at: [9, 0] }],
  baseFall: "1:60",
};
const SPEC_TEXT = JSON.stringify(SPEC);

const SWEEP: Record<string, Probe[]> = {
  "/healthz": [{ who: "anonymous", method: "GET", path: "/healthz", query: { probe: "1" } }],
  "/api/v1": [{ who: "anonymous", method: "GET", path: "/api/v1", query: { probe: "1" } }],
  "/api/v1/analyses": [
    {
      who: "anonymous",
      method: "POST",
      path: "/api/v1/analyses",
      query: { mesh: "true", traces: "true" },
      json: { ...SPEC, minFall: "1:80", probes: [[5, 5]], joists: { spacing: 0.6 } },
    },
  ],
  "/api/v1/roofs": [
    { who: "designer", method: "GET", path: "/api/v1/roofs", query: { probe: "1" } },
    { who: "designer", method: "POST", path: "/api/v1/roofs", json: { name: "Sweep roof", spec: SPEC } },
  ],
  "/api/v1/roofs/:id": [
    { who: "designer", method: "GET", path: "/api/v1/roofs/{roof}" },
    // A version far ahead: every well-formed write is a 409, so the sweep never changes the roof.
    {
      who: "designer",
      method: "PUT",
      path: "/api/v1/roofs/{roof}",
      json: { name: "Sweep rename", spec: SPEC, version: 999_999 },
    },
  ],
  "/api/v1/lessons": [{ who: "anonymous", method: "GET", path: "/api/v1/lessons", query: { probe: "1" } }],
  "/api/v1/lessons/:slug": [{ who: "anonymous", method: "GET", path: "/api/v1/lessons/{lesson}" }],
  "/api/v1/attempts": [
    { who: "trainer", method: "GET", path: "/api/v1/attempts", query: { trainee: "{traineeId}", lesson: "{lesson}" } },
    { who: "trainee", method: "GET", path: "/api/v1/attempts", query: { mine: "1", lesson: "{lesson}" } },
    {
      who: "trainee",
      method: "POST",
      path: "/api/v1/attempts",
      json: { lesson: "{lesson}", answers: { q1: "a" }, spec: SPEC, idempotencyKey: "{fresh}", timeSpentSeconds: 30 },
    },
  ],
  "/api/v1/attempts/:id": [{ who: "trainee", method: "GET", path: "/api/v1/attempts/{attempt}" }],
  "/roofs/:id/underlay": [
    {
      who: "designer",
      method: "POST",
      path: "/roofs/{roof}/underlay",
      form: { file: "not an image" },
      multipart: true,
    },
  ],
  "/roofs/new": [
    {
      who: "designer",
      method: "POST",
      path: "/roofs/new",
      form: { name: "Sweep save", spec: SPEC_TEXT, idempotencyKey: "{fresh}" },
    },
  ],
  "/roofs/:id/export": [{ who: "designer", method: "GET", path: "/roofs/{roof}/export" }],
  "/logout": [{ who: "anonymous", method: "POST", path: "/logout", form: { probe: "1" } }],
  "/sandbox/schedule.csv": [
    { who: "anonymous", method: "POST", path: "/sandbox/schedule.csv", form: { spec: SPEC_TEXT } },
  ],
  "/classes/:id/live": [
    {
      who: "trainer",
      method: "POST",
      path: "/classes/{class}/live",
      json: { spec: SPEC, title: "Sweep", source: "sandbox", deck: "", step: { index: 0, count: 1 } },
    },
    { who: "trainer", method: "POST", path: "/classes/{class}/live", json: { phase: "paused" } },
  ],
  "/classes/:id/hand-ups": [
    { who: "trainer", method: "GET", path: "/classes/{class}/hand-ups", query: { probe: "1" } },
    { who: "trainee", method: "POST", path: "/classes/{class}/hand-ups", json: { spec: SPEC, title: "Sweep" } },
  ],
  "/classes/:id/gradebook.csv": [{ who: "trainer", method: "GET", path: "/classes/{class}/gradebook.csv" }],
  "/classes/:id/present": [{ who: "trainer", method: "GET", path: "/classes/{class}/present" }],
  "/": [{ who: "anonymous", method: "GET", path: "/", query: { probe: "1" } }],
  "/sandbox": [{ who: "anonymous", method: "GET", path: "/sandbox", query: { roof: "{roof}" } }],
  "/sandbox/sheet": [{ who: "anonymous", method: "GET", path: "/sandbox/sheet", query: { from: "session" } }],
  "/api/v1/openapi.json": [{ who: "anonymous", method: "GET", path: "/api/v1/openapi.json", query: { probe: "1" } }],
  "/api/v1/docs": [{ who: "anonymous", method: "GET", path: "/api/v1/docs", query: { probe: "1" } }],
  "/api/v1/analyses/as-built": [
    {
      who: "anonymous",
      method: "POST",
      path: "/api/v1/analyses/as-built",
      json: { spec: SPEC, points: [{ at: [9, 4.5], level: 0.05, label: "P1" }], tolerance: { deviation: 0.01 } },
    },
  ],
  "/roofs/:id/schedule.csv": [
    { who: "designer", method: "GET", path: "/roofs/{roof}/schedule.csv", query: { probe: "1" } },
  ],
  "/roofs/:id/sheet.pdf": [
    { who: "designer", method: "GET", path: "/roofs/{roof}/sheet.pdf", query: { paper: "letter" } },
  ],
  "/roofs/:id/plan.dxf": [{ who: "designer", method: "GET", path: "/roofs/{roof}/plan.dxf", query: { probe: "1" } }],
  "/roofs/:id/roof.glb": [{ who: "designer", method: "GET", path: "/roofs/{roof}/roof.glb", query: { probe: "1" } }],
  "/roofs/:id/sheet": [{ who: "designer", method: "GET", path: "/roofs/{roof}/sheet", query: { paper: "letter" } }],
  "/roofs/:id/checks": [
    { who: "designer", method: "GET", path: "/roofs/{roof}/checks", query: { probe: "1" } },
    {
      who: "designer",
      method: "POST",
      path: "/roofs/{roof}/checks",
      form: {
        intent: "form",
        measuredBy: "Sweep",
        checkedBy: "Sweep",
        measuredOn: "2026-12-01",
        deviationMm: "10",
        pondDepthMm: "5",
        "level:J1 start": "abc",
      },
    },
    {
      who: "designer",
      method: "POST",
      path: "/roofs/{roof}/checks",
      form: {
        intent: "upload",
        measuredBy: "Sweep",
        checkedBy: "Sweep",
        measuredOn: "2026-12-01",
        align: "points",
        refA: "A",
        refAx: "0",
        refAy: "0",
        refB: "B",
        refBx: "18",
        refBy: "0",
        file: "x,y,level,label\n0,0,0.15,A\n18,0,0.15,B\n9,4.5,0.1,C\n",
      },
      multipart: true,
    },
  ],
  "/roofs/:id/checks/:checkId": [{ who: "designer", method: "GET", path: "/roofs/{roof}/checks/{check}" }],
  "/roofs/:id/checks/:checkId.pdf": [{ who: "designer", method: "GET", path: "/roofs/{roof}/checks/{check}.pdf" }],
  // A made-up share token: every answer is a 404 that says so, whatever is sent.
  "/s/:token": [{ who: "anonymous", method: "GET", path: "/s/not-a-real-token", query: { probe: "1" } }],
  "/s/:token/:file": [
    { who: "anonymous", method: "GET", path: "/s/not-a-real-token/schedule.csv", query: { probe: "1" } },
  ],
  "/sandbox/sheet.pdf": [
    {
      who: "anonymous",
      method: "POST",
      path: "/sandbox/sheet.pdf",
      query: { paper: "letter" },
      form: { spec: SPEC_TEXT, name: "Sweep" },
    },
  ],
  "/sandbox/plan.dxf": [
    { who: "anonymous", method: "POST", path: "/sandbox/plan.dxf", form: { spec: SPEC_TEXT, name: "Sweep" } },
  ],
  "/sandbox/roof.glb": [
    { who: "anonymous", method: "POST", path: "/sandbox/roof.glb", form: { spec: SPEC_TEXT, name: "Sweep" } },
  ],
  "/*": [{ who: "anonymous", method: "GET", path: "/no-such-page", query: { probe: "1" } }],
  "/lessons": [{ who: "anonymous", method: "GET", path: "/lessons", query: { probe: "1" } }],
  "/lessons/:slug": [
    {
      who: "trainee",
      method: "POST",
      path: "/lessons/{lesson}",
      form: { "q:q1": "a", spec: SPEC_TEXT, idempotencyKey: "{fresh}", version: "", timeSpentSeconds: "12" },
    },
  ],
  "/lessons/new": [
    {
      who: "trainer",
      method: "POST",
      path: "/lessons/new",
      form: {
        intent: "preview",
        title: "A lesson",
        summary: "One line",
        minutes: "10",
        objectives: "Read a fall",
        passMark: "70",
        body: "Text",
        "quiz.0.kind": "numeric",
        "quiz.0.id": "q1",
        "quiz.0.prompt": "How far?",
        "quiz.0.answer": "6 m",
        "quiz.0.tolerance": "1 mm",
        "quiz.0.options": "* a",
        "quiz.0.hint": "Look",
        "quiz.0.weight": "1",
        "task.title": "Task",
        "task.goal": "Goal",
        "task.start": SPEC_TEXT,
        "task.reference": SPEC_TEXT,
        "task.editable": "outlets",
        "task.criteria.0.kind": "maxOutlets",
        "task.criteria.0.value": "1",
        "task.criteria.0.weight": "1",
        "task.hints": "Hint",
      },
    },
    {
      who: "trainer",
      method: "POST",
      path: "/lessons/new",
      form: { intent: "import", source: "---\ntitle: x\n---\n" },
    },
  ],
  "/lessons/:slug/edit": [
    { who: "trainer", method: "POST", path: "/lessons/{lesson}/edit", form: { intent: "save-file", source: "x" } },
  ],
  "/lessons/:slug/export": [
    { who: "anonymous", method: "GET", path: "/lessons/{lesson}/export", query: { probe: "1" } },
  ],
  "/courses": [
    { who: "trainer", method: "GET", path: "/courses", query: { probe: "1" } },
    { who: "trainer", method: "POST", path: "/courses", form: { name: "Sweep course", description: "Two lessons" } },
  ],
  "/courses/:id": [
    {
      who: "trainer",
      method: "POST",
      path: "/courses/{course}",
      form: { intent: "details", name: "Parapet roofs: the foundation course", description: "Five lessons" },
    },
    { who: "trainer", method: "POST", path: "/courses/{course}", form: { intent: "add", lesson: "{lesson}" } },
    {
      who: "trainer",
      method: "POST",
      path: "/courses/{course}",
      form: { intent: "move", lesson: "reading-falls", direction: "down" },
    },
  ],
  "/certificates/:id": [
    { who: "trainer", method: "GET", path: "/certificates/{certificate}", query: { probe: "1" } },
    {
      who: "trainer",
      method: "POST",
      path: "/certificates/{certificate}",
      form: { intent: "revoke", reason: "Issued in error" },
    },
  ],
  "/certificates/:id.pdf": [
    { who: "trainer", method: "GET", path: "/certificates/{certificate}.pdf", query: { probe: "1" } },
  ],
  "/verify": [{ who: "anonymous", method: "GET", path: "/verify", query: { code: "7Q2K-9XPM-4RTA" } }],
  "/verify/:code": [{ who: "anonymous", method: "GET", path: "/verify/{code}", query: { probe: "1" } }],
  "/attempts": [{ who: "trainee", method: "GET", path: "/attempts", query: { probe: "1" } }],
  "/attempts/:id": [{ who: "trainee", method: "GET", path: "/attempts/{attempt}" }],
  "/attempts/:id/review": [
    { who: "trainer", method: "GET", path: "/attempts/{attempt}/review", query: { class: "{class}" } },
    {
      who: "trainer",
      method: "POST",
      path: "/attempts/{attempt}/review",
      form: { comment: "Good work", override: "on", score: "80", passed: "yes", reason: "Checked by hand" },
    },
  ],
  "/roofs": [
    {
      who: "designer",
      method: "POST",
      path: "/roofs?index",
      form: { intent: "rename", id: "{roof}", name: "Sweep rename", version: "999999" },
    },
    { who: "designer", method: "POST", path: "/roofs?index", form: { intent: "duplicate", id: "{roof}" } },
    {
      who: "designer",
      method: "POST",
      path: "/roofs?index",
      form: { intent: "import", file: '{"format":"fallwright-roof"}', idempotencyKey: "{fresh}" },
      multipart: true,
    },
  ],
  "/roofs/:id": [
    {
      who: "designer",
      method: "POST",
      path: "/roofs/{roof}",
      form: { intent: "restore-version", version: "1", expected: "999999" },
    },
    {
      who: "designer",
      method: "POST",
      path: "/roofs/{roof}",
      form: { intent: "underlay", settings: '{"opacity":0.5}' },
    },
    { who: "designer", method: "POST", path: "/roofs/{roof}", form: { intent: "share", shared: "true" } },
    { who: "designer", method: "POST", path: "/roofs/{roof}", form: { intent: "duplicate", name: "Sweep copy" } },
  ],
  "/classes": [
    {
      who: "trainer",
      method: "POST",
      path: "/classes?index",
      form: { name: "Sweep class", startsOn: "2027-03-01", endsOn: "2027-03-31", venue: "Hall B" },
    },
  ],
  "/classes/:id": [
    {
      who: "trainer",
      method: "POST",
      path: "/classes/{class}",
      form: { intent: "details", name: "Sweep class", startsOn: "2027-03-01", endsOn: "2027-03-31", venue: "Hall B" },
    },
    {
      who: "trainer",
      method: "POST",
      path: "/classes/{class}",
      form: { intent: "invite", addresses: "sweep-invitee@fallwright-test.example" },
    },
    { who: "trainer", method: "POST", path: "/classes/{class}", form: { intent: "remove", userId: "{traineeId}" } },
    {
      who: "trainer",
      method: "POST",
      path: "/classes/{class}",
      form: { intent: "withdraw", email: "nobody@fallwright-test.example" },
    },
    {
      who: "trainer",
      method: "POST",
      path: "/classes/{class}",
      form: { intent: "assignments", assign: "{lesson}", "due:{lesson}": "2027-04-01" },
    },
  ],
  "/classes/:id/gradebook": [
    { who: "trainer", method: "GET", path: "/classes/{class}/gradebook", query: { probe: "1" } },
  ],
  "/classes/:id/follow": [{ who: "trainee", method: "GET", path: "/classes/{class}/follow", query: { probe: "1" } }],
  "/gradebook": [{ who: "trainer", method: "GET", path: "/gradebook", query: { class: "{class}" } }],
  "/login": [
    { who: "trainee", method: "GET", path: "/login", query: { redirectTo: "/roofs", notice: "signed-out" } },
    {
      who: "anonymous",
      method: "POST",
      path: "/login",
      form: { email: "designer@tidemark.example", password: "not the password", redirectTo: "/roofs" },
    },
  ],
  "/signup": [
    {
      who: "anonymous",
      method: "POST",
      path: "/signup",
      form: {
        name: "Sweep Person",
        email: "sweep-signup@fallwright-test.example",
        password: "slate gutter heron 42",
        confirm: "slate gutter heron 42",
      },
    },
  ],
  "/forgot-password": [
    { who: "anonymous", method: "POST", path: "/forgot-password", form: { email: "designer@tidemark.example" } },
  ],
  "/reset-password/:token": [
    { who: "anonymous", method: "POST", path: "/reset-password/{resetToken}", form: { password: "x", confirm: "y" } },
  ],
  "/invite/:token": [
    {
      who: "anonymous",
      method: "POST",
      path: "/invite/{inviteToken}",
      form: { name: "Sweep Invitee", password: "x", confirm: "y" },
    },
  ],
  "/account": [
    { who: "designer", method: "GET", path: "/account", query: { notice: "password-reset" } },
    { who: "designer", method: "POST", path: "/account", form: { intent: "name", name: "Dana Designer" } },
    {
      who: "designer",
      method: "POST",
      path: "/account",
      form: { intent: "password", current: "wrong", password: "x", confirm: "y" },
    },
  ],
  "/admin": [
    { who: "admin", method: "GET", path: "/admin?index", query: { q: "tidemark", role: "trainee", status: "active" } },
    {
      who: "admin",
      method: "POST",
      path: "/admin?index",
      form: { intent: "invite", email: "sweep-admin-invite@fallwright-test.example", role: "designer" },
    },
    {
      who: "admin",
      method: "POST",
      path: "/admin?index",
      form: { intent: "role", userId: "{designerId}", role: "designer" },
    },
    { who: "admin", method: "POST", path: "/admin?index", form: { intent: "resend", userId: "{designerId}" } },
    { who: "admin", method: "POST", path: "/admin?index", form: { intent: "signup", open: "off" } },
  ],
  "/admin/audit": [{ who: "admin", method: "GET", path: "/admin/audit", query: { action: "sign_in", before: "100" } }],
  "/admin/outbox": [{ who: "admin", method: "GET", path: "/admin/outbox", query: { probe: "1" } }],
};

const nested = (levels: number): unknown => {
  let v: unknown = 0;
  for (let i = 0; i < levels; i++) v = [v];
  return v;
};

/** The hostile values. `array` repeats the field (forms, queries) or wraps the value (JSON). */
const HOSTILE: { name: string; text: string; json: unknown }[] = [
  { name: "NUL", text: "a\u0000b", json: "a\u0000b" },
  { name: "over-long", text: "x".repeat(100_000), json: "x".repeat(100_000) },
  {
    name: "control characters",
    text: "\u0001\u0008\u001b[31m\u007f\r\n\t\u2028\ufeff",
    json: "\u0001\u0008\u001b[31m\u007f\r\n\t\u2028\ufeff",
  },
  { name: "integer out of range", text: "10000000000", json: 10_000_000_000 },
  { name: "huge number", text: "1e400", json: 1e308 },
  { name: "negative", text: "-2147483649", json: -2_147_483_649 },
  { name: "not a UUID", text: "-".repeat(36), json: "not-a-uuid" },
  { name: "deep nesting", text: JSON.stringify(nested(2000)), json: nested(2000) },
  { name: "array for a scalar", text: "", json: ["a", "b"] },
  { name: "object for a scalar", text: "[object Object]", json: { a: 1 } },
];

const database = useTestDatabase();
let server: RunningServer;
const cookies: Partial<Record<Who, string>> = {};
const values: Record<string, string> = {};

beforeAll(async () => {
  server = await startServer(database.url());
  for (const who of ["admin", "trainer", "trainee", "designer"] as const)
    cookies[who] = await sessionCookie(`${who}@tidemark.example`);
  const k = database.db();
  values.roof = (await k("roofs").where({ name: "Library annex, Harrow Lane" }).first("id"))!.id;
  values.class = (await k("classes").where({ name: "Parapet roofs, spring cohort" }).first("id"))!.id;
  values.lesson = "outlets-and-overflows";
  values.course = (await k("courses").where({ name: "Parapet roofs: the foundation course" }).first("id"))!.id;
  // A saved as-built check for the check's page and PDF (a survey in the roof's coordinates).
  const check = new FormData();
  for (const [k, v] of Object.entries({
    intent: "upload",
    measuredBy: "Sweep",
    checkedBy: "Sweep",
    measuredOn: "2026-12-01",
  }))
    check.append(k, v);
  check.append("file", new Blob(["x,y,level\n1,1,0.1\n17,1,0.1\n9,8,0.12\n"]), "survey.csv");
  const saved = await fetch(`${server.url}/roofs/${values.roof}/checks`, {
    method: "POST",
    headers: { Origin: server.url, cookie: cookies.designer! },
    body: check,
    redirect: "manual",
  });
  values.check = /\/checks\/([0-9a-f-]{36})/.exec(saved.headers.get("location") ?? "")?.[1] ?? "no-check-made";
  values.traineeId = await userIdOf("trainee@tidemark.example");
  values.designerId = await userIdOf("designer@tidemark.example");
  const made = await fetch(`${server.url}/api/v1/attempts`, {
    method: "POST",
    headers: { "Content-Type": "application/json", Origin: server.url, cookie: cookies.trainee! },
    body: JSON.stringify({ lesson: values.lesson, answers: {}, spec: SPEC, idempotencyKey: "sweep-setup-attempt" }),
  });
  values.attempt = made.ok
    ? (await made.json()).attempt.id
    : (await k("attempts").where({ trainee_id: values.traineeId }).first("id"))!.id;
  const org = await k("organisations").first("id");
  values.resetToken = await issueToken({
    kind: "reset",
    email: "designer@tidemark.example",
    userId: values.designerId,
    ttlSeconds: 3600,
  });
  const invitee = uniqueAddress("sweep-invite");
  await createInvitation({
    email: invitee,
    role: "trainee",
    invitedBy: { id: await userIdOf("admin@tidemark.example"), role: "admin", organisationId: org!.id },
    origin: "http://localhost",
  });
  values.inviteToken = linkIn(await waitForMail(invitee), "/invite/")
    .pathname.split("/")
    .pop()!;
}, 120_000);
afterAll(async () => {
  await server?.stop();
});

/** Placeholders: seed ids and tokens from `values`; {fresh} is a new idempotency key each time, so no request replays another. */
let serial = 0;
const fill = (s: string) =>
  s.replace(/\{(\w+)\}/g, (_, name: string) =>
    name === "fresh" ? `sweep-${Date.now().toString(36)}-${serial++}` : (values[name] ?? `{${name}}`),
  );

/** One request: the probe with `field` (in `where`) set to a hostile value. */
type Where = "path" | "query" | "form" | "json";

/** Node refuses request heads over 16 kB itself (431); in a URL "over-long" stays under that to reach the app. */
const inUrl = (h: (typeof HOSTILE)[number]) => (h.name === "over-long" ? h.text.slice(0, 8000) : h.text);

function request(
  p: Probe,
  where: Where,
  field: string,
  h: (typeof HOSTILE)[number],
): { url: string; init: RequestInit } {
  const path = where === "path" ? p.path.replace(`{${field}}`, encodeURIComponent(inUrl(h))) : p.path;
  const url = new URL(fill(path), server.url);
  const query = Object.entries(p.query ?? {}).map(([k, v]) => [fill(k), fill(v)] as [string, string]);
  const form = Object.entries(p.form ?? {}).map(([k, v]) => [fill(k), fill(v)] as [string, string]);
  const put = (list: [string, string][]) => {
    const rest = list.filter(([k]) => k !== field);
    const text = where === "query" ? inUrl(h) : h.text;
    return h.name === "array for a scalar" ? [...rest, [field, "a"], [field, "b"]] : [...rest, [field, text]];
  };
  for (const [k, v] of where === "query" ? put(query) : query) url.searchParams.append(k, v);
  const headers: Record<string, string> = {
    Origin: server.url,
    ...(cookies[p.who as Exclude<Who, "anonymous">] ? { cookie: cookies[p.who as Exclude<Who, "anonymous">]! } : {}),
  };
  let body: BodyInit | undefined;
  if (p.json) {
    const json = JSON.parse(fill(JSON.stringify(p.json))) as Record<string, unknown>;
    if (where === "json") json[field] = h.json;
    headers["Content-Type"] = "application/json";
    body = JSON.stringify(json);
  } else if (p.form) {
    const entries = where === "form" ? put(form) : form;
    if (p.multipart) {
      const fd = new FormData();
      for (const [k, v] of entries) {
        if (k === "file")
          fd.append(
            k,
            new Blob([v], { type: "application/octet-stream" }),
            where === "form" && field === "file" ? `${h.text.slice(0, 200)}.png` : "plan.png",
          );
        else fd.append(k, v);
      }
      body = fd;
    } else {
      headers["Content-Type"] = "application/x-www-form-urlencoded";
      body = new URLSearchParams(entries).toString();
    }
  }
  return { url: url.toString(), init: { method: p.method, headers, body, redirect: "manual" } };
}

const routes = [...new Map(allRoutePaths().map((r) => [r.path, r])).values()];

describe("hostile-input sweep over every route", () => {
  it("covers every route in app/routes.ts, and none that are gone", () => {
    expect(
      routes.filter((r) => !SWEEP[r.path]).map((r) => r.path),
      "add these routes to SWEEP in tests/integration/hostile-input.test.ts",
    ).toEqual([]);
    expect(Object.keys(SWEEP).filter((p) => !routes.some((r) => r.path === p))).toEqual([]);
  });

  for (const r of routes.filter((route) => SWEEP[route.path])) {
    it(`${r.path}: no 5xx, and every 4xx says why`, async () => {
      const failures: string[] = [];
      for (const p of SWEEP[r.path]) {
        const fields: [Where, string][] = [
          ...[...p.path.matchAll(/\{(\w+)\}/g)].map((m) => ["path", m[1]] as ["path", string]),
          ...Object.keys(p.query ?? {}).map((k) => ["query", fill(k)] as ["query", string]),
          ...Object.keys(p.form ?? {}).map((k) => ["form", fill(k)] as ["form", string]),
          ...Object.keys(p.json ?? {}).map((k) => ["json", k] as ["json", string]),
        ];
        // A route without parameters still gets an unknown one.
        if (!fields.length) fields.push(["query", "probe"]);
        for (const [where, field] of fields) {
          for (const h of HOSTILE) {
            const { url, init } = request(p, where, field, h);
            const res = await fetch(url, init);
            const text = (res.headers.get("content-type") ?? "").includes("event-stream")
              ? "(stream)"
              : await res.text();
            if (res.body && text === "(stream)") await res.body.cancel();
            const what = `${p.method} ${p.path} ${where} ${field} = ${h.name} → ${res.status}`;
            if (res.status >= 500) failures.push(`${what}: ${text.slice(0, 300)}`);
            else if (res.status >= 400 && text.trim() === "") failures.push(`${what} with an empty body`);
            if (/\bat [^\s]+ \(?[^\s]*\.(js|ts):\d+/.test(text)) failures.push(`${what}: a stack trace in the answer`);
          }
        }
      }
      expect(failures).toEqual([]);
    }, 120_000);
  }

  it("leaves the server healthy", async () => {
    expect((await fetch(`${server.url}/healthz`)).status).toBe(200);
  });
});
