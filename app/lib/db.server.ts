import knex, { type Knex } from "knex";
import pg from "pg";

// Dates as strings are easier to pass through loaders untouched.
pg.types.setTypeParser(1082, (v) => v); // date

declare global {
  var __fallwrightDb: Knex | undefined;
}

/** One pool per process, kept across dev-server reloads. */
export function db(): Knex {
  if (!globalThis.__fallwrightDb) {
    const connectionString = process.env.DATABASE_URL;
    if (!connectionString) throw new Error("DATABASE_URL is not set");
    const instance = knex({
      client: "pg",
      connection: {
        connectionString,
        connectionTimeoutMillis: 3000,
        statement_timeout: 15000,
      } as Knex.PgConnectionConfig,
      acquireConnectionTimeout: 4000,
      pool: {
        min: 0,
        max: Number(process.env.DB_POOL_MAX ?? 10),
        afterCreate(conn: pg.Client, done: (err: Error | null, conn: pg.Client) => void) {
          // A dropped server connection must not crash the process.
          conn.on("error", (err) => console.warn("[db] connection error:", err.message));
          done(null, conn);
        },
      },
    });
    globalThis.__fallwrightDb = instance;
  }
  return globalThis.__fallwrightDb;
}

export async function closeDb() {
  const instance = globalThis.__fallwrightDb;
  globalThis.__fallwrightDb = undefined;
  if (instance) await instance.destroy();
}

const UNAVAILABLE_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "ETIMEDOUT",
  "57P01",
  "57P02",
  "57P03",
  "08006",
  "08001",
  "08003",
]);

/** True for errors that mean "the database is not answering" rather than a bug. */
export function isDbUnavailable(error: unknown): boolean {
  if (!error || typeof error !== "object") return false;
  const e = error as { code?: string; name?: string; message?: string; errors?: unknown[] };
  if (e.code && UNAVAILABLE_CODES.has(e.code)) return true;
  if (e.name === "KnexTimeoutError") return true;
  if (Array.isArray(e.errors) && e.errors.some(isDbUnavailable)) return true;
  const msg = e.message ?? "";
  return /Connection terminated|connect ECONNREFUSED|timeout exceeded when trying to connect|the database system is (starting up|shutting down)/i.test(
    msg,
  );
}
