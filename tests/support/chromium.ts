/**
 * Debian's chromium, which the end-to-end tests and the bench's browser section drive: installed
 * from Debian's packages the first time either needs it (as root; otherwise the error says how).
 */
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import { log } from "../../app/dev/cluster.ts";

export const CHROMIUM = "/usr/bin/chromium";

export function ensureChromium(): void {
  if (fs.existsSync(CHROMIUM)) return;
  if (process.getuid?.() !== 0) throw new Error("Debian's chromium is missing: sudo apt-get install -y chromium");
  log("installing Debian's chromium (once)...");
  execFileSync("apt-get", ["update"], { stdio: "inherit" });
  execFileSync("apt-get", ["install", "-y", "--no-install-recommends", "chromium", "fonts-dejavu-core"], {
    stdio: "inherit",
    env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" },
  });
}
