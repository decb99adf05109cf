/** Locates Debian's PostgreSQL client tools and resolves which database a task acts on. */
import fs from "node:fs";
import path from "node:path";
import { clusterUrl, ensurePostgresInstalled, readClusterInfo } from "../app/dev/cluster.ts";

export function pgTool(name: "pg_dump" | "pg_restore" | "psql"): string {
  const bin = ensurePostgresInstalled();
  const p = path.join(bin, name);
  return fs.existsSync(p) ? p : name;
}

/** DATABASE_URL, else the local development cluster's database. */
export function targetUrl(): string {
  if (process.env.DATABASE_URL) return process.env.DATABASE_URL;
  const info = readClusterInfo("dev");
  if (!info) throw new Error("No DATABASE_URL and no local cluster: run `npm start` once first.");
  return clusterUrl(info, "fallwright");
}

export function arg(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0
    ? process.argv[i + 1]
    : process.argv
        .find((a) => a.startsWith(`--${name}=`))
        ?.split("=")
        .slice(1)
        .join("=");
}
