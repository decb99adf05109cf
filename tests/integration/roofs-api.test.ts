import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { call, cookieFor, getRequest, jsonRequest, SMALL_SPEC, userId } from "../support/roofs";
import * as list from "~/routes/api.v1.roofs";
import * as one from "~/routes/api.v1.roofs.$id";
import { createRoof, restoreRoof, updateRoof } from "~/lib/roofs.server";
import type { SessionUser } from "~/lib/auth.server";

// docs/quality.md, Reliability (versions and 409, transactions); docs/security.md (permissions, body caps).
const { db } = useTestDatabase();

async function post(body: unknown, cookie?: string, headers?: Record<string, string>) {
  return call(list.action, jsonRequest("POST", "/api/v1/roofs", body, cookie, headers));
}
async function put(id: string, body: unknown, cookie?: string) {
  return call(one.action, jsonRequest("PUT", `/api/v1/roofs/${id}`, body, cookie), { id });
}
async function get(id: string, cookie?: string) {
  return call(one.loader, getRequest(`/api/v1/roofs/${id}`, cookie), { id });
}
async function del(id: string, cookie?: string) {
  return call(
    one.action,
    new Request(`http://localhost/api/v1/roofs/${id}`, { method: "DELETE", headers: cookie ? { cookie } : {} }),
    { id },
  );
}
async function sessionUser(email: string): Promise<SessionUser> {
  const u = await db()("users")
    .where({ id: await userId(email) })
    .first();
  return { id: u!.id, email: u!.email, name: u!.name, role: u!.role, organisationId: u!.organisation_id };
}

