/**
 * Runs the whole suite against the project's own test cluster and fakes:
 * lint (ESLint, then Prettier's check) → typecheck → vitest (unit + integration) → production build →
 * Playwright in Debian's chromium.
 * Ends with `N passed, N failed` and a non-zero exit on any failure.
 * `npm test -- --only=lint|typecheck|vitest|e2e` runs one stage (the set-up still happens, except for lint).
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import {
  choosePort,
  log,
  PROJECT_ROOT,
  readClusterInfo,
  clusterUrl,
  ensureDatabase,
  dropDatabase,
} from "../../app/dev/cluster.ts";
import {
  chooseFakePorts,
  PROFILES,
  prepareDatabase,
  serviceEnv,
  startFakes,
  waitForPort,
} from "../../app/dev/services.ts";
import { ensureChromium } from "./chromium.ts";
import { firstLine, playwrightFailures, vitestFailures } from "./failures.ts";

const only = process.argv.find((a) => a.startsWith("--only="))?.split("=")[1];
const profile = PROFILES.test;
const results = path.join(PROJECT_ROOT, process.env.TEST_RESULTS_DIR ?? ".data/test-results");
fs.rmSync(results, { recursive: true, force: true });
fs.mkdirSync(results, { recursive: true });

let passed = 0;
let failed = 0;
/** What failed, by name: printed again beside the summary, since a CI log is often read from its end. */
const failures: string[] = [];
const children: ChildProcess[] = [];

function bin(name: string) {
  return path.join(PROJECT_ROOT, "node_modules/.bin", name);
}

function stage(name: string, cmd: string, args: string[], env: Record<string, string> = {}): number {
  log(`── ${name}`);
  const r = spawnSync(cmd, args, { cwd: PROJECT_ROOT, stdio: "inherit", env: { ...process.env, ...env } });
  return r.status ?? 1;
}

async function main() {
  if (!only || only === "lint") {
    // One counted stage: both run, so one report shows every lint and format problem.
    const a = stage("lint", bin("eslint"), ["."]);
    const b = stage("format", bin("prettier"), ["--check", "."]);
    if (a === 0 && b === 0) passed++;
    else {
      failed++;
      failures.push(`lint: ${a === 0 ? "" : "ESLint "}${b === 0 ? "" : "Prettier"}`.trim());
    }
    if (only === "lint") return;
  }

  const templateUrl = await prepareDatabase(profile);
  const info = readClusterInfo("test");
  const ports = await chooseFakePorts(profile);
  const env: Record<string, string> = {
    ...serviceEnv(profile, ports),
    TEST_TEMPLATE_DB: profile.database,
    TEST_TEMPLATE_URL: templateUrl,
    FALLWRIGHT_TEST: "1",
    // Route modules called in-process build their e-mail links on this (tests/support/accounts.ts ORIGIN).
    APP_URL: "http://localhost",
  };
  const fakes = await startFakes(profile, env, ports);
  if (fakes) children.push(fakes);

  if (!only || only === "typecheck") {
    const a = stage("typecheck", process.execPath, [
      path.join(PROJECT_ROOT, "node_modules/@react-router/dev/bin.js"),
      "typegen",
    ]);
    const b = a === 0 ? stage("typecheck", bin("tsc"), ["--noEmit"]) : 1;
    if (a === 0 && b === 0) passed++;
    else {
      failed++;
      failures.push(a === 0 ? "typecheck: tsc" : "typecheck: route type generation");
    }
  }

  if (!only || only === "build" || only === "e2e" || only === "vitest") {
    if (
      stage("build", process.execPath, [path.join(PROJECT_ROOT, "node_modules/@react-router/dev/bin.js"), "build"]) !==
      0
    ) {
      failed++;
      failures.push("build");
      return;
    }
  }
  if (!only || only === "vitest") {
    const extra = process.argv.slice(2).filter((a) => !a.startsWith("--only="));
    stage("vitest", bin("vitest"), ["run", "--config", "tests/vitest.config.ts", ...extra], env);
    const file = path.join(results, "vitest.json");
    if (fs.existsSync(file)) {
      const r = JSON.parse(fs.readFileSync(file, "utf8"));
      passed += r.numPassedTests;
      // A skipped test counts as failed: here it only happens when a file's set-up broke.
      failed += r.numFailedTests + r.numPendingTests + (r.numRuntimeErrorTestSuites ?? 0);
      if (!r.success && r.numFailedTests + r.numPendingTests === 0) failed++;
      const named = vitestFailures(r, PROJECT_ROOT);
      failures.push(...(named.length || r.success ? named : ["vitest: did not succeed (see its report above)"]));
    } else {
      failed++;
      failures.push("vitest: wrote no report");
    }
  }

  if (!only || only === "e2e") {
    ensureChromium();
    if (!info) throw new Error("test cluster info missing");
    const port = process.env.E2E_PORT ? Number(process.env.E2E_PORT) : await choosePort(3107);
    const e2eDb = `fallwright_e2e_${port}`;
    await dropDatabase(info, e2eDb);
    await ensureDatabase(info, e2eDb, profile.database);
    const server = spawn(process.execPath, ["--import", "tsx", "app/server/index.ts"], {
      cwd: PROJECT_ROOT,
      stdio: [
        "ignore",
        fs.openSync(path.join(results, "e2e-server.log"), "w"),
        fs.openSync(path.join(results, "e2e-server.log"), "a"),
      ],
      env: {
        ...process.env,
        ...env,
        NODE_ENV: "production",
        PORT: String(port),
        APP_URL: `http://127.0.0.1:${port}`,
        DATABASE_URL: clusterUrl(info, e2eDb),
      },
    });
    children.push(server);
    await waitForPort(port, 90_000); // a loaded shared machine can take over 30 s to load the build
    const extra = process.argv.slice(2).filter((a) => !a.startsWith("--only="));
    stage("playwright", bin("playwright"), ["test", "--config", "tests/playwright.config.ts", ...extra], {
      ...env,
      E2E_BASE_URL: `http://127.0.0.1:${port}`,
      DATABASE_URL: clusterUrl(info, e2eDb),
    });
    const file = path.join(results, "playwright.json");
    if (fs.existsSync(file)) {
      const r = JSON.parse(fs.readFileSync(file, "utf8"));
      passed += r.stats.expected + (r.stats.flaky ?? 0);
      if (r.stats.flaky)
        console.log(
          `[fallwright] ${r.stats.flaky} end-to-end test(s) passed only on retry (flaky): see the Playwright list above`,
        );
      failed += r.stats.unexpected + (r.stats.skipped ?? 0);
      if (r.errors?.length) failed += r.errors.length;
      failures.push(...playwrightFailures(r));
    } else {
      failed++;
      failures.push("playwright: wrote no report");
    }
  }
}

let code = 0;
try {
  await main();
} catch (error) {
  console.error(error);
  failed++;
  failures.push(`set-up: ${firstLine(String(error))}`);
} finally {
  for (const c of children) c.kill("SIGTERM");
}
if (failed > 0) code = 1;
if (failures.length) console.log(`\nFailed:\n${failures.map((f) => `  ✘ ${f}`).join("\n")}`);
console.log(`\n${passed} passed, ${failed} failed`);
process.exit(code);
