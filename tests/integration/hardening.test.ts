import http from "node:http";
import { crc32 } from "node:zlib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { linkIn, sessionCookie, uniqueAddress, waitForMail } from "../support/accounts";
import { makePng } from "../support/png";
import { startServer, type RunningServer } from "../support/server";
import { getRoofFor } from "~/lib/roofs.server";

/**
 * Issue 13: what an outside probe broke. Each case was reproduced against a production build
 * before the fix; every request here goes through the real host (Express, the input guard and
 * React Router), as an attacker's would.
 */
const database = useTestDatabase();
let server: RunningServer;
const cookies: Record<string, string> = {};
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

beforeAll(async () => {
  server = await startServer(database.url());
  for (const who of ["admin", "trainer", "trainee", "designer"])
    cookies[who] = await sessionCookie(`${who}@tidemark.example`);
}, 120_000);
afterAll(async () => {
  await server?.stop();
});

function send(
  method: string,
  path: string,
  o: {
    cookie?: string;
    json?: unknown;
    form?: Record<string, string> | URLSearchParams;
    headers?: Record<string, string>;
  } = {},
) {
  const headers: Record<string, string> = {
    Origin: server.url,
    ...(o.cookie ? { cookie: o.cookie } : {}),
    ...o.headers,
  };
  let body: string | undefined;
  if (o.json !== undefined) {
    headers["Content-Type"] = "application/json";
    body = typeof o.json === "string" ? o.json : JSON.stringify(o.json);
  } else if (o.form) {
    headers["Content-Type"] = "application/x-www-form-urlencoded";
    body = new URLSearchParams(o.form).toString();
  }
  return fetch(server.url + path, { method, headers, body, redirect: "manual" });
}

const nested = (levels: number): unknown => {
  let v: unknown = 0;
  for (let i = 0; i < levels; i++) v = [v];
  return v;
};

async function newRoof(): Promise<{ id: string; version: number }> {
  const res = await send("POST", "/api/v1/roofs", {
    cookie: cookies.designer,
    json: { name: "Probe target", spec: SPEC },
  });
  expect(res.status).toBe(201);
  return res.json();
}

describe("1. e-mail links come from APP_URL, never from the request", () => {
  it("a reset asked for with Host: attacker.example mails a link to APP_URL", async () => {
    const email = uniqueAddress("host-header");
    const org = await database.db()("organisations").first("id");
    await database
      .db()("users")
      .insert({ organisation_id: org!.id, email, name: "Ida Marsh", role: "trainee", password_hash: "x" });
    const status = await new Promise<number>((resolve, reject) => {
      const req = http.request(
        `${server.url}/forgot-password`,
        {
          method: "POST",
          headers: {
            Host: "attacker.example",
            Origin: "http://attacker.example",
            "Content-Type": "application/x-www-form-urlencoded",
          },
        },
        (res) => {
          res.resume();
          resolve(res.statusCode ?? 0);
        },
      );
      req.on("error", reject);
      req.end(new URLSearchParams({ email }).toString());
    });
    expect(status).toBeLessThan(500);
    const link = linkIn(await waitForMail(email, { subject: /reset/i }), "/reset-password/");
    expect(link.origin).toBe(server.url); // tests/support/server.ts sets APP_URL to the server's own address
    expect(link.host).not.toContain("attacker");
  });

  it("the production server refuses to start without APP_URL, and says so", async () => {
    await expect(startServer(database.url(), { APP_URL: "" })).rejects.toThrow(/APP_URL is not set/);
    await expect(startServer(database.url(), { APP_URL: "attacker.example" })).rejects.toThrow(
      /APP_URL .* is not a URL/,
    );
  }, 60_000);
});

