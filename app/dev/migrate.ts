/**
 * `node --import tsx app/dev/migrate.ts [--no-seed]`: migrates (and seeds) the database at
 * DATABASE_URL. Used by tests that build a database of their own, and by operators.
 */
import knex from "knex";
import { migrationConfig } from "../../db/config.ts";

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("DATABASE_URL is not set");
  process.exit(2);
}
const k = knex({
  client: "pg",
  connection: { connectionString: url, connectionTimeoutMillis: 5000 },
  ...migrationConfig,
});
try {
  await k.migrate.latest();
  if (!process.argv.includes("--no-seed")) await k.seed.run();
} finally {
  await k.destroy();
}
