import path from "node:path";
import type { Knex } from "knex";

/** Where migrations and seeds live; shared by knexfile.ts, the set-up tasks and the tests. */
export const migrationConfig: Pick<Knex.Config, "migrations" | "seeds"> = {
  migrations: { directory: path.join(import.meta.dirname, "migrations"), extension: "ts", loadExtensions: [".ts"] },
  seeds: { directory: path.join(import.meta.dirname, "seeds"), extension: "ts", loadExtensions: [".ts"] },
};
