import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { BASE, call, cookieFor, getRequest, makePng, SMALL_SPEC, userId } from "../support/roofs";
import { startServer } from "../support/server";
import * as underlay from "~/routes/roofs.$id.underlay";
import { createRoof } from "~/lib/roofs.server";

// docs/security.md, Uploads: 413, magic bytes, server keys, stored type + nosniff, access.
const { db } = useTestDatabase();

async function roofOf(email: string, shared = false) {
  const u = await db()("users")
    .where({ id: await userId(email) })
    .first();
  const { id } = await createRoof(
    { id: u!.id, email: u!.email, name: u!.name, role: u!.role, organisationId: u!.organisation_id },
    { name: `Underlay test ${Math.random()}`, spec: SMALL_SPEC },
  );
  if (shared) await db()("roofs").where({ id }).update({ shared: true });
  return id;
}

function upload(id: string, bytes: Uint8Array, filename: string, cookie?: string, type = "image/png") {
  const form = new FormData();
  form.set("file", new File([bytes as Uint8Array<ArrayBuffer>], filename, { type }));
  return call(
    underlay.action,
    new Request(`${BASE}/roofs/${id}/underlay`, { method: "POST", body: form, headers: cookie ? { cookie } : {} }),
    { id },
  );
}

function fetchImage(id: string, cookie?: string) {
  return call(underlay.loader, getRequest(`/roofs/${id}/underlay`, cookie), { id });
}

describe("underlay upload", () => {
  // nosniff itself is set by the host on every response: tests/e2e/roofs.spec.ts checks it end to end.
  it("accepts a real PNG, stores it under a server key, and serves it back with the stored type", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const id = await roofOf("designer@tidemark.example");
    const png = makePng(200, 120, (x) => (x < 100 ? 0 : 255));
    const res = await upload(id, png, "../../etc/passwd.png", cookie);
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body.underlay).toMatchObject({ widthPx: 200, heightPx: 120, opacity: 0.5 });
    // Default placement spans the roof's 10 m width.
    expect(body.underlay.metresPerPixel).toBeCloseTo(10 / 200, 9);
    const row = await db()("roofs as r")
      .join("uploads as u", "u.id", "r.underlay_id")
      .where("r.id", id)
      .first("u.storage_key", "u.content_type", "u.size");
    expect(row.storage_key).toMatch(/^underlays\/[0-9a-f-]{36}\.png$/);
    expect(row.storage_key).not.toContain("passwd");
    expect(row).toMatchObject({ content_type: "image/png", size: png.length });

    const served = await fetchImage(id, cookie);
    expect(served.status).toBe(200);
    expect(served.headers.get("content-type")).toBe("image/png");
    expect(served.headers.get("content-disposition")).toBe('inline; filename="underlay.png"');
    expect(served.headers.get("cache-control")).toMatch(/^private/);
    expect(Buffer.from(await served.arrayBuffer()).equals(png)).toBe(true);
  });

  it("refuses an HTML page or an SVG renamed .png (415), and a file over 10 MB (413)", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const id = await roofOf("designer@tidemark.example");
    const html = new TextEncoder().encode("<!doctype html><html><body><script>alert(1)</script></body></html>");
    const htmlRes = await upload(id, html, "plan.png", cookie);
    expect(htmlRes.status).toBe(415);
    expect((await htmlRes.json()).error.message).toMatch(/PNG, JPEG or WebP/);
    const svg = new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>');
    expect((await upload(id, svg, "plan.png", cookie, "image/svg+xml")).status).toBe(415);
    // 11 MB that start like a PNG: the size is what must stop it.
    const big = new Uint8Array(11 * 1024 * 1024);
    big.set(makePng(4, 4).subarray(0, 64));
    const bigRes = await upload(id, big, "huge.png", cookie);
    expect(bigRes.status).toBe(413);
    expect((await db()("roofs").where({ id }).first())!.underlay_id).toBeNull();
    expect(await db()("uploads").whereIn("original_name", ["plan.png", "huge.png"])).toHaveLength(0);
    const wrongType = await call(
      underlay.action,
      new Request(`${BASE}/roofs/${id}/underlay`, {
        method: "POST",
        body: "{}",
        headers: { cookie, "Content-Type": "application/json" },
      }),
      { id },
    );
    expect(wrongType.status).toBe(415);
    const noFile = new FormData();
    noFile.set("note", "no file here");
    const empty = await call(
      underlay.action,
      new Request(`${BASE}/roofs/${id}/underlay`, { method: "POST", body: noFile, headers: { cookie } }),
      { id },
    );
    expect(empty.status).toBe(400);
  });

  it("serves the image only to those who may see the roof, and lets only the owner change it", async () => {
    const ownerCookie = await cookieFor("trainer@tidemark.example");
    const privateId = await roofOf("trainer@tidemark.example");
    const sharedId = await roofOf("trainer@tidemark.example", true);
    const png = makePng(50, 40);
    expect((await upload(privateId, png, "a.png", ownerCookie)).status).toBe(201);
    expect((await upload(sharedId, png, "b.png", ownerCookie)).status).toBe(201);

    const colleague = await cookieFor("trainee@tidemark.example");
    expect((await fetchImage(privateId)).status).toBe(404);
    expect((await fetchImage(privateId, colleague)).status).toBe(404);
    expect((await upload(privateId, png, "c.png", colleague)).status).toBe(404);
    const sharedImage = await fetchImage(sharedId, colleague);
    expect(sharedImage.status).toBe(200);
    expect(sharedImage.headers.get("content-type")).toBe("image/png");
    expect((await upload(sharedId, png, "d.png", colleague)).status).toBe(403);
    expect((await upload(sharedId, png, "d.png")).status).toBe(401);

    // Unsharing takes the image away from colleagues at once.
    await db()("roofs").where({ id: sharedId }).update({ shared: false });
    expect((await fetchImage(sharedId, colleague)).status).toBe(404);
  });

  it("replacing the image keeps the calibration when the size matches, and removing it clears both", async () => {
    const cookie = await cookieFor("designer@tidemark.example");
    const id = await roofOf("designer@tidemark.example");
    await upload(id, makePng(80, 60), "first.png", cookie);
    const calibrated = { opacity: 0.3, originX: -2, originY: 9, metresPerPixel: 0.125, widthPx: 80, heightPx: 60 };
    await db()("roofs")
      .where({ id })
      .update({ underlay: JSON.stringify(calibrated) });
    const firstKey = (
      await db()("roofs as r").join("uploads as u", "u.id", "r.underlay_id").where("r.id", id).first("u.storage_key")
    ).storage_key;
    const again = await (
      await upload(
        id,
        makePng(80, 60, () => 128),
        "second.png",
        cookie,
      )
    ).json();
    expect(again.keptCalibration).toBe(true);
    expect(again.underlay).toEqual(calibrated);
    expect(await db()("uploads").where({ storage_key: firstKey })).toHaveLength(0);
    const other = await (await upload(id, makePng(90, 60), "third.png", cookie)).json();
    expect(other.keptCalibration).toBe(false);
    const removed = await call(
      underlay.action,
      new Request(`${BASE}/roofs/${id}/underlay`, { method: "DELETE", headers: { cookie } }),
      { id },
    );
    expect(removed.status).toBe(200);
    expect((await fetchImage(id, cookie)).status).toBe(404);
  });
});

