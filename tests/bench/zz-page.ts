import { chromium } from "@playwright/test";
import fs from "node:fs";
import config from "../playwright.config.ts";
import { benchServer, signIn } from "./harness.ts";
const { server, stop } = await benchServer("fallwright_zz_page", { API_RATE_LIMIT_PER_MINUTE: "100000000" });
const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", args: config.use?.launchOptions?.args ?? [] });
try {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  const cookie = await signIn(server.url, "trainee@tidemark.example");
  await context.addCookies(cookie.split("; ").map((pair) => { const at = pair.indexOf("="); return { name: pair.slice(0, at), value: pair.slice(at + 1), url: server.url }; }));
  for (let i = 0; i < 3; i++) {
    const tab = await context.newPage();
    const cdp = await context.newCDPSession(tab);
    await cdp.send("Profiler.enable");
    await cdp.send("Profiler.setSamplingInterval", { interval: 200 });
    if (i == 2) await cdp.send("Profiler.start");
    const t0 = Date.now();
    await tab.goto(`${server.url}/sandbox`);
    await tab.locator("[data-drawn]").first().waitFor({ timeout: 30000 });
    const nav = await tab.evaluate(() => performance.now());
    console.log("load", i, Date.now() - t0, "ms; perf.now at drawn", Math.round(nav));
    if (i == 2) {
      const { profile } = await cdp.send("Profiler.stop");
      fs.writeFileSync("/tmp/prof/page.cpuprofile", JSON.stringify(profile));
      const marks = await tab.evaluate(() => performance.getEntriesByType("resource").map((e) => [e.name.split("/").pop(), Math.round(e.startTime), Math.round(e.responseEnd), e.transferSize]));
      console.log(JSON.stringify(marks.filter((m) => /\.js|\.css|\.woff/.test(String(m[0])))));
    }
    await tab.close();
  }
} finally {
  await browser.close();
  await stop();
}
