/**
 * A fresh database per test file, copied from the migrated and seeded template that
 * `npm test` prepares (fast on PostgreSQL, and files cannot see each other's rows).
 */
import { randomBytes } from "node:crypto";
import { afterAll, beforeAll } from "vitest";
import pg from "pg";
import { closeDb, db } from "~/lib/db.server";

function adminUrl() {
  const template = process.env.TEST_TEMPLATE_URL;
  if (!template) throw new Error("TEST_TEMPLATE_URL is not set: run the suite with `npm test`");
  const u = new URL(template);
  u.pathname = "/postgres";
  return u;
}

export async function createDatabaseFromTemplate(): Promise<string> {
  const admin = adminUrl();
  const name = `t_${process.pid}_${randomBytes(4).toString("hex")}`;
  const client = new pg.Client({ connectionString: admin.toString() });
  await client.connect();
  try {
    for (let attempt = 0; ; attempt++) {
      try {
        await client.query(`create database "${name}" template "${process.env.TEST_TEMPLATE_DB}"`);
        break;
      } catch (e) {
        // Two copies of one template at the same moment: PostgreSQL asks us to wait our turn.
        if (attempt > 40 || !/being accessed by other users/.test(String(e))) throw e;
        await new Promise((r) => setTimeout(r, 100 + Math.random() * 200));
      }
    }
  } finally {
    await client.end();
  }
  const url = new URL(admin);
  url.pathname = `/${name}`;
  return url.toString();
}

export async function dropDatabase(url: string) {
  const name = new URL(url).pathname.slice(1);
  const client = new pg.Client({ connectionString: adminUrl().toString() });
  await client.connect();
  try {
    await client.query(`drop database if exists "${name}" with (force)`);
  } finally {
    await client.end();
  }
}

/** Gives this test file its own database and points the app's `db()` at it. */
export function useTestDatabase() {
  let url = "";
  beforeAll(async () => {
    url = await createDatabaseFromTemplate();
    await closeDb();
    process.env.DATABASE_URL = url;
  });
  afterAll(async () => {
    await closeDb();
    if (url) await dropDatabase(url);
  });
  return { db: () => db(), url: () => url };
}
