/** Brings up what the app needs for a profile: its PostgreSQL database, migrated and seeded, and the local fakes. */
import { spawn, type ChildProcess } from "node:child_process";
import net from "node:net";
import path from "node:path";
import knex from "knex";
import { choosePort, clusterUrl, ensureCluster, ensureDatabase, log, PROJECT_ROOT } from "./cluster.ts";
import { migrationConfig } from "../../db/config.ts";

/** Preferred ports: used when free, else the system picks free ones (see `choosePort`). */
export interface Profile {
  name: "dev" | "test";
  pgPort: number;
  database: string;
  smtpPort: number;
  s3Port: number;
}

/** The ports the local fakes listen on for this run. */
export interface FakePorts {
  smtp: number;
  s3: number;
}

/** Free ports for the fakes: the profile's when free, else any (a second checkout runs its own). */
export async function chooseFakePorts(p: Profile): Promise<FakePorts> {
  const smtp = await choosePort(p.smtpPort);
  let s3 = await choosePort(p.s3Port);
  if (s3 === smtp) s3 = await choosePort(0);
  return { smtp, s3 };
}

export const PROFILES: Record<Profile["name"], Profile> = {
  dev: { name: "dev", pgPort: 54329, database: "fallwright", smtpPort: 2525, s3Port: 4568 },
  test: { name: "test", pgPort: 54339, database: "fallwright_template", smtpPort: 2526, s3Port: 4569 },
};

/** The environment the app and tests read for a profile. */
export function serviceEnv(p: Profile, ports: FakePorts): Record<string, string> {
  const data = path.join(PROJECT_ROOT, ".data");
  return {
    SMTP_URL: process.env.SMTP_URL ?? `smtp://127.0.0.1:${ports.smtp}`,
    MAIL_FROM: process.env.MAIL_FROM ?? "Fallwright <no-reply@fallwright.example>",
    MAIL_SPOOL_DIR: process.env.MAIL_SPOOL_DIR ?? path.join(data, `mail-${p.name}`),
    S3_ENDPOINT: process.env.S3_ENDPOINT ?? `http://127.0.0.1:${ports.s3}`,
    S3_BUCKET: process.env.S3_BUCKET ?? "fallwright",
    S3_REGION: process.env.S3_REGION ?? "us-east-1",
    S3_ACCESS_KEY_ID: process.env.S3_ACCESS_KEY_ID ?? "S3RVER",
    S3_SECRET_ACCESS_KEY: process.env.S3_SECRET_ACCESS_KEY ?? "S3RVER",
  };
}

/**
 * Ensures the cluster and database exist, migrated and seeded; returns DATABASE_URL and, when this
 * call started the project's own cluster, its info (so `npm start` can stop what it started).
 */
export async function prepareDatabaseCluster(p: Profile, opts: { seed?: boolean } = {}) {
  let url = process.env.DATABASE_URL;
  let started: Awaited<ReturnType<typeof ensureCluster>> | null = null;
  if (!url) {
    const info = await ensureCluster(p.name, p.pgPort, { fast: p.name === "test" });
    if (info.startedHere) started = info;
    await ensureDatabase(info, p.database);
    url = clusterUrl(info, p.database);
  }
  await migrateAndSeed(url, opts);
  return { url, started };
}

/** Ensures the cluster and database exist, migrated and seeded; returns DATABASE_URL. */
export async function prepareDatabase(p: Profile, opts: { seed?: boolean } = {}): Promise<string> {
  return (await prepareDatabaseCluster(p, opts)).url;
}

async function migrateAndSeed(url: string, opts: { seed?: boolean }) {
  const k = knex({
    client: "pg",
    connection: { connectionString: url, connectionTimeoutMillis: 5000 },
    ...migrationConfig,
  });
  try {
    const [, done] = await k.migrate.latest();
    if (done.length) log(`migrated: ${done.join(", ")}`);
    if (opts.seed !== false) {
      await k.seed.run();
      log("demo data seeded");
    }
  } finally {
    await k.destroy();
  }
}

function portOpen(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect(port, "127.0.0.1");
    s.once("connect", () => {
      s.destroy();
      resolve(true);
    });
    s.once("error", () => resolve(false));
  });
}

export async function waitForPort(port: number, timeoutMs = 30_000) {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if (await portOpen(port)) return;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`nothing answered on port ${port} after ${timeoutMs} ms`);
}

/** Starts the SMTP and S3 fakes in a child process on the given ports, unless real services are configured. */
export async function startFakes(
  p: Profile,
  env: Record<string, string>,
  ports: FakePorts,
): Promise<ChildProcess | null> {
  if (process.env.SMTP_URL && process.env.S3_ENDPOINT) return null;
  const child = spawn(process.execPath, ["--import", "tsx", path.join(PROJECT_ROOT, "app/dev/fakes.ts")], {
    cwd: PROJECT_ROOT,
    stdio: ["ignore", "inherit", "inherit"],
    env: {
      ...process.env,
      ...env,
      SMTP_PORT: String(ports.smtp),
      S3_PORT: String(ports.s3),
      S3_FAKE_DIR: path.join(PROJECT_ROOT, ".data", `s3-${p.name}`),
    },
  });
  await waitForPort(ports.smtp);
  await waitForPort(ports.s3);
  return child;
}
