/**
 * The HTTP host: Express in front of React Router. Adds what every response needs (security
 * headers, cross-site refusal, body caps), serves built assets, and shuts down cleanly.
 * Production: `NODE_ENV=production APP_URL=https://… node --import tsx app/server/index.ts`; development runs
 * Vite in middleware mode for hot reload.
 */
import path from "node:path";
import type { ServerBuild } from "react-router";
import { createRequestHandler } from "@react-router/express";
import compression from "compression";
import express from "express";
import { securityHeaders, refuseCrossSite, capBodySize } from "./security.ts";
import { guardInput } from "./input-guard.ts";
import { appUrlProblem } from "../lib/app-url.ts";

const root = path.resolve(import.meta.dirname, "../..");
const production = process.env.NODE_ENV === "production";
const port = Number(process.env.PORT ?? 3000);
const host = process.env.HOST ?? "127.0.0.1";
const buildDir = path.resolve(root, process.env.FALLWRIGHT_BUILD_DIR ?? "build");
/** The largest body any route accepts (an underlay image and its form around it). */
const BODY_LIMIT = 12 * 1024 * 1024;

// Links in e-mail come from APP_URL only, never from the request (docs/security.md).
const appUrl = appUrlProblem(process.env.APP_URL);
if (appUrl) {
  console.error(`[fallwright] cannot start: ${appUrl}`);
  process.exit(1);
}

const app = express();
app.disable("x-powered-by");
app.set("trust proxy", process.env.TRUST_PROXY === "1" ? 1 : false);
app.use(compression({ filter: (req, res) => !String(res.getHeader("Content-Type") ?? "").includes("text/event-stream") && compression.filter(req, res) }));
app.use(securityHeaders({ production }));
app.use(refuseCrossSite());
app.use(capBodySize(BODY_LIMIT));

let build: ServerBuild | (() => Promise<ServerBuild>);
if (production) {
  app.use("/assets", express.static(path.join(buildDir, "client/assets"), { immutable: true, maxAge: "1y" }));
  app.use(express.static(path.join(buildDir, "client"), { maxAge: "1h" }));
  build = guardInput((await import(path.join(buildDir, "server/index.js"))) as ServerBuild, BODY_LIMIT);
} else {
  const vite = await import("vite");
  const viteServer = await vite.createServer({ root, server: { middlewareMode: true } });
  app.use(viteServer.middlewares);
  build = async () => guardInput((await viteServer.ssrLoadModule("virtual:react-router/server-build")) as ServerBuild, BODY_LIMIT);
}

app.all(
  "/{*splat}",
  createRequestHandler({
    build,
    mode: production ? "production" : "development",
    // clientIp feeds the rate limits; with TRUST_PROXY=1 it is the address the proxy saw.
    getLoadContext: (req, res) => ({ cspNonce: res.locals.cspNonce as string, clientIp: req.ip ?? req.socket.remoteAddress ?? "unknown" }),
  }),
);

const server = app.listen(port, host, () => {
  console.log(`Fallwright is serving on http://${host === "0.0.0.0" ? "localhost" : host}:${port}`);
});
server.keepAliveTimeout = 65_000;

let closing = false;
async function shutdown(signal: string) {
  if (closing) return;
  closing = true;
  console.log(`[fallwright] ${signal}: closing`);
  const force = setTimeout(() => process.exit(0), 8000);
  force.unref();
  server.close();
  server.closeIdleConnections?.();
  const { closeDb } = await import("../lib/db.server.ts");
  const { closeListeners } = await import("../lib/live.server.ts");
  await closeListeners().catch(() => {});
  await closeDb();
  process.exit(0);
}
process.on("SIGTERM", () => void shutdown("SIGTERM"));
process.on("SIGINT", () => void shutdown("SIGINT"));
process.on("unhandledRejection", (reason) => console.warn("[fallwright] unhandled rejection:", reason));
