/** Starts the production server (from the build) on a free port for integration tests. */
import { spawn, type ChildProcess } from "node:child_process";
import net from "node:net";
import path from "node:path";
import { ensureBuild, ROOT } from "./build";

export interface RunningServer {
  url: string;
  port: number;
  proc: ChildProcess;
  output: () => string;
  stop: () => Promise<void>;
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

export async function startServer(databaseUrl: string, env: Record<string, string> = {}): Promise<RunningServer> {
  const buildDir = ensureBuild();
  const port = await freePort();
  let out = "";
  const proc = spawn(process.execPath, ["--import", "tsx", path.join(ROOT, "app/server/index.ts")], {
    cwd: ROOT,
    // APP_URL: links in e-mail point at this server (a test may pass its own, or "" for none).
    env: {
      ...process.env,
      NODE_ENV: "production",
      PORT: String(port),
      APP_URL: `http://127.0.0.1:${port}`,
      DATABASE_URL: databaseUrl,
      FALLWRIGHT_BUILD_DIR: buildDir,
      ...env,
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  proc.stdout!.on("data", (d) => (out += d));
  proc.stderr!.on("data", (d) => (out += d));
  const url = `http://127.0.0.1:${port}`;
  // Generous: on a shared 2-core machine under load, loading the build alone can take over 30 s.
  const end = Date.now() + 90_000;
  for (;;) {
    if (proc.exitCode !== null) throw new Error(`server exited early:\n${out}`);
    try {
      const r = await fetch(`${url}/healthz`);
      if (r.status === 200 || r.status === 503) break;
    } catch {
      /* not up yet */
    }
    if (Date.now() > end) throw new Error(`server did not start:\n${out}`);
    await new Promise((r) => setTimeout(r, 150));
  }
  return {
    url,
    port,
    proc,
    output: () => out,
    stop: () =>
      new Promise<void>((resolve) => {
        if (proc.exitCode !== null) return resolve();
        proc.once("exit", () => resolve());
        proc.kill("SIGTERM");
      }),
  };
}
