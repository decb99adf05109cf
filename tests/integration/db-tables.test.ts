import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { TABLE_COLUMNS } from "~/lib/db-tables";

// Issue 20 item 9: the row types in app/lib/db-tables.ts are written by hand from the migrations.
// This holds them to the migrated schema, so a migration that adds, drops or renames a column
// (or a table) fails here until the types say the same.
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
});
