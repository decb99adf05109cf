/**
 * `npm run db:types`: writes app/lib/db-tables.ts (Knex's table type augmentation) from the
 * migrated schema's information_schema: one row type per table (what a select returns) and one
 * insert type (columns with a default or that may be null are optional). Reads DATABASE_URL, else
 * the local development cluster (`-- --test` for the test cluster's template database). Migrate
 * first (`npm run db:migrate`). tests/integration/db-tables.test.ts checks that the file is what
 * this script writes for the test database.
 */
import fs from "node:fs";
import path from "node:path";
import knex, { type Knex } from "knex";
import * as prettier from "prettier";
import { clusterUrl, PROJECT_ROOT, readClusterInfo } from "../app/dev/cluster.ts";
import { arg, targetUrl } from "./pg-tools.ts";

export const TABLES_FILE = path.join(PROJECT_ROOT, "app/lib/db-tables.ts");

export interface ColumnInfo {
  table_name: string;
  column_name: string;
  udt_name: string;
  is_nullable: "YES" | "NO";
  column_default: string | null;
}

/** Columns whose text holds a union the app defines: the table's type says so. */
const NARROWED: Record<string, string> = {
  "users.role": "Role",
  "tokens.role": "Role",
  "classes.live_phase": "LivePhase",
};

/** How node-postgres hands each PostgreSQL type over, with app/lib/db.server.ts's parsers. */
function tsType(udt: string): string {
  switch (udt) {
    case "uuid":
    case "text":
    case "varchar":
    case "bpchar":
    case "citext":
    case "inet":
    case "date": // kept as "YYYY-MM-DD" text (db.server.ts)
    case "int8": // bigint: text, pg's default
    case "numeric":
      return "string";
    case "int2":
    case "int4":
    case "float4":
    case "float8":
      return "number";
    case "bool":
      return "boolean";
    case "timestamptz":
    case "timestamp":
      return "Date";
    case "json":
    case "jsonb":
      return "unknown";
    case "bytea":
      return "Buffer";
    default:
      throw new Error(`No TypeScript type for the PostgreSQL type "${udt}": add it to db/table-types.ts.`);
  }
}

/** The columns of the public schema's tables (Knex's own bookkeeping left out), in table and column order. */
export async function readColumns(db: Knex): Promise<ColumnInfo[]> {
  return (await db
    .select("table_name", "column_name", "udt_name", "is_nullable", "column_default")
    .from("information_schema.columns")
    .where({ table_schema: "public" })
    .andWhereNot("table_name", "like", "knex_%")
    .orderBy(["table_name", "ordinal_position"])) as ColumnInfo[];
}

/** as_built_checks → AsBuiltCheck, classes → Class, audit_log → AuditLog. */
function typeName(table: string): string {
  const singular = table.endsWith("sses") ? table.slice(0, -2) : table.endsWith("s") ? table.slice(0, -1) : table;
  return singular
    .split("_")
    .map((w) => w[0].toUpperCase() + w.slice(1))
    .join("");
}

const HEADER = `/**
 * The database tables as TypeScript sees them (Knex's table type augmentation): what a select
 * returns, and what an insert must give (columns with a default or that may be null are optional).
 * Written by \`npm run db:types\` (db/table-types.ts) from the migrated schema: do not edit by hand;
 * tests/integration/db-tables.test.ts fails while this file differs from what the script writes.
 * jsonb columns are \`unknown\` here: what is stored is read through its own schema or type at the
 * edge. Dates (\`date\`) come back as "YYYY-MM-DD" text (see db.server.ts), bigint as text (pg's default).
 */
import type { Knex } from "knex";
import type { LivePhase } from "~/lib/live.server";
import type { Role } from "~/lib/permissions";

/** What a write may give for a column: its value, or SQL (\`now()\`), and text for a timestamp. */
type Writable<T> = {
  [K in keyof T]: T[K] extends Date
    ? Date | string | Knex.Raw
    : T[K] extends Date | null
      ? Date | string | Knex.Raw | null
      : T[K] | Knex.Raw;
};
`;

/** The text of app/lib/db-tables.ts for these columns, formatted by the project's Prettier settings. */
export async function renderTableTypes(columns: ColumnInfo[]): Promise<string> {
  const tables = new Map<string, ColumnInfo[]>();
  for (const c of columns) {
    const list = tables.get(c.table_name) ?? [];
    list.push(c);
    tables.set(c.table_name, list);
  }
  const names = [...tables.keys()].sort();
  const parts: string[] = [HEADER];
  for (const table of names) {
    const name = typeName(table);
    const cols = tables.get(table)!;
    const fields = cols.map((c) => {
      const base = NARROWED[`${table}.${c.column_name}`] ?? tsType(c.udt_name);
      return `  ${c.column_name}: ${base}${c.is_nullable === "YES" ? " | null" : ""};`;
    });
    parts.push(`export interface ${name}Row {\n${fields.join("\n")}\n}`);
    const optional = cols
      .filter((c) => c.is_nullable === "YES" || c.column_default !== null)
      .map((c) => JSON.stringify(c.column_name));
    parts.push(
      optional.length
        ? `export type ${name}Insert = Omit<${name}Row, ${optional.join(" | ")}> & Partial<Pick<${name}Row, ${optional.join(" | ")}>>;\n`
        : `export type ${name}Insert = ${name}Row;\n`,
    );
  }
  const listed = names.map(
    (t) =>
      `  ${t}: [${tables
        .get(t)!
        .map((c) => JSON.stringify(c.column_name))
        .join(", ")}],`,
  );
  parts.push(
    `/** Every table and its columns, for the test that holds these types to the live schema. */\nexport const TABLE_COLUMNS = {\n${listed.join("\n")}\n} as const;\n`,
  );
  const augmented = names.map((t) => {
    const n = typeName(t);
    return `    ${t}: Knex.CompositeTableType<${n}Row, Writable<${n}Insert>, Partial<Writable<${n}Row>>>;`;
  });
  parts.push(`declare module "knex/types/tables" {\n  interface Tables {\n${augmented.join("\n")}\n  }\n}\n`);
  const options = await prettier.resolveConfig(TABLES_FILE);
  return prettier.format(parts.join("\n"), { ...options, filepath: TABLES_FILE });
}

function sourceUrl(): string {
  if (!process.argv.includes("--test")) return targetUrl();
  const info = readClusterInfo("test");
  if (!info) throw new Error("No test cluster: run the integration tests once first.");
  return clusterUrl(info, arg("database") ?? "fallwright_template");
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const db = knex({ client: "pg", connection: sourceUrl() });
  try {
    const text = await renderTableTypes(await readColumns(db));
    const before = fs.existsSync(TABLES_FILE) ? fs.readFileSync(TABLES_FILE, "utf8") : "";
    fs.writeFileSync(TABLES_FILE, text);
    console.log(`${path.relative(process.cwd(), TABLES_FILE)} ${before === text ? "unchanged" : "written"}`);
  } finally {
    await db.destroy();
  }
}