describe("underlay through the real host", () => {
  it("answers with nosniff exactly once, the stored type, and 404 to a colleague of an unshared roof", async () => {
    const ownerCookie = await cookieFor("designer@tidemark.example");
    const colleague = await cookieFor("trainee2@tidemark.example");
    const id = await roofOf("designer@tidemark.example");
    const server = await startServer(process.env.DATABASE_URL!);
    try {
      const form = new FormData();
      form.set("file", new File([makePng(64, 48) as Uint8Array<ArrayBuffer>], "plan.png", { type: "image/png" }));
      const up = await fetch(`${server.url}/roofs/${id}/underlay`, {
        method: "POST",
        body: form,
        headers: { cookie: ownerCookie, Origin: server.url },
      });
      expect(up.status).toBe(201);
      const mine = await fetch(`${server.url}/roofs/${id}/underlay`, { headers: { cookie: ownerCookie } });
      expect(mine.status).toBe(200);
      expect(mine.headers.get("x-content-type-options")).toBe("nosniff");
      expect(mine.headers.get("content-type")).toBe("image/png");
      expect(mine.headers.get("content-disposition")).toBe('inline; filename="underlay.png"');
      const theirs = await fetch(`${server.url}/roofs/${id}/underlay`, { headers: { cookie: colleague } });
      expect(theirs.status).toBe(404);
      const anonymous = await fetch(`${server.url}/roofs/${id}/underlay`);
      expect(anonymous.status).toBe(404);
    } finally {
      await server.stop();
    }
  }, 90_000);
});
