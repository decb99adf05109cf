import { randomBytes } from "node:crypto";
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

/**
 * Refuse bodies that announce more than the route accepts (JSON API: 256 kB; elsewhere the
 * largest upload), before anything reads them. Answered here, the unread body is drained by
 * Node; refused deeper, a half-read stream can leave the client waiting.
 */
export function capBodySize(limit: number, apiLimit = 256 * 1024) {
  return (req: Request, res: Response, next: NextFunction) => {
    const length = Number(req.get("content-length") ?? 0);
    const max = req.path.startsWith("/api/") ? apiLimit : limit;
    if (length > max) {
      res.set("Connection", "close");
      res.status(413).json({ error: { message: `The request body is over ${max >= 1024 * 1024 ? `${Math.round(max / 1024 / 1024)} MB` : `${Math.round(max / 1024)} kB`}.`, issues: [] } });
      return;
    }
    next();
  };
}