describe("2. a redirect target is a same-origin path or nothing", () => {
  for (const target of [
    "/\t/evil.example",
    "/\n/evil.example",
    "/\\evil.example",
    "//evil.example",
    "/.//evil.example",
    "https://evil.example/",
    "/\r\n/evil.example",
  ]) {
    it(`GET and POST /login with redirectTo=${JSON.stringify(target)} stay on the site`, async () => {
      const get = await send("GET", `/login?${new URLSearchParams({ redirectTo: target })}`, {
        cookie: cookies.trainee,
      });
      expect(get.status).toBe(302);
      const there = new URL(get.headers.get("location")!, server.url);
      expect(there.origin).toBe(server.url);
      expect(there.pathname).not.toMatch(/^\/\//);

      const post = await send("POST", "/login", {
        form: { email: "designer@tidemark.example", password: "fallwright-demo", redirectTo: target },
      });
      expect(post.status).toBe(302);
      expect(new URL(post.headers.get("location")!, server.url).origin).toBe(server.url);
      expect(post.headers.get("location")).toBe("/");
    });
  }

  it("a genuine path with its query comes through", async () => {
    const res = await send("GET", `/login?${new URLSearchParams({ redirectTo: "/roofs?sort=name#top" })}`, {
      cookie: cookies.trainee,
    });
    expect(res.headers.get("location")).toBe("/roofs?sort=name#top");
  });
});

describe("5. NUL (U+0000) in any text input is a 400 naming the field", () => {
  it("in a sign-in form, anonymous", async () => {
    const res = await send("POST", "/login", { form: { email: "a\u0000b@tidemark.example", password: "x" } });
    expect(res.status).toBe(400);
    expect(await res.text()).toContain("The field &quot;email&quot; contains a NUL character (U+0000)");
  });

  it("in the forgot-password form", async () => {
    const res = await send("POST", "/forgot-password", { form: { email: "\u0000" } });
    expect(res.status).toBe(400);
    expect(await res.text()).toContain("The field &quot;email&quot; contains a NUL character (U+0000)");
  });

  it("in a JSON body (roof name), with the field as the issue's path", async () => {
    const res = await send("POST", "/api/v1/roofs", {
      cookie: cookies.designer,
      json: { name: "Roof\u0000", spec: SPEC },
    });
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error.issues).toEqual([{ path: "name", message: expect.stringContaining("NUL") }]);
  });

  it("in a JSON key, a nested string and a lone surrogate (which jsonb refuses too)", async () => {
    const key = await send("POST", "/api/v1/analyses", { json: { ...SPEC, "bad\u0000": 1 } });
    expect(key.status).toBe(400);
    const deep = await send("POST", "/api/v1/attempts", {
      cookie: cookies.trainee,
      json: { lesson: "x", answers: { q1: "a\u0000" }, idempotencyKey: "abcdefgh12" },
    });
    expect(deep.status).toBe(400);
    expect((await deep.json()).error.issues[0].path).toBe("answers.q1");
    const surrogate = await send("POST", "/api/v1/roofs", {
      cookie: cookies.designer,
      json: '{"name":"Roof \\ud800","spec":{}}',
    });
    expect(surrogate.status).toBe(400);
    expect((await surrogate.json()).error.issues[0].path).toBe("name");
  });

  it("in a query string (admin search)", async () => {
    const res = await send("GET", "/admin?q=%00", { cookie: cookies.admin });
    expect(res.status).toBe(400);
    expect(await res.text()).toContain("&quot;q&quot;");
  });

  it("in a multipart form field and in an uploaded file's name", async () => {
    const roof = await newRoof();
    const form = new FormData();
    form.append("file", new Blob([new Uint8Array(makePng(4, 4))], { type: "image/png" }), "plan\u0000.png");
    const res = await fetch(`${server.url}/roofs/${roof.id}/underlay`, {
      method: "POST",
      headers: { Origin: server.url, cookie: cookies.designer },
      body: form,
    });
    expect(res.status).toBe(400);
    expect((await res.json()).error.issues[0].path).toBe("file");
  });
});

describe("6. deep nesting is a 400 everywhere, by one rule", () => {
  it("in POST /api/v1/attempts spec (2,000 levels)", async () => {
    const res = await send("POST", "/api/v1/attempts", {
      cookie: cookies.trainee,
      json: { lesson: "outlets-and-overflows", answers: {}, spec: nested(2000), idempotencyKey: "deep-nest-01" },
    });
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error.message).toMatch(/deeper than 64/);
    expect(body.error.issues[0].path).toMatch(/^spec(\.0)+$/);
  });

  it("in the lesson form's spec field", async () => {
    const res = await send("POST", "/lessons/outlets-and-overflows", {
      cookie: cookies.trainee,
      form: { idempotencyKey: "deep-nest-02", spec: JSON.stringify(nested(2000)) },
    });
    expect(res.status).toBe(400);
    expect(await res.text()).toContain("deeper than 64");
  });

  it("while honest specs (four levels) still pass", async () => {
    const res = await send("POST", "/api/v1/analyses", { json: SPEC });
    expect(res.status).toBe(200);
  });
});

