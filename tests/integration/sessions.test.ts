import { afterEach, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import {
  callRoute,
  cookiePair,
  DEMO_PASSWORD,
  formPost,
  get,
  sessionCookie,
  uniqueAddress,
  userIdOf,
} from "../support/accounts";
import * as login from "~/routes/login";
import * as logout from "~/routes/logout";
import * as account from "~/routes/account";
import * as adminUsers from "~/routes/admin._index";
import * as adminAudit from "~/routes/admin.audit";
import * as adminOutbox from "~/routes/admin.outbox";
import * as signup from "~/routes/signup";
import { getOptionalUser, requirePermission, requireRole } from "~/lib/auth.server";
import { sha256 } from "~/lib/tokens.server";

// docs/security.md, Sessions (OWASP ASVS 4.0.3 3.2.1, 3.3.1, 3.3.2, 3.4.1-3.4.3).
const database = useTestDatabase();
const k = () => database.db();

async function signIn(email: string, password = DEMO_PASSWORD, o: { url?: string; cookie?: string; ip?: string } = {}) {
  const request = new Request(o.url ?? "http://localhost/login", {
    method: "POST",
    headers: { "Content-Type": "application/x-www-form-urlencoded", ...(o.cookie ? { cookie: o.cookie } : {}) },
    body: new URLSearchParams({ email, password }),
  });
  return callRoute(login.action, request, { ip: o.ip ?? "192.0.2.80" });
}

const whoIs = (cookie: string) => getOptionalUser(get("/", cookie));
const sessionId = (cookie: string) => sha256(decodeURIComponent(cookie.split("=")[1]));

afterEach(() => {
  delete process.env.HTTPS;
});

describe("the session cookie", () => {
  it("is HttpOnly, SameSite=Lax, Path=/, carries 256 random bits, and the database keeps only its hash", async () => {
    const res = await signIn("designer@tidemark.example");
    expect(res.status).toBe(302);
    const header = res.headers.get("set-cookie")!;
    const attrs = header.split(";").map((p) => p.trim().toLowerCase());
    expect(attrs).toEqual(expect.arrayContaining(["httponly", "samesite=lax", "path=/"]));
    expect(attrs).not.toContain("secure"); // plain-http localhost must keep working
    const value = header.split(";")[0].split("=")[1];
    expect(value).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(await k()("sessions").where({ id: value }).first()).toBeUndefined();
    expect(
      await k()("sessions")
        .where({ id: sha256(value) })
        .first(),
    ).toBeTruthy();
  });

  it("is Secure over https and when HTTPS=1", async () => {
    const overTls = await signIn("designer@tidemark.example", DEMO_PASSWORD, {
      url: "https://fallwright.example/login",
    });
    expect(overTls.headers.get("set-cookie")).toMatch(/;\s*Secure/i);
    process.env.HTTPS = "1";
    const flagged = await signIn("designer@tidemark.example");
    expect(flagged.headers.get("set-cookie")).toMatch(/;\s*Secure/i);
  });

  it("gets a new id at sign-in; the session the browser brought along is ended", async () => {
    const before = cookiePair((await signIn("trainee@tidemark.example")).headers.get("set-cookie"));
    const after = cookiePair(
      (await signIn("trainee@tidemark.example", DEMO_PASSWORD, { cookie: before })).headers.get("set-cookie"),
    );
    expect(after).not.toBe(before);
    expect(await whoIs(before)).toBeNull();
    expect(
      await k()("sessions")
        .where({ id: sessionId(before) })
        .first(),
    ).toBeUndefined();
    expect(await whoIs(after)).toMatchObject({ email: "trainee@tidemark.example" });
  });

  it("ignores a forged or malformed cookie", async () => {
    expect(await whoIs("fw_session=" + "a".repeat(43))).toBeNull();
    expect(await whoIs("fw_session=%E0%A4%A")).toBeNull();
    expect(await whoIs("fw_session=../../etc")).toBeNull();
  });
});

describe("session lifetime", () => {
  it("ends after 2 hours idle, and the row is removed", async () => {
    const cookie = await sessionCookie("trainee@tidemark.example");
    await k()("sessions")
      .where({ id: sessionId(cookie) })
      .update({ last_seen_at: k().raw("now() - interval '2 hours 1 minute'") });
    expect(await whoIs(cookie)).toBeNull();
    expect(
      await k()("sessions")
        .where({ id: sessionId(cookie) })
        .first(),
    ).toBeUndefined();
  });

  it("slides: use within 2 hours keeps it alive and moves last_seen_at, at most once a minute", async () => {
    const cookie = await sessionCookie("trainee@tidemark.example");
    const id = sessionId(cookie);
    await k()("sessions")
      .where({ id })
      .update({ last_seen_at: k().raw("now() - interval '90 minutes'") });
    expect(await whoIs(cookie)).toMatchObject({ email: "trainee@tidemark.example" });
    const { age } = await k()("sessions")
      .where({ id })
      .first<{ age: number }>(k().raw("extract(epoch from now() - last_seen_at)::float8 as age"));
    expect(age).toBeLessThan(5);
    await k()("sessions")
      .where({ id })
      .update({ last_seen_at: k().raw("now() - interval '30 seconds'") });
    await whoIs(cookie);
    const { age: later } = await k()("sessions")
      .where({ id })
      .first<{ age: number }>(k().raw("extract(epoch from now() - last_seen_at)::float8 as age"));
    expect(later).toBeGreaterThanOrEqual(29); // not rewritten within the minute
  });

  it("ends at its absolute expiry (7 days after sign-in) however busy", async () => {
    const res = await signIn("trainee@tidemark.example");
    const cookie = cookiePair(res.headers.get("set-cookie"));
    expect(res.headers.get("set-cookie")).toMatch(/Max-Age=604800/);
    const row = await k()("sessions")
      .where({ id: sessionId(cookie) })
      .first<{ life: number }>(k().raw("extract(epoch from expires_at - created_at)::float8 as life"));
    expect(row!.life).toBeCloseTo(7 * 86400, -1);
    await k()("sessions")
      .where({ id: sessionId(cookie) })
      .update({ expires_at: k().raw("now() - interval '1 second'"), last_seen_at: k().fn.now() });
    expect(await whoIs(cookie)).toBeNull();
  });
});

describe("ending sessions", () => {
  it("sign-out is POST only and deletes the row", async () => {
    const cookie = await sessionCookie("designer@tidemark.example");
    const viaGet = await callRoute(logout.loader, get("/logout", cookie));
    expect(viaGet.status).toBe(302);
    expect(await whoIs(cookie)).toMatchObject({ email: "designer@tidemark.example" });
    const out = await callRoute(logout.action, formPost("/logout", {}, cookie));
    expect(out.status).toBe(302);
    expect(out.headers.get("set-cookie")).toMatch(/fw_session=;.*Max-Age=0/);
    expect(
      await k()("sessions")
        .where({ id: sessionId(cookie) })
        .first(),
    ).toBeUndefined();
    expect(await whoIs(cookie)).toBeNull();
  });

  it("sign out everywhere ends every session of the account, this one included, and no one else's", async () => {
    const a = await sessionCookie("trainer@tidemark.example");
    const b = await sessionCookie("trainer@tidemark.example");
    const someoneElse = await sessionCookie("trainer2@tidemark.example");
    const page = await callRoute(account.loader, get("/account", a));
    expect(page.data.sessions.filter((s: { current: boolean }) => s.current)).toHaveLength(1);
    expect(page.data.sessions.length).toBeGreaterThanOrEqual(2);
    const res = await callRoute(account.action, formPost("/account", { intent: "sign-out-everywhere" }, a));
    expect(res.status).toBe(302);
    expect(res.location).toBe("/login?notice=everywhere");
    expect(await whoIs(a)).toBeNull();
    expect(await whoIs(b)).toBeNull();
    expect(await whoIs(someoneElse)).toMatchObject({ email: "trainer2@tidemark.example" });
  });

  it("changing the password ends the other sessions and keeps this browser signed in with a new id", async () => {
    const here = await sessionCookie("trainee4@tidemark.example");
    const there = await sessionCookie("trainee4@tidemark.example");
    const wrong = await callRoute(
      account.action,
      formPost(
        "/account",
        {
          intent: "password",
          current: "not-my-password",
          password: "tern gravel lintel",
          confirm: "tern gravel lintel",
        },
        here,
      ),
    );
    expect(wrong.status).toBe(400);
    expect(wrong.data.fieldErrors.current).toMatch(/not your current password/);
    expect(await whoIs(there)).not.toBeNull();
    const ok = await callRoute(
      account.action,
      formPost(
        "/account",
        { intent: "password", current: DEMO_PASSWORD, password: "tern gravel lintel", confirm: "tern gravel lintel" },
        here,
      ),
    );
    expect(ok.status).toBe(200);
    const renewed = cookiePair(ok.headers.get("set-cookie"));
    expect(await whoIs(there)).toBeNull();
    expect(await whoIs(here)).toBeNull();
    expect(await whoIs(renewed)).toMatchObject({ email: "trainee4@tidemark.example" });
  });

  it("deactivation by an admin ends every session at once and blocks sign-in; reactivation allows it again", async () => {
    const admin = await sessionCookie("admin@tidemark.example");
    const victim = await sessionCookie("trainee3@tidemark.example");
    const id = await userIdOf("trainee3@tidemark.example");
    const res = await callRoute(adminUsers.action, formPost("/admin", { intent: "deactivate", userId: id }, admin));
    expect(res.data).toMatchObject({ ok: true });
    expect(await whoIs(victim)).toBeNull();
    expect(await k()("sessions").where({ user_id: id }).first()).toBeUndefined();
    const refused = await signIn("trainee3@tidemark.example", DEMO_PASSWORD, { ip: "192.0.2.81" });
    const unknown = await signIn("no-such-trainee@tidemark.example", DEMO_PASSWORD, { ip: "192.0.2.81" });
    expect(refused.status).toBe(400);
    expect({ ...refused.data, email: "" }).toEqual({ ...unknown.data, email: "" });
    await callRoute(adminUsers.action, formPost("/admin", { intent: "reactivate", userId: id }, admin));
    expect((await signIn("trainee3@tidemark.example", DEMO_PASSWORD, { ip: "192.0.2.81" })).status).toBe(302);
  });
});

describe("guards", () => {
  it("send anonymous visitors to sign-in with the way back, and answer 403 to a role without the permission", async () => {
    const anon = await callRoute(adminUsers.loader, get("/admin?role=trainer"));
    expect(anon.status).toBe(302);
    expect(anon.location).toBe("/login?redirectTo=%2Fadmin%3Frole%3Dtrainer");
    const trainee = await sessionCookie("trainee@tidemark.example");
    expect((await callRoute(adminUsers.loader, get("/admin", trainee))).status).toBe(403);
    expect(
      (await callRoute(adminUsers.action, formPost("/admin", { intent: "signup", open: "on" }, trainee))).status,
    ).toBe(403);
    await expect(requirePermission(get("/", trainee), "users:manage")).rejects.toMatchObject({ init: { status: 403 } });
    await expect(requireRole(get("/", trainee), "trainee")).resolves.toMatchObject({ role: "trainee" });
  });

  it("sends a signed-in visitor away from the sign-in page", async () => {
    const cookie = await sessionCookie("designer@tidemark.example");
    const res = await callRoute(login.loader, get("/login?redirectTo=/roofs", cookie));
    expect(res.status).toBe(302);
    expect(res.location).toBe("/roofs");
  });
});

describe("admin", () => {
  it("lists, searches and filters users, changes a role (audited), and will not demote the last admin", async () => {
    const admin = await sessionCookie("admin@tidemark.example");
    const all = await callRoute(adminUsers.loader, get("/admin", admin));
    expect(all.data.total).toBeGreaterThanOrEqual(8);
    const trainers = await callRoute(adminUsers.loader, get("/admin?role=trainer", admin));
    expect(trainers.data.users.every((u: { role: string }) => u.role === "trainer")).toBe(true);
    expect(trainers.data.users.length).toBe(2);
    const search = await callRoute(adminUsers.loader, get("/admin?q=Quinlan", admin));
    expect(search.data.users.map((u: { email: string }) => u.email)).toEqual(["trainee@tidemark.example"]);
    const odd = await callRoute(adminUsers.loader, get("/admin?q=%25_%5C&role=pilot&status=x", admin));
    expect(odd.status).toBe(200);
    expect(odd.data.users).toEqual([]);

    const designer = await userIdOf("designer@tidemark.example");
    const changed = await callRoute(
      adminUsers.action,
      formPost("/admin", { intent: "role", userId: designer, role: "trainer" }, admin),
    );
    expect(changed.data).toMatchObject({ ok: true });
    expect((await k()("users").where({ id: designer }).first("role"))!.role).toBe("trainer");
    const logged = await k()("audit_log").where({ action: "role_changed", subject_id: designer }).first("detail");
    expect(logged!.detail).toEqual({ from: "designer", to: "trainer" });

    const self = await callRoute(
      adminUsers.action,
      formPost("/admin", { intent: "role", userId: await userIdOf("admin@tidemark.example"), role: "trainee" }, admin),
    );
    expect(self.status).toBe(400);
    const bad = await callRoute(
      adminUsers.action,
      formPost("/admin", { intent: "role", userId: "not-a-uuid", role: "trainer" }, admin),
    );
    expect(bad.status).toBe(400);
    const nonsense = await callRoute(adminUsers.action, formPost("/admin", { intent: "explode" }, admin));
    expect(nonsense.status).toBe(400);
  });

  it("resends an invitation to a pending account with a fresh link", async () => {
    const admin = await sessionCookie("admin@tidemark.example");
    const email = uniqueAddress("resend");
    await callRoute(adminUsers.action, formPost("/admin", { intent: "invite", email, role: "trainer" }, admin));
    const pending = await callRoute(
      adminUsers.loader,
      get(`/admin?status=invited&q=${encodeURIComponent(email)}`, admin),
    );
    expect(pending.data.users).toMatchObject([{ email, status: "invited", role: "trainer" }]);
    const again = await callRoute(
      adminUsers.action,
      formPost("/admin", { intent: "resend", userId: pending.data.users[0].id }, admin),
    );
    expect(again.data).toMatchObject({ ok: true });
    expect(
      await k()("tokens").where({ email, kind: "invitation" }).whereNull("used_at").count<{ count: string }[]>(),
    ).toEqual([{ count: "2" }]);
    const dup = await callRoute(
      adminUsers.action,
      formPost("/admin", { intent: "invite", email: "designer@tidemark.example", role: "designer" }, admin),
    );
    expect(dup.data).toMatchObject({
      ok: false,
      message: "There is already an account for that address.",
      email: "designer@tidemark.example",
    });
  });

  it("shows the audit log of sign-ins, failures and role changes, filterable, to admins only", async () => {
    await signIn("trainer@tidemark.example", "definitely-wrong", { ip: "192.0.2.90" });
    const admin = await sessionCookie("admin@tidemark.example");
    const log = await callRoute(adminAudit.loader, get("/admin/audit", admin));
    const actions = log.data.rows.map((r: { action: string }) => r.action);
    expect(actions).toEqual(expect.arrayContaining(["sign_in", "sign_in_failed", "role_changed", "user_deactivated"]));
    const failed = await callRoute(adminAudit.loader, get("/admin/audit?action=sign_in_failed", admin));
    expect(failed.data.rows.every((r: { action: string }) => r.action === "sign_in_failed")).toBe(true);
    expect(failed.data.rows[0]).toMatchObject({ ip: "192.0.2.90", subjectEmail: "trainer@tidemark.example" });
    expect((await callRoute(adminAudit.loader, get("/admin/audit?action=nope&before=-4", admin))).status).toBe(200);
    expect(
      (await callRoute(adminAudit.loader, get("/admin/audit", await sessionCookie("trainer@tidemark.example")))).status,
    ).toBe(403);
  });

  it("lists the mail the SMTP fake kept in the Outbox, to admins only", async () => {
    const admin = await sessionCookie("admin@tidemark.example");
    const box = await callRoute(adminOutbox.loader, get("/admin/outbox", admin));
    expect(box.data.configured).toBe(true);
    const invitation = box.data.messages.find(
      (m: { subject: string; to: string[] }) => /invited/.test(m.subject) && m.to.some((t) => t.startsWith("resend-")),
    );
    expect(invitation).toBeTruthy();
    expect(invitation.text).toContain("/invite/");
    expect(invitation.html).toContain("<a href=");
    expect(
      (await callRoute(adminOutbox.loader, get("/admin/outbox", await sessionCookie("designer@tidemark.example"))))
        .status,
    ).toBe(403);
    const saved = process.env.MAIL_SPOOL_DIR;
    delete process.env.MAIL_SPOOL_DIR;
    try {
      expect((await callRoute(adminOutbox.loader, get("/admin/outbox", admin))).data).toMatchObject({
        configured: false,
        messages: [],
      });
    } finally {
      process.env.MAIL_SPOOL_DIR = saved;
    }
  });
});

describe("designer self sign-up", () => {
  it("is closed (404) until an admin opens it, then makes a designer account and signs in", async () => {
    expect((await callRoute(signup.loader, get("/signup"))).status).toBe(404);
    const email = uniqueAddress("self-signup");
    const closed = await callRoute(
      signup.action,
      formPost("/signup", { email, name: "Noor Ashby", password: "quarry lantern 7", confirm: "quarry lantern 7" }),
    );
    expect(closed.status).toBe(404);

    const admin = await sessionCookie("admin@tidemark.example");
    await callRoute(adminUsers.action, formPost("/admin", { intent: "signup", open: "on" }, admin));
    expect((await callRoute(signup.loader, get("/signup"))).status).toBe(200);
    const bad = await callRoute(
      signup.action,
      formPost("/signup", { email: "not-an-address", name: "", password: "short", confirm: "short" }),
    );
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.data.fieldErrors).sort()).toEqual(["email", "name", "password"]);
    expect(bad.data.values.email).toBe("not-an-address");
    const made = await callRoute(
      signup.action,
      formPost("/signup", { email, name: "Noor Ashby", password: "quarry lantern 7", confirm: "quarry lantern 7" }),
    );
    expect(made.status).toBe(302);
    expect(await whoIs(cookiePair(made.headers.get("set-cookie")))).toMatchObject({
      email,
      role: "designer",
      name: "Noor Ashby",
    });
    const twice = await callRoute(
      signup.action,
      formPost("/signup", {
        email: email.toUpperCase(),
        name: "Noor Ashby",
        password: "quarry lantern 7",
        confirm: "quarry lantern 7",
      }),
    );
    expect(twice.status).toBe(400);
    await callRoute(adminUsers.action, formPost("/admin", { intent: "signup", open: "off" }, admin));
    expect((await callRoute(signup.loader, get("/signup"))).status).toBe(404);
  });
});
