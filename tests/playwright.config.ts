import { defineConfig } from "@playwright/test";

export default defineConfig({
  testDir: "./e2e",
  outputDir: `../${process.env.TEST_RESULTS_DIR ?? ".data/test-results"}/playwright`,
  fullyParallel: false,
  workers: 2,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [
    ["list"],
    ["json", { outputFile: `../${process.env.TEST_RESULTS_DIR ?? ".data/test-results"}/playwright.json` }],
  ],
  use: {
    baseURL: process.env.E2E_BASE_URL ?? "http://127.0.0.1:3107",
    // Dates follow the browser's language (app/lib/when.ts); one fixed locale keeps the tests' text fixed.
    locale: "en-GB",
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
    launchOptions: {
      executablePath: "/usr/bin/chromium",
      args: [
        "--disable-quic",
        "--use-angle=swiftshader",
        "--enable-unsafe-swiftshader",
        "--ignore-gpu-blocklist",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
      ],
    },
  },
  projects: [
    { name: "chromium", use: { browserName: "chromium" }, testIgnore: /classroom\.spec\.ts/ },
    // Timed to the second: runs alone, after the rest, so another page's software WebGL does
    // not share the two cores with it.
    // Its trace keeps the steps and the network but takes no DOM snapshots or screencast: each
    // snapshot walks the whole page in the page's own main thread (about 2,300 elements on the
    // follow page, 40-150 ms each here), and a trace of the latency test showed them delaying the
    // follower's next frame. With tracing off (a trial) its canvas figure fell from about 515 to
    // 390 ms (median of six moves each way).
    {
      name: "timed",
      use: { browserName: "chromium", trace: { mode: "retain-on-failure", snapshots: false, screenshots: false } },
      testMatch: /classroom\.spec\.ts/,
      dependencies: ["chromium"],
    },
  ],
});