describe("7. integers outside PostgreSQL's range are refused, naming the field", () => {
  it("version: 10000000000 in PUT /api/v1/roofs/:id", async () => {
    const roof = await newRoof();
    const res = await send("PUT", `/api/v1/roofs/${roof.id}`, {
      cookie: cookies.designer,
      json: { name: "Renamed", version: 10_000_000_000 },
    });
    expect(res.status).toBe(400);
    expect((await res.json()).error.issues).toContainEqual({ path: "version", message: "must be at most 2147483647" });
  });

  it("restore-version and rename intents", async () => {
    const roof = await newRoof();
    const restore = await send("POST", `/roofs/${roof.id}?index`, {
      cookie: cookies.designer,
      form: { intent: "restore-version", version: "10000000000", expected: "1" },
    });
    expect(restore.status).toBe(400);
    expect(await restore.text()).toContain("version");
    const rename = await send("POST", "/roofs?index", {
      cookie: cookies.designer,
      form: { intent: "rename", id: roof.id, name: "New name", version: "10000000000" },
    });
    expect(rename.status).toBe(400);
    expect(await rename.text()).toContain("version");
  });
});

describe("8. ids that are not UUIDs never reach a query", () => {
  it("GET /api/v1/attempts?trainee=<36 hyphens> as trainer and admin", async () => {
    for (const who of ["trainer", "admin"]) {
      const res = await send("GET", `/api/v1/attempts?trainee=${"-".repeat(36)}`, { cookie: cookies[who] });
      expect(res.status).toBe(400);
      expect((await res.json()).error.issues[0]).toEqual({ path: "trainee", message: "must be an id (a UUID)" });
    }
  });

  it("admin intent=resend&userId=not-a-uuid", async () => {
    const res = await send("POST", "/admin?index", {
      cookie: cookies.admin,
      form: { intent: "resend", userId: "not-a-uuid" },
    });
    expect(res.status).toBe(400);
    expect(await res.text()).toContain("userId");
  });

  it("a malformed :id in a path is a 404 on pages and the API alike", async () => {
    expect((await send("GET", "/roofs/not-a-uuid", { cookie: cookies.designer })).status).toBe(404);
    expect((await send("GET", "/api/v1/attempts/%00", { cookie: cookies.designer })).status).toBe(404);
  });
});

/** A PNG whose header declares width × height but whose data is tiny (a decompression bomb's shape). */
function bombPng(width: number, height: number): Buffer {
  const png = makePng(1, 1);
  const ihdr = Buffer.from(png.subarray(12, 29)); // "IHDR" + 13 bytes
  ihdr.writeUInt32BE(width, 4);
  ihdr.writeUInt32BE(height, 8);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(ihdr) >>> 0);
  return Buffer.concat([
    png.subarray(0, 12),
    ihdr,
    crc,
    png.subarray(33, png.length - 12),
    Buffer.from([0, 0, 0, 0]),
    Buffer.from("IEND"),
    Buffer.from([0xae, 0x42, 0x60, 0x82]),
  ]);
}

