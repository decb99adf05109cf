import os from "node:os";
import path from "node:path";
import fs from "node:fs";
import knex from "knex";
import { afterAll, describe, expect, it } from "vitest";
import { backup } from "../../db/backup";
import { restore } from "../../db/restore";
import { createDatabaseFromTemplate, dropDatabase } from "../support/db";

const TABLES = ["organisations", "users", "roofs", "roof_versions", "classes", "class_members", "lessons", "attempts"];

async function snapshot(url: string) {
  const k = knex({ client: "pg", connection: url });
  try {
    const out: Record<string, unknown[]> = {};
    for (const t of TABLES) {
      const rows = await k(t).select("*");
      out[t] = rows.map((r) => JSON.stringify(r)).sort();
    }
    return out;
  } finally {
    await k.destroy();
  }
}

describe("db:backup and db:restore", () => {
  const made: string[] = [];
  afterAll(async () => {
    for (const url of made) await dropDatabase(url);
  });

  it("restores a backup into a fresh database and finds every row", async () => {
    const source = await createDatabaseFromTemplate();
    made.push(source);
    // Add a row after the template so the dump holds something the template does not.
    const k = knex({ client: "pg", connection: source });
    const owner = await k("users").where({ email: "designer@tidemark.example" }).first();
    await k("roofs").insert({
      owner_id: owner!.id,
      name: "Backup check roof",
      spec: JSON.stringify({
        outline: [
          [0, 0],
          [4, 0],
          [4, 3],
        ],
      }),
    });
    await k.destroy();

    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "fw-backup-")), "db.dump");
    backup(source, file);
    expect(fs.statSync(file).size).toBeGreaterThan(1000);

    const target = await createDatabaseFromTemplate();
    made.push(target);
    // An empty database: drop the template's tables first, then restore into it.
    const t = knex({ client: "pg", connection: target });
    await t.raw("drop schema public cascade; create schema public;");
    await t.destroy();
    restore(file, target);

    const before = await snapshot(source);
    const after = await snapshot(target);
    for (const table of TABLES) expect(after[table], table).toEqual(before[table]);
    expect(before.users.length).toBeGreaterThan(3);
    expect((after.roofs as string[]).some((r) => r.includes("Backup check roof"))).toBe(true);
  });
});
