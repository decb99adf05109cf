import { timingSafeEqual } from "node:crypto";
import type { Request, Response } from "express";
import { metrics } from "../lib/metrics.server.ts";

const LOOPBACK = new Set(["127.0.0.1", "::1", "::ffff:127.0.0.1"]);

/**
 * Who is asking, as honestly as the host can tell: the socket's address, or with TRUST_PROXY=1
 * the address the proxy saw (req.ip). A request that carries X-Forwarded-For without
 * TRUST_PROXY came through a proxy the host was not told about, so it is not taken as local
 * even when the socket is loopback (a proxy on the same machine).
 */
export function isLocalCaller(req: Request): boolean {
  const trustProxy = Boolean(req.app.get("trust proxy"));
  if (!trustProxy && req.get("x-forwarded-for") !== undefined) return false;
  const address = trustProxy ? req.ip : req.socket.remoteAddress;
  return address !== undefined && LOOPBACK.has(address);
}

function tokenMatches(req: Request, token: string | undefined): boolean {
  if (!token) return false;
  const given = /^Bearer\s+(.+)$/i.exec(req.get("authorization") ?? "")?.[1] ?? "";
  const a = Buffer.from(given);
  const b = Buffer.from(token);
  return a.length === b.length && timingSafeEqual(a, b);
}

/**
 * GET /metrics in Prometheus' text format. Answers a caller on this machine, or one that sends
 * `Authorization: Bearer <METRICS_TOKEN>`; anyone else gets 403.
 */
export function metricsEndpoint() {
  return async (req: Request, res: Response) => {
    res.setHeader("Cache-Control", "no-store");
    if (!isLocalCaller(req) && !tokenMatches(req, process.env.METRICS_TOKEN)) {
      res
        .status(403)
        .type("text/plain")
        .send("Metrics are served to this machine only, or with the configured token (METRICS_TOKEN).");
      return;
    }
    const { registry } = metrics();
    res.type(registry.contentType).send(await registry.metrics());
  };
}
