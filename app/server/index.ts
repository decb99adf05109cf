/**
 * The HTTP host: Express in front of React Router. Adds what every response needs (request id,
 * one structured log line, security headers, cross-site refusal, body caps counted as they
 * stream, the input guard), serves built assets and `/metrics`, and shuts down cleanly.
 * Production: `NODE_ENV=production APP_URL=https://… node --import tsx app/server/index.ts`; development runs
 * Vite in middleware mode for hot reload.
 */
import { randomUUID } from "node:crypto";
import path from "node:path";
import type { ServerBuild } from "react-router";
import { createRequestHandler } from "@react-router/express";
import compression from "compression";
import express, { type NextFunction, type Request, type Response } from "express";
import { log } from "../lib/log.server.ts";
import { metrics } from "../lib/metrics.server.ts";
import { closePools, pool } from "../lib/pool.server.ts";
import { requestStore, type RequestInfo } from "../lib/request-context.server.ts";
import { metricsEndpoint } from "./metrics-route.ts";
import { routeLabeller } from "./route-labels.ts";
import { BODY_CAPS, securityHeaders, refuseCrossSite, capBodySize, withCountedBody } from "./security.ts";
import { guardInput } from "./input-guard.ts";
import { appUrlProblem } from "../lib/app-url.ts";

const root = path.resolve(import.meta.dirname, "../..");
process.env.FALLWRIGHT_ROOT ??= root;
const production = process.env.NODE_ENV === "production";
const port = Number(process.env.PORT ?? 3000);
const host = process.env.HOST ?? "127.0.0.1";
const buildDir = path.resolve(root, process.env.FALLWRIGHT_BUILD_DIR ?? "build");
const logger = log();

// Links in e-mail come from APP_URL only, never from the request (docs/security.md).
const appUrl = appUrlProblem(process.env.APP_URL);
if (appUrl) {
  console.error(`[fallwright] cannot start: ${appUrl}`);
  process.exit(1);
}

const app = express();
app.disable("x-powered-by");
app.set("trust proxy", process.env.TRUST_PROXY === "1" ? 1 : false);

let labelFor: (path: string) => string = () => "(starting)";

// Request id, user id slot and the request's one log line (with its duration metric).
app.use((req: Request, res: Response, next: NextFunction) => {
  const info: RequestInfo = { id: randomUUID() };
  const started = process.hrtime.bigint();
  res.locals.requestId = info.id;
  res.setHeader("X-Request-Id", info.id);
  let done = false;
  const finish = () => {
    if (done) return;
    done = true;
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    const route = labelFor(req.path);
    const status = res.writableFinished ? res.statusCode : 499;
    metrics().httpDuration.observe({ method: req.method, route, status: String(status) }, seconds);
    logger.info(
      {
        reqId: info.id,
        method: req.method,
        route,
        // The pattern stands in for a path that carries a token (reset and invitation links).
        path: route.includes(":token") ? route : req.path,
        status,
        ms: Math.round(seconds * 10_000) / 10,
        userId: info.userId ?? null,
        ip: req.ip ?? req.socket.remoteAddress,
      },
      "request",
    );
  };
  res.once("finish", finish);
  res.once("close", finish);
  requestStore().run(info, next);
});

app.get("/metrics", metricsEndpoint());
app.use(
  compression({
    filter: (req, res) =>
      !String(res.getHeader("Content-Type") ?? "").includes("text/event-stream") && compression.filter(req, res),
  }),
);
app.use(securityHeaders({ production }));
app.use(refuseCrossSite());
app.use(capBodySize());

let build: ServerBuild | (() => Promise<ServerBuild>);
if (production) {
  app.use("/assets", express.static(path.join(buildDir, "client/assets"), { immutable: true, maxAge: "1y" }));
  app.use(express.static(path.join(buildDir, "client"), { maxAge: "1h" }));
  build = guardInput((await import(path.join(buildDir, "server/index.js"))) as ServerBuild, BODY_CAPS.upload);
  labelFor = routeLabeller(build);
} else {
  const vite = await import("vite");
  const viteServer = await vite.createServer({ root, server: { middlewareMode: true } });
  app.use(viteServer.middlewares);
  build = async () =>
    guardInput((await viteServer.ssrLoadModule("virtual:react-router/server-build")) as ServerBuild, BODY_CAPS.upload);
  labelFor = routeLabeller(null);
}

const handle = createRequestHandler({
  build,
  mode: production ? "production" : "development",
  // clientIp feeds the rate limits; with TRUST_PROXY=1 it is the address the proxy saw.
  getLoadContext: (req, res) => ({
    cspNonce: res.locals.cspNonce as string,
    clientIp: req.ip ?? req.socket.remoteAddress ?? "unknown",
    requestId: res.locals.requestId as string,
  }),
});
// React Router reads the body from the stream capBodySize counts, never the raw request.
app.all("/{*splat}", (req, res, next) => handle(withCountedBody(req, res), res, next));

// Errors that escaped React Router's own handling: logged once, with the id the client sees.
app.use((error: unknown, req: Request, res: Response, _next: NextFunction) => {
  const id = res.locals.requestId as string | undefined;
  logger.error({ reqId: id, err: error, route: labelFor(req.path) }, "request failed outside the app");
  if (res.headersSent) return res.end();
  res
    .status(500)
    .type("text/plain")
    .send(`Something went wrong on our side. Quote this reference if you report it: ${id}`);
});

const server = app.listen(port, host, () => {
  // One thread in each pool, started once serving, so the first sign-in or analysis does not wait for it.
  setTimeout(() => {
    pool("engine");
    pool("password");
  }, 500).unref();
  logger.info(
    { url: `http://${host === "0.0.0.0" ? "localhost" : host}:${port}` },
    `Fallwright is serving on http://${host === "0.0.0.0" ? "localhost" : host}:${port}`,
  );
});
server.keepAliveTimeout = 65_000;

let closing = false;
async function shutdown(signal: string) {
  if (closing) return;
  closing = true;
  logger.info({ signal }, `${signal}: closing`);
  const force = setTimeout(() => process.exit(0), 8000);
  force.unref();
  server.close();
  server.closeIdleConnections?.();
  const { closeDb } = await import("../lib/db.server.ts");
  const { closeListeners } = await import("../lib/live.server.ts");
  await closeListeners().catch(() => {});
  await closePools().catch(() => {});
  await closeDb();
  process.exit(0);
}
process.on("SIGTERM", () => void shutdown("SIGTERM"));
process.on("SIGINT", () => void shutdown("SIGINT"));
process.on("unhandledRejection", (reason) => logger.warn({ err: reason }, "unhandled rejection"));