describe("11. decompression bombs are refused as underlays", () => {
  it("a small PNG declaring 20000 × 20000 px is refused, with the memory budget in the message", async () => {
    const roof = await newRoof();
    const bomb = bombPng(20_000, 20_000);
    expect(bomb.length).toBeLessThan(200);
    const form = new FormData();
    form.append("file", new Blob([new Uint8Array(bomb)], { type: "image/png" }), "plan.png");
    const res = await fetch(`${server.url}/roofs/${roof.id}/underlay`, {
      method: "POST",
      headers: { Origin: server.url, cookie: cookies.designer },
      body: form,
    });
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.message).toContain("20000 × 20000");
    expect(body.error.message).toContain("256 MB budget");
    expect((await database.db()("roofs").where({ id: roof.id }).first("underlay_id"))!.underlay_id).toBeNull();
  });

  it("an image just inside the budget (8192 × 8192 declared) is kept", async () => {
    const roof = await newRoof();
    const form = new FormData();
    form.append("file", new Blob([new Uint8Array(bombPng(8192, 8192))], { type: "image/png" }), "plan.png");
    const res = await fetch(`${server.url}/roofs/${roof.id}/underlay`, {
      method: "POST",
      headers: { Origin: server.url, cookie: cookies.designer },
      body: form,
    });
    expect(res.status).toBe(201);
  });
});

describe("12. an idempotency key reused with a different body is a 422 naming the key", () => {
  it("POST /api/v1/roofs with the same Idempotency-Key: same body replays, another body is refused", async () => {
    const key = `probe-${Date.now()}`;
    const first = await send("POST", "/api/v1/roofs", {
      cookie: cookies.designer,
      json: { name: "Keyed", spec: SPEC },
      headers: { "Idempotency-Key": key },
    });
    expect(first.status).toBe(201);
    const again = await send("POST", "/api/v1/roofs", {
      cookie: cookies.designer,
      json: { name: "Keyed", spec: SPEC },
      headers: { "Idempotency-Key": key },
    });
    expect(again.status).toBe(201);
    expect(again.headers.get("idempotent-replayed")).toBe("true");
    expect((await again.json()).id).toBe((await first.json()).id);
    const other = await send("POST", "/api/v1/roofs", {
      cookie: cookies.designer,
      json: { name: "Something else", spec: SPEC },
      headers: { "Idempotency-Key": key },
    });
    expect(other.status).toBe(422);
    expect((await other.json()).error.message).toContain(`"${key}"`);
  });

  it("POST /api/v1/attempts with the same key and other answers", async () => {
    const key = `attempt-${Date.now()}`;
    const { lesson } = (await send("GET", "/api/v1/lessons/outlets-and-overflows").then((r) => r.json())) as {
      lesson: { task: { start: unknown } };
    };
    const spec = lesson.task.start;
    const first = await send("POST", "/api/v1/attempts", {
      cookie: cookies.trainee,
      json: { lesson: "outlets-and-overflows", answers: {}, spec, idempotencyKey: key },
    });
    expect(first.status).toBe(201);
    const same = await send("POST", "/api/v1/attempts", {
      cookie: cookies.trainee,
      json: { lesson: "outlets-and-overflows", answers: {}, spec, idempotencyKey: key, timeSpentSeconds: 5 },
    });
    expect(same.status).toBe(200);
    const other = await send("POST", "/api/v1/attempts", {
      cookie: cookies.trainee,
      json: { lesson: "outlets-and-overflows", answers: { anything: "else" }, spec, idempotencyKey: key },
    });
    expect(other.status).toBe(422);
    const body = await other.json();
    expect(body.error.message).toContain(`"${key}"`);
    expect(body.error.issues[0].path).toBe("idempotencyKey");
  });
});

describe("comments that now hold", () => {
  it("getRoofFor with lock holds the roof's row FOR UPDATE until the transaction ends (writes rely on it)", async () => {
    const roof = await newRoof();
    const k = database.db();
    const u = await k("users").where({ email: "designer@tidemark.example" }).first();
    const user = { id: u!.id, email: u!.email, name: u!.name, role: u!.role, organisationId: u!.organisation_id };
    await k.transaction(async (trx) => {
      expect(await getRoofFor(user, roof.id, trx, { lock: true })).not.toBeNull();
      await expect(k("roofs").where({ id: roof.id }).forUpdate().noWait().first("id")).rejects.toThrow(
        /could not obtain lock/,
      );
    });
    expect(await k("roofs").where({ id: roof.id }).forUpdate().noWait().first("id")).toEqual({ id: roof.id });
  });
});

describe("afterwards", () => {
  it("/healthz is 200", async () => {
    expect((await fetch(`${server.url}/healthz`)).status).toBe(200);
  });
});
