/**
 * capBodySize (app/server/security.ts): which request bodies are counted as they stream. A body
 * whose Content-Length is within the cap is handed on as it is (Node's parser never passes on more
 * than the declared length); a chunked one is counted; a declared length over the cap is refused.
 */
import { PassThrough } from "node:stream";
import type { NextFunction, Request, Response } from "express";
import { describe, expect, it, vi } from "vitest";
import { capBodySize } from "../../app/server/security";

function request(method: string, path: string, headers: Record<string, string>): Request {
  const stream = new PassThrough();
  return Object.assign(stream, {
    method,
    path,
    get: (name: string) => headers[name.toLowerCase()],
  }) as unknown as Request;
}

function response() {
  const res = { locals: {} as Record<string, unknown>, statusCode: 200, set: vi.fn(), json: vi.fn() };
  res.set.mockReturnValue(res);
  return Object.assign(res, { status: (code: number) => ((res.statusCode = code), res) });
}

const cap = capBodySize({ upload: 12 * 1024 * 1024, api: 512 * 1024, other: 1024 * 1024 });

/** A POST to the analyses endpoint with these headers, through the cap: its response and `next`. */
function post(headers: Record<string, string>) {
  const res = response();
  const next = vi.fn();
  cap(request("POST", "/api/v1/analyses", headers), res as unknown as Response, next as NextFunction);
  return { res, next };
}

describe("capBodySize", () => {
  it("hands a body with a declared length within the cap on without a counting stream", () => {
    const { res, next } = post({ "content-length": "120" });
    expect(next).toHaveBeenCalledOnce();
    expect(res.locals.body).toBeUndefined();
  });

  it("counts a chunked body as it streams", () => {
    const { res, next } = post({ "transfer-encoding": "chunked" });
    expect(next).toHaveBeenCalledOnce();
    expect(res.locals.body).toBeDefined();
  });

  it("refuses a declared length over the path's cap before reading anything", () => {
    const { res, next } = post({ "content-length": String(512 * 1024 + 1) });
    expect(next).not.toHaveBeenCalled();
    expect(res.statusCode).toBe(413);
    expect(res.json).toHaveBeenCalledWith({ error: { message: "The request body is over 512 kB.", issues: [] } });
  });
});