describe("roofs JSON API: statuses", () => {
  it("answers 401 with the JSON error shape when signed out", async () => {
    for (const res of [
      await call(list.loader, getRequest("/api/v1/roofs")),
      await post({ name: "x", spec: SMALL_SPEC }),
      await get("00000000-0000-4000-8000-000000000000"),
      await put("00000000-0000-4000-8000-000000000000", { version: 1, name: "x" }),
    ]) {
      expect(res.status).toBe(401);
      expect((await res.json()).error.message).toMatch(/sign in/i);
    }
  });

  it("creates with 201 {id, version}, lists it, reads it back", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const res = await post({ name: "  Workshop roof ", spec: SMALL_SPEC }, cookie);
    expect(res.status).toBe(201);
    const { id, version } = await res.json();
    expect(version).toBe(1);
    expect(res.headers.get("location")).toBe(`/api/v1/roofs/${id}`);
    const mine = await (await call(list.loader, getRequest("/api/v1/roofs", cookie))).json();
    expect(mine.roofs.map((r: { id: string }) => r.id)).toContain(id);
    const back = await (await get(id, cookie)).json();
    expect(back).toMatchObject({
      id,
      name: "Workshop roof",
      version: 1,
      canEdit: true,
      spec: { outline: SMALL_SPEC.outline, baseFall: "1:60" },
    });
    const versions = await db()("roof_versions").where({ roof_id: id });
    expect(versions).toHaveLength(1);
  });

  it("refuses bad bodies: 400 malformed, 422 unbuildable, 415 wrong type, 413 too large", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const notJson = await post("{name:", cookie);
    expect(notJson.status).toBe(400);
    const noOutline = await post({ name: "x", spec: { baseFall: "1:60" } }, cookie);
    expect(noOutline.status).toBe(400);
    const body400 = await noOutline.json();
    expect(body400.error.issues.some((i: { path: string }) => i.path === "spec.outline")).toBe(true);
    const noName = await post({ spec: SMALL_SPEC }, cookie);
    expect(noName.status).toBe(400);
    expect((await noName.json()).error.issues[0].path).toBe("name");
    const bowtie = await post(
      {
        name: "x",
        spec: {
          ...SMALL_SPEC,
          outline: [
            [0, 0],
            [10, 10],
            [10, 0],
            [0, 10],
          ],
          outlets: [],
        },
      },
      cookie,
    );
    expect(bowtie.status).toBe(422);
    const b422 = await bowtie.json();
    expect(b422.error.message).toMatch(/cannot be built/);
    expect(b422.error.issues.length).toBeGreaterThan(0);
    const textPlain = await post({ name: "x", spec: SMALL_SPEC }, cookie, { "Content-Type": "text/plain" });
    expect(textPlain.status).toBe(415);
    const huge = await post(
      { name: "x", spec: { ...SMALL_SPEC, probes: Array.from({ length: 30_000 }, (_, i) => [i, i]) } },
      cookie,
    );
    expect(huge.status).toBe(413);
    const count = await db()("roofs").where({ name: "x" }).count<{ count: string }[]>("* as count");
    expect(Number(count[0].count)).toBe(0);
  });

  it("updates with the version number: 200 then 409 for the stale version, carrying the winner", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const { id } = await (await post({ name: "Versioned", spec: SMALL_SPEC }, cookie)).json();
    const ok = await put(id, { version: 1, spec: { ...SMALL_SPEC, baseFall: "1:40" } }, cookie);
    expect(ok.status).toBe(200);
    expect(await ok.json()).toEqual({ id, version: 2 });
    const stale = await put(id, { version: 1, name: "Late rename" }, cookie);
    expect(stale.status).toBe(409);
    const conflict = await stale.json();
    expect(conflict.current).toMatchObject({ version: 2, name: "Versioned", spec: { baseFall: "1:40" } });
    expect(conflict.error.message).toMatch(/version 2/);
    const nothing = await put(id, { version: 2 }, cookie);
    expect(nothing.status).toBe(400);
    const badSpec = await put(id, { version: 2, spec: { outline: [[0, 0]] } }, cookie);
    expect(badSpec.status).toBe(400);
    expect((await (await get(id, cookie)).json()).version).toBe(2);
    expect(await db()("roof_versions").where({ roof_id: id }).orderBy("version").pluck("version")).toEqual([1, 2]);
  });

  it("deletes softly (then 404) and the owner can undo", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const { id } = await (await post({ name: "Short-lived", spec: SMALL_SPEC }, cookie)).json();
    expect((await del(id, cookie)).status).toBe(200);
    expect((await get(id, cookie)).status).toBe(404);
    expect((await put(id, { version: 1, name: "ghost" }, cookie)).status).toBe(404);
    const someoneElse = await sessionUser("trainer@tidemark.example");
    expect(await restoreRoof(someoneElse, id)).toBe("not-found");
    expect(await restoreRoof(await sessionUser("designer@tidemark.example"), id)).toBe("ok");
    expect((await get(id, cookie)).status).toBe(200);
  });

  it("makes one roof for repeats of a save with the same Idempotency-Key", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const key = { "Idempotency-Key": "copy-5b7e2c1d-0000-4000-8000-000000000001" };
    const [first, second] = await Promise.all([
      post({ name: "Clicked twice", spec: SMALL_SPEC }, cookie, key),
      post({ name: "Clicked twice", spec: SMALL_SPEC }, cookie, key),
    ]);
    expect([first.status, second.status]).toEqual([201, 201]);
    const [a, b] = [await first.json(), await second.json()];
    expect(a.id).toBe(b.id);
    expect([first.headers.get("idempotent-replayed"), second.headers.get("idempotent-replayed")].sort()).toEqual(
      ["true", null].sort(),
    );
    expect(await db()("roofs").where({ name: "Clicked twice" })).toHaveLength(1);
    expect(await db()("roof_versions").where({ roof_id: a.id })).toHaveLength(1);
    // The same key from another user is another user's business.
    const other = await post(
      { name: "Clicked twice", spec: SMALL_SPEC },
      await cookieFor("trainer@tidemark.example"),
      key,
    );
    expect((await other.json()).id).not.toBe(a.id);
    const bad = await post({ name: "x", spec: SMALL_SPEC }, cookie, { "Idempotency-Key": "no spaces allowed" });
    expect(bad.status).toBe(400);
  });

  it("answers 405 for methods it does not serve", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const res = await call(list.action, jsonRequest("PATCH", "/api/v1/roofs", {}, cookie));
    expect(res.status).toBe(405);
  });
});

