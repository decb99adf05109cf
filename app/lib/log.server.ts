/**
 * The server's structured log: one JSON line per event on stdout (pino). Request lines carry the
 * request id, route, status, duration and user id; never bodies, query strings, cookies or
 * authorisation headers (nothing here logs them, and `redact` drops them should an object that
 * holds them be logged by mistake). LOG_LEVEL sets the level (default `info`; `silent` for none).
 */
import pino, { type Logger } from "pino";

declare global {
  var __fallwrightLog: Logger | undefined;
}

export const REDACT_PATHS = [
  "password",
  "*.password",
  "current",
  "*.current",
  "token",
  "*.token",
  "cookie",
  "*.cookie",
  "headers.cookie",
  "headers.authorization",
  "*.headers.cookie",
  "*.headers.authorization",
  "req.headers.cookie",
  "req.headers.authorization",
  "body",
  "*.body",
];

export function log(): Logger {
  globalThis.__fallwrightLog ??= pino({
    level: process.env.LOG_LEVEL ?? "info",
    base: { app: "fallwright", pid: process.pid },
    redact: { paths: REDACT_PATHS, censor: "[redacted]" },
    timestamp: pino.stdTimeFunctions.isoTime,
  });
  return globalThis.__fallwrightLog;
}
