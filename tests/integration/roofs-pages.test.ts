import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { BASE, call, cookieFor, getRequest, SMALL_SPEC } from "../support/roofs";
import * as library from "~/routes/roofs._index";
import * as editor from "~/routes/roofs.$id";
import * as exporter from "~/routes/roofs.$id.export";
import * as newRoof from "~/routes/roofs.new";
import * as api from "~/routes/api.v1.roofs";
import * as one from "~/routes/api.v1.roofs.$id";
import { jsonRequest } from "../support/roofs";
import { ROOF_FILE_FORMAT } from "~/lib/roof-file";

// Pages and form actions of the roof library: the same boundaries as the API (docs/security.md, Permissions by role).
const { db } = useTestDatabase();

function form(path: string, fields: Record<string, string | Blob>, cookie?: string) {
  const body = new FormData();
  for (const [k, v] of Object.entries(fields)) body.set(k, v);
  return new Request(BASE + path, { method: "POST", body, headers: cookie ? { cookie } : {} });
}

async function roofFor(cookie: string, name = `Page test ${Math.random()}`) {
  const res = await call(api.action, jsonRequest("POST", "/api/v1/roofs", { name, spec: SMALL_SPEC }, cookie));
  return (await res.json()).id as string;
}

describe("/roofs/new (the sandbox's save)", () => {
  it("saves name and spec and goes to the roof; bad input answers 400/422 and keeps the name", async () => {
    const cookie = await cookieFor("trainee@tidemark.example");
    const ok = await call(
      newRoof.action,
      form("/roofs/new", { name: "From the sandbox", spec: JSON.stringify(SMALL_SPEC) }, cookie),
    );
    expect(ok.status).toBe(302);
    const id = /\/roofs\/([0-9a-f-]{36})\?saved=1$/.exec(ok.headers.get("location")!)![1];
    expect(await db()("roofs").where({ id }).first()).toMatchObject({ name: "From the sandbox", version: 1 });

    const twice = { name: "Double click", spec: JSON.stringify(SMALL_SPEC), idempotencyKey: "sandbox-save-0001" };
    const [one, two] = [
      await call(newRoof.action, form("/roofs/new", twice, cookie)),
      await call(newRoof.action, form("/roofs/new", twice, cookie)),
    ];
    expect(one.headers.get("location")).toBe(two.headers.get("location"));
    expect(await db()("roofs").where({ name: "Double click" })).toHaveLength(1);

    const notJson = await call(newRoof.action, form("/roofs/new", { name: "Kept name", spec: "{oops" }, cookie));
    expect(notJson.status).toBe(400);
    expect(await notJson.json()).toMatchObject({ name: "Kept name", error: { issues: [{ path: "spec" }] } });
    const bowtie = {
      ...SMALL_SPEC,
      outline: [
        [0, 0],
        [10, 10],
        [10, 0],
        [0, 10],
      ],
      outlets: [],
    };
    const unbuildable = await call(
      newRoof.action,
      form("/roofs/new", { name: "Bow tie", spec: JSON.stringify(bowtie) }, cookie),
    );
    expect(unbuildable.status).toBe(422);
    const signedOut = await call(newRoof.action, form("/roofs/new", { name: "x", spec: JSON.stringify(SMALL_SPEC) }));
    expect(signedOut.status).toBe(302);
    expect(signedOut.headers.get("location")).toMatch(/^\/login\?redirectTo=/);
  });
});

