import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import fs from "node:fs";
import { TABLE_COLUMNS } from "~/lib/db-tables";
import { readColumns, renderTableTypes, TABLES_FILE } from "../../db/table-types";

// The row types in app/lib/db-tables.ts are written by `npm run db:types` from the migrated schema.
// This holds them to it, so a migration that adds, drops or renames a column (or a table), or
// changes a column's type, nullability or default, fails here until the script is run again.
const database = useTestDatabase();

describe("the typed tables match the migrated schema", () => {
  it("has every table and column the database has, and no others", async () => {
    const rows = (await database
      .db()
      .select("table_name", "column_name")
      .from("information_schema.columns")
      .where({ table_schema: "public" })
      .andWhereNot("table_name", "like", "knex_%")
      .orderBy(["table_name", "ordinal_position"])) as { table_name: string; column_name: string }[];
    const live: Record<string, string[]> = {};
    for (const r of rows) (live[r.table_name] ??= []).push(r.column_name);
    const typed = Object.fromEntries(Object.entries(TABLE_COLUMNS).map(([t, cols]) => [t, [...cols].sort()]));
    const actual = Object.fromEntries(Object.entries(live).map(([t, cols]) => [t, cols.sort()]));
    expect(typed).toEqual(actual);
  });

  it("is exactly what `npm run db:types` writes for this schema", async () => {
    const expected = await renderTableTypes(await readColumns(database.db()));
    expect(fs.readFileSync(TABLES_FILE, "utf8")).toBe(expected);
  });
});