describe("roofs JSON API: who may see and change what", () => {
  it("hides another user's unshared roof (404 on GET, PUT, DELETE) and keeps it intact", async () => {
    const owner = await cookieFor("trainee@tidemark.example");
    const { id } = await (await post({ name: "Private deck", spec: SMALL_SPEC }, owner)).json();
    const other = await cookieFor("trainee2@tidemark.example");
    expect((await get(id, other)).status).toBe(404);
    expect((await put(id, { version: 1, name: "hijack" }, other)).status).toBe(404);
    expect((await del(id, other)).status).toBe(404);
    expect((await get("not-a-uuid", other)).status).toBe(404);
    const row = await db()("roofs").where({ id }).first();
    expect(row).toMatchObject({ name: "Private deck", version: 1, deleted_at: null });
  });

  it("lets a colleague read a shared roof but not change it; another organisation sees nothing", async () => {
    const owner = await cookieFor("trainer@tidemark.example");
    const { id } = await (await post({ name: "Shared clinic", spec: SMALL_SPEC }, owner)).json();
    await db()("roofs").where({ id }).update({ shared: true });
    const colleague = await cookieFor("trainee3@tidemark.example");
    const read = await get(id, colleague);
    expect(read.status).toBe(200);
    expect((await read.json()).canEdit).toBe(false);
    expect((await put(id, { version: 1, name: "edited by colleague" }, colleague)).status).toBe(403);
    expect((await del(id, colleague)).status).toBe(403);

    const [org] = await db()("organisations").insert({ name: "Elsewhere Roofing Academy (test)" }).returning("id");
    await db()("users").insert({
      organisation_id: org.id,
      email: "outsider@elsewhere.example",
      name: "Out Sider",
      role: "designer",
    });
    const outsider = await cookieFor("outsider@elsewhere.example");
    expect((await get(id, outsider)).status).toBe(404);
    expect((await put(id, { version: 1, name: "x" }, outsider)).status).toBe(404);
    expect((await db()("roofs").where({ id }).first())!.name).toBe("Shared clinic");
  });
});

describe("two tabs, one roof", () => {
  it("two saves from the same version: one 200, one 409 with the winner; keeping mine as a copy loses nothing", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const { id } = await (await post({ name: "Two tabs", spec: SMALL_SPEC }, cookie)).json();
    const tabA = { ...SMALL_SPEC, baseFall: "1:40" };
    const tabB = { ...SMALL_SPEC, baseFall: "1:80", joists: { spacing: 0.6 } };
    const [ra, rb] = await Promise.all([
      put(id, { version: 1, spec: tabA }, cookie),
      put(id, { version: 1, spec: tabB }, cookie),
    ]);
    const statuses = [ra.status, rb.status].sort();
    expect(statuses).toEqual([200, 409]);
    const [winner, loser, loserSpec, winnerSpec] = ra.status === 200 ? [ra, rb, tabB, tabA] : [rb, ra, tabA, tabB];
    expect((await winner.json()).version).toBe(2);
    const conflict = await loser.json();
    expect(conflict.current.version).toBe(2);
    expect(conflict.current.spec.baseFall).toBe(winnerSpec.baseFall);
    // "Keep mine as a copy": the losing tab saves its spec as a new roof.
    const copy = await post({ name: "Two tabs (my copy)", spec: loserSpec }, cookie);
    expect(copy.status).toBe(201);
    const copied = await (await get((await copy.json()).id, cookie)).json();
    expect(copied.spec.baseFall).toBe(loserSpec.baseFall);
    const original = await (await get(id, cookie)).json();
    expect(original.spec.baseFall).toBe(winnerSpec.baseFall);
    expect(await db()("roof_versions").where({ roof_id: id }).count<{ count: string }[]>("* as count")).toEqual([
      { count: "2" },
    ]);
  });
});

describe("transactions", () => {
  it("a failure half-way through a create or an update leaves no half-written rows", async () => {
    // A trigger makes the second insert of each write (the roof_versions row) fail.
    await db().raw(`create function fail_halfway() returns trigger language plpgsql as $$
      begin if new.name like 'FAIL-HALFWAY%' then raise exception 'forced failure half-way'; end if; return new; end $$`);
    await db().raw(
      `create trigger fail_halfway before insert on roof_versions for each row execute function fail_halfway()`,
    );
    try {
      const user = await sessionUser("designer@tidemark.example");
      await expect(createRoof(user, { name: "FAIL-HALFWAY create", spec: SMALL_SPEC })).rejects.toThrow(
        /forced failure/,
      );
      expect(await db()("roofs").where({ name: "FAIL-HALFWAY create" })).toHaveLength(0);

      const { id } = await createRoof(user, { name: "Steady", spec: SMALL_SPEC });
      await expect(updateRoof(user, id, { version: 1, name: "FAIL-HALFWAY rename" })).rejects.toThrow(/forced failure/);
      const row = await db()("roofs").where({ id }).first();
      expect(row).toMatchObject({ name: "Steady", version: 1 });
      expect(await db()("roof_versions").where({ roof_id: id }).pluck("version")).toEqual([1]);
    } finally {
      await db().raw(`drop trigger fail_halfway on roof_versions; drop function fail_halfway()`);
    }
  });
});
