/**
 * `npm run db:backup [-- --out file.dump]`: a compressed custom-format pg_dump of the database
 * (DATABASE_URL or the local cluster). Restore with `npm run db:restore -- --in file.dump`.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { arg, pgTool, targetUrl } from "./pg-tools.ts";

export function backup(url: string, out: string) {
  fs.mkdirSync(path.dirname(out), { recursive: true });
  const r = spawnSync(
    pgTool("pg_dump"),
    ["--format=custom", "--no-owner", "--no-privileges", "--file", out, "--dbname", url],
    {
      encoding: "utf8",
    },
  );
  if (r.status !== 0) throw new Error(`pg_dump failed: ${r.stderr}`);
  return out;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const stamp = new Date().toISOString().replace(/[:.]/g, "-");
  const out = path.resolve(arg("out") ?? `.data/backups/fallwright-${stamp}.dump`);
  backup(targetUrl(), out);
  console.log(`backup written: ${out} (${(fs.statSync(out).size / 1024).toFixed(1)} kB)`);
}