describe("/roofs/:id and its actions", () => {
  it("shows my roof, 404s another user's unshared roof on the loader, every action and the export", async () => {
    const owner = await cookieFor("designer@tidemark.example");
    const other = await cookieFor("trainee2@tidemark.example");
    const id = await roofFor(owner);
    const mine = await call(editor.loader, getRequest(`/roofs/${id}`, owner), { id });
    expect(mine.status).toBe(200);
    expect((await mine.json()).roof).toMatchObject({ id, canEdit: true, version: 1 });

    expect((await call(editor.loader, getRequest(`/roofs/${id}`, other), { id })).status).toBe(404);
    const attempts: Record<string, string>[] = [
      { intent: "share", shared: "true" },
      { intent: "restore-version", version: "1", expected: "1" },
      { intent: "duplicate" },
    ];
    for (const fields of attempts) {
      const res = await call(editor.action, form(`/roofs/${id}`, fields, other), { id });
      expect(res.status, fields.intent).toBe(404);
    }
    const underlay = { opacity: 0.5, originX: 0, originY: 0, metresPerPixel: 0.01, widthPx: 10, heightPx: 10 };
    expect(
      (
        await call(
          editor.action,
          form(`/roofs/${id}`, { intent: "underlay", settings: JSON.stringify(underlay) }, other),
          { id },
        )
      ).status,
    ).toBe(404);
    expect((await call(exporter.loader, getRequest(`/roofs/${id}/export`, other), { id })).status).toBe(404);
    for (const intent of ["duplicate", "delete", "restore"]) {
      expect((await call(library.action, form("/roofs", { intent, id }, other))).status, intent).toBe(404);
    }
    expect(
      (await call(library.action, form("/roofs", { intent: "rename", id, name: "mine now", version: "1" }, other)))
        .status,
    ).toBe(404);
    expect(await db()("roofs").where({ id }).first()).toMatchObject({ shared: false, deleted_at: null, version: 1 });
    expect(
      await db()("roofs").where({
        owner_id: (await db()("users").where({ email: "trainee2@tidemark.example" }).first())!.id,
        name: "mine now",
      }),
    ).toHaveLength(0);
  });

  it("a shared roof opens read-only for a colleague, who may copy it but not share, restore or move its underlay", async () => {
    const owner = await cookieFor("trainer2@tidemark.example");
    const colleague = await cookieFor("trainee4@tidemark.example");
    const id = await roofFor(owner, "Shared gym roof");
    expect(
      (await call(editor.action, form(`/roofs/${id}`, { intent: "share", shared: "true" }, owner), { id })).status,
    ).toBe(200);
    const view = await call(editor.loader, getRequest(`/roofs/${id}`, colleague), { id });
    expect(view.status).toBe(200);
    const body = await view.json();
    expect(body.roof).toMatchObject({ canEdit: false, shared: true, name: "Shared gym roof" });
    expect(body.versions).toEqual([]);
    expect(
      (await call(editor.action, form(`/roofs/${id}`, { intent: "share", shared: "false" }, colleague), { id })).status,
    ).toBe(403);
    expect(
      (
        await call(
          editor.action,
          form(`/roofs/${id}`, { intent: "restore-version", version: "1", expected: "1" }, colleague),
          { id },
        )
      ).status,
    ).toBe(403);
    const placement = JSON.stringify({
      opacity: 0.5,
      originX: 0,
      originY: 0,
      metresPerPixel: 0.01,
      widthPx: 10,
      heightPx: 10,
    });
    expect(
      (await call(editor.action, form(`/roofs/${id}`, { intent: "underlay", settings: placement }, colleague), { id }))
        .status,
    ).toBe(403);
    expect((await db()("roofs").where({ id }).first())!.underlay).toEqual({});
    const copy = await call(
      editor.action,
      form(`/roofs/${id}`, { intent: "duplicate", name: "My gym copy" }, colleague),
      { id },
    );
    expect(copy.status).toBe(302);
    const copyId = /\/roofs\/([0-9a-f-]{36})/.exec(copy.headers.get("location")!)![1];
    expect(await db()("roofs").where({ id: copyId }).first()).toMatchObject({ name: "My gym copy", shared: false });
    expect((await call(exporter.loader, getRequest(`/roofs/${id}/export`, colleague), { id })).status).toBe(200);
  });

  it("restoring an old version makes it the newest and keeps the history; a stale restore is a 409", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const id = await roofFor(cookie, "History roof");
    const put = await call(
      one.action,
      jsonRequest("PUT", `/api/v1/roofs/${id}`, { version: 1, spec: { ...SMALL_SPEC, baseFall: "1:40" } }, cookie),
      { id },
    );
    expect(put.status).toBe(200);
    const restored = await call(
      editor.action,
      form(`/roofs/${id}`, { intent: "restore-version", version: "1", expected: "2" }, cookie),
      { id },
    );
    expect(restored.status).toBe(200);
    expect((await restored.json()).restored).toMatchObject({ version: 3, from: 1, spec: { baseFall: "1:60" } });
    expect(await db()("roof_versions").where({ roof_id: id }).orderBy("version").pluck("version")).toEqual([1, 2, 3]);
    const stale = await call(
      editor.action,
      form(`/roofs/${id}`, { intent: "restore-version", version: "2", expected: "2" }, cookie),
      { id },
    );
    expect(stale.status).toBe(409);
    expect((await db()("roofs").where({ id }).first())!.version).toBe(3);
  });
});

