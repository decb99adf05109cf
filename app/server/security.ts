import { randomBytes } from "node:crypto";
import { Transform } from "node:stream";
import type { NextFunction, Request, Response } from "express";

/** Headers on every response (docs/security.md, Headers on every response): CSP with a per-request nonce and friends. */
export function securityHeaders({ production }: { production: boolean }) {
  return (_req: Request, res: Response, next: NextFunction) => {
    const nonce = randomBytes(16).toString("base64");
    res.locals.cspNonce = nonce;
    const csp = [
      "default-src 'self'",
      `script-src 'self' 'nonce-${nonce}'${production ? "" : " 'unsafe-inline'"}`,
      "style-src 'self' 'unsafe-inline'",
      "img-src 'self' data: blob:",
      "font-src 'self'",
      `connect-src 'self'${production ? "" : " ws: wss:"}`,
      "worker-src 'self' blob:",
      "object-src 'none'",
      "base-uri 'self'",
      "form-action 'self'",
      "frame-ancestors 'none'",
    ].join("; ");
    // Vite's dev client injects scripts without our nonce; a nonce would disable 'unsafe-inline'.
    res.setHeader("Content-Security-Policy", production ? csp : csp.replace(` 'nonce-${nonce}'`, ""));
    res.setHeader("X-Content-Type-Options", "nosniff");
    res.setHeader("Referrer-Policy", "strict-origin-when-cross-origin");
    res.setHeader("X-Frame-Options", "DENY");
    res.setHeader("Cross-Origin-Opener-Policy", "same-origin");
    res.setHeader("Permissions-Policy", "camera=(), microphone=(), geolocation=()");
    if (production && process.env.HTTPS === "1") {
      res.setHeader("Strict-Transport-Security", "max-age=31536000; includeSubDomains");
    }
    next();
  };
}

const SAFE = new Set(["GET", "HEAD", "OPTIONS"]);

/** No cross-site writes: a non-GET with a foreign Origin or Sec-Fetch-Site: cross-site gets 403. */
export function refuseCrossSite() {
  return (req: Request, res: Response, next: NextFunction) => {
    if (SAFE.has(req.method)) return next();
    const site = req.get("sec-fetch-site");
    const origin = req.get("origin");
    let foreign = site === "cross-site";
    if (!foreign && origin && origin !== "null") {
      try {
        foreign = new URL(origin).host !== req.get("host");
      } catch {
        foreign = true;
      }
    } else if (origin === "null") {
      foreign = true;
    }
    if (foreign) {
      res.status(403).json({ error: { message: "Cross-site requests are refused.", issues: [] } });
      return;
    }
    next();
  };
}

/** Body caps by path (docs/security.md): uploads, the JSON API, and every other form or body. */
export interface BodyCaps {
  /** `/roofs/:id/underlay`: a 10 MB image in a multipart form. */
  upload: number;
  /** `/api/*`: the largest JSON body an API route reads (attempts, 512 kB). */
  api: number;
  /** Every other route: forms, the live feed's JSON, the schedule CSV's spec. */
  other: number;
}

export const BODY_CAPS: BodyCaps = { upload: 12 * 1024 * 1024, api: 512 * 1024, other: 1024 * 1024 };

export function bodyCapFor(path: string, caps: BodyCaps = BODY_CAPS): number {
  if (/^\/roofs\/[^/]+\/underlay\/?$/.test(path)) return caps.upload;
  if (path.startsWith("/api/")) return caps.api;
  return caps.other;
}

function sizeText(max: number) {
  return max >= 1024 * 1024 ? `${Math.round(max / 1024 / 1024)} MB` : `${Math.round(max / 1024)} kB`;
}

function refuse(res: Response, max: number, close = true) {
  if (close) res.set("Connection", "close");
  res.status(413).json({ error: { message: `The request body is over ${sizeText(max)}.`, issues: [] } });
}

/** How long, and how much more, a refused body is read and thrown away so the client sees its 413. */
const LINGER_MS = 5_000;
const LINGER_BYTES = 64 * 1024 * 1024;

/** What the counted body stream (see capBodySize) fails with once a chunked body passes its cap. */
export class BodyTooLarge extends Error {
  constructor(readonly limit: number) {
    super(`request body over ${limit} bytes`);
  }
}

/**
 * Caps every request body by its path. A body that announces more (Content-Length) is refused
 * before anything reads it, and one that announces less cannot send more (Node's parser reads
 * what follows as the next request). A chunked body is counted as it streams in, and the moment
 * it passes the cap the client gets 413, the app's reader gets an error and the rest of the body
 * is thrown away unread. The app then reads `res.locals.body`
 * (handed to React Router by `withCountedBody`), not the raw request.
 */
export function capBodySize(caps: BodyCaps = BODY_CAPS) {
  return (req: Request, res: Response, next: NextFunction) => {
    const max = bodyCapFor(req.path, caps);
    const length = Number(req.get("content-length") ?? 0);
    if (length > max) return refuse(res, max);
    // Only a chunked body is counted. A declared length within the cap needs no counting: Node's
    // parser never hands on more body than Content-Length says (a request with both it and
    // Transfer-Encoding is refused with 400).
    const chunked = req.get("transfer-encoding") !== undefined;
    if (!chunked || SAFE.has(req.method)) return next();
    let total = 0;
    const counted = new Transform({
      transform(chunk: Buffer, _enc, done) {
        total += chunk.length;
        if (total > max) done(new BodyTooLarge(max));
        else done(null, chunk);
      },
    });
    counted.on("error", (err) => {
      req.unpipe(counted);
      // Discard whatever else arrives. Closing the socket while the client is still sending makes
      // the kernel reset the connection, and a client then often loses the 413 it was sent; so
      // the rest is read and thrown away (a lingering close), for at most LINGER_MS and
      // LINGER_BYTES, after which the socket is closed anyway.
      req.resume();
      if (err instanceof BodyTooLarge) {
        let drained = 0;
        const stop = () => req.socket.destroy();
        const timer = setTimeout(stop, LINGER_MS);
        timer.unref();
        req.on("data", (chunk: Buffer) => {
          drained += chunk.length;
          if (drained > LINGER_BYTES) stop();
        });
        req.once("end", () => clearTimeout(timer));
        if (!res.headersSent) refuse(res, max, false);
      }
    });
    // A client that goes away mid-body: the app's reader gets an error instead of waiting forever.
    req.once("close", () => {
      if (!req.readableEnded && !counted.destroyed)
        counted.destroy(new Error("the client closed the request before its body ended"));
    });
    req.pipe(counted);
    res.locals.body = counted;
    next();
  };
}

const STREAM_KEYS = new Set<PropertyKey>([
  "on",
  "once",
  "off",
  "addListener",
  "removeListener",
  "removeAllListeners",
  "pause",
  "resume",
  "readable",
  "destroy",
  "readableHighWaterMark",
  "pipe",
  "unpipe",
  "read",
  "isPaused",
  "readableEnded",
  Symbol.asyncIterator,
]);

/**
 * The request as React Router's adapter should see it: every property the request's own, except
 * that its body is read from the counted stream capBodySize set up.
 */
export function withCountedBody(req: Request, res: Response): Request {
  const body = res.locals.body as Transform | undefined;
  if (!body) return req;
  return new Proxy(req, {
    get(target, prop) {
      if (STREAM_KEYS.has(prop)) {
        const value = Reflect.get(body, prop) as unknown;
        return typeof value === "function" ? Function.prototype.bind.call(value, body) : value;
      }
      // Getters run on the request itself; methods called through the proxy read through it.
      return Reflect.get(target, prop) as unknown;
    },
  });
}