describe("/roofs library actions", () => {
  it("renames with the version, duplicates, deletes and undoes", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const id = await roofFor(cookie, "Before rename");
    const renamed = await call(
      library.action,
      form("/roofs", { intent: "rename", id, name: "After rename", version: "1" }, cookie),
    );
    expect(renamed.status).toBe(200);
    const stale = await call(
      library.action,
      form("/roofs", { intent: "rename", id, name: "Stale", version: "1" }, cookie),
    );
    expect(stale.status).toBe(409);
    const empty = await call(
      library.action,
      form("/roofs", { intent: "rename", id, name: "   ", version: "2" }, cookie),
    );
    expect(empty.status).toBe(400);
    expect(await empty.json()).toMatchObject({ name: "   ", error: expect.stringMatching(/empty/) });
    expect((await db()("roofs").where({ id }).first())!.name).toBe("After rename");

    const dup = await call(library.action, form("/roofs", { intent: "duplicate", id }, cookie));
    const dupId = (await dup.json()).id;
    expect((await db()("roofs").where({ id: dupId }).first())!.name).toBe("After rename (copy)");

    expect((await call(library.action, form("/roofs", { intent: "delete", id }, cookie))).status).toBe(200);
    const listed = async () =>
      ((await (await call(library.loader, getRequest("/roofs", cookie))).json()).mine as { id: string }[]).map(
        (r) => r.id,
      );
    expect(await listed()).not.toContain(id);
    expect((await call(library.action, form("/roofs", { intent: "restore", id }, cookie))).status).toBe(200);
    expect(await listed()).toContain(id);
  });

  it("imports a roof file, and explains a file of an unknown format version or a broken roof", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const file = (content: unknown, name = "roof.fallwright.json") =>
      new File([typeof content === "string" ? content : JSON.stringify(content)], name, { type: "application/json" });
    const good = {
      format: ROOF_FILE_FORMAT,
      version: 1,
      name: "Imported annex",
      spec: SMALL_SPEC,
      underlay: { opacity: 0.4, originX: 0, originY: 6, metresPerPixel: 0.02, widthPx: 500, heightPx: 300 },
    };
    const ok = await call(library.action, form("/roofs", { intent: "import", file: file(good) }, cookie));
    expect(ok.status).toBe(302);
    const id = /\/roofs\/([0-9a-f-]{36})\?imported=1$/.exec(ok.headers.get("location")!)![1];
    const row = await db()("roofs").where({ id }).first();
    expect(row).toMatchObject({ name: "Imported annex", underlay: good.underlay, spec: { baseFall: "1:60" } });

    const future = await call(
      library.action,
      form("/roofs", { intent: "import", file: file({ ...good, version: 2 }) }, cookie),
    );
    expect(future.status).toBe(422);
    expect((await future.json()).error).toMatch(/format version 2; this Fallwright reads version 1 only/);
    const foreign = await call(
      library.action,
      form("/roofs", { intent: "import", file: file({ outline: [] }) }, cookie),
    );
    expect((await foreign.json()).error).toMatch(/not a Fallwright roof file/);
    const broken = await call(
      library.action,
      form(
        "/roofs",
        {
          intent: "import",
          file: file({
            ...good,
            spec: {
              ...SMALL_SPEC,
              outline: [
                [0, 0],
                [1, 1],
              ],
            },
          }),
        },
        cookie,
      ),
    );
    expect(broken.status).toBe(422);
    expect((await broken.json()).error).toMatch(/roof.fallwright.json: The roof spec is malformed/);
    const notJson = await call(library.action, form("/roofs", { intent: "import", file: file("<html>") }, cookie));
    expect((await notJson.json()).error).toMatch(/not JSON/);
    expect(await db()("roofs").where({ name: "Imported annex" })).toHaveLength(1);
  });

  it("exports a roof file that imports back to the same roof", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const id = await roofFor(cookie, "Round trip / 7");
    const res = await call(exporter.loader, getRequest(`/roofs/${id}/export`, cookie), { id });
    expect(res.headers.get("content-disposition")).toBe('attachment; filename="round-trip-7.fallwright.json"');
    const text = await res.text();
    expect(JSON.parse(text)).toMatchObject({
      format: "fallwright-roof",
      version: 1,
      name: "Round trip / 7",
      spec: SMALL_SPEC,
    });
    const back = await call(
      library.action,
      form("/roofs", { intent: "import", file: new File([text], "round-trip-7.fallwright.json") }, cookie),
    );
    const backId = /\/roofs\/([0-9a-f-]{36})/.exec(back.headers.get("location")!)![1];
    const [a, b] = await Promise.all([
      db()("roofs").where({ id }).first(),
      db()("roofs").where({ id: backId }).first(),
    ]);
    expect(b!.spec).toEqual(a!.spec);
    expect(b!.name).toBe(a!.name);
  });
});
