import express, { type RequestHandler } from "express";
import { AppError, PayloadTooLargeError } from "../errors.ts";
import { bodyTextGuard } from "./text-guard.ts";

/** "1 MiB", "512 KiB", "300 bytes": a limit as people read it. */
export function formatBytes(n: number): string {
  if (n >= 1024 * 1024 && n % (1024 * 1024) === 0) return `${n / (1024 * 1024)} MiB`;
  if (n >= 1024 && n % 1024 === 0) return `${n / 1024} KiB`;
  return `${n} bytes`;
}

/**
 * The JSON body of one route, read only after its access rule and rate limit have let it in, and
 * never past `limit` bytes: a declared Content-Length over the limit is refused before one byte is
 * read (and the connection closed, so the rest is never read either); a body sent without a length
 * is cut off as soon as it passes the limit while streaming. Then the text guard walks what was parsed.
 */
export function jsonBody(limit: number): RequestHandler[] {
  return [...limitedRead(express.json({ limit }), limit), yieldAfterLargeBody, bodyTextGuard, yieldAfterLargeBody];
}

/**
 * The same reading, within the same limits, but the body stays bytes (a Buffer in req.body): its
 * route parses and validates it with readJsonBody (json-body.ts), off the event loop when it is large.
 * Only UTF-8 is read (JSON's own encoding; other charsets get 415 before the body is read).
 */
export function rawJsonBody(limit: number): RequestHandler[] {
  const charset: RequestHandler = (req, _res, next) => {
    const declared = /;\s*charset\s*=\s*"?([^";\s]+)/i.exec(req.headers["content-type"] ?? "")?.[1]?.toLowerCase();
    if (declared !== undefined && declared !== "utf-8" && declared !== "utf8" && req.is("application/json")) {
      return next(new AppError(415, "unsupported_charset", `The request body's charset "${declared}" is not read here: send JSON as UTF-8.`, { body: `charset ${declared}: send UTF-8` }));
    }
    next();
  };
  return [charset, ...limitedRead(express.raw({ type: "application/json", limit }), limit)];
}

/** A body parser behind a check of the announced length, with "too large while streaming" as the same 413. */
function limitedRead(parse: RequestHandler, limit: number): RequestHandler[] {
  const tooLarge = (got: string) =>
    new PayloadTooLargeError(`The request body is too large: ${got}; this route accepts at most ${formatBytes(limit)} (${limit} bytes).`, {
      body: `larger than the limit of ${limit} bytes`,
    });
  const early: RequestHandler = (req, res, next) => {
    const declared = Number(req.headers["content-length"]);
    if (Number.isFinite(declared) && declared > limit) {
      res.setHeader("Connection", "close");
      return next(tooLarge(`${declared} bytes were announced`));
    }
    next();
  };
  const parseWithLimit: RequestHandler = (req, res, next) => {
    parse(req, res, (err?: unknown) => {
      if (err !== undefined && err !== null && typeof err === "object" && (err as { type?: string }).type === "entity.too.large") {
        res.setHeader("Connection", "close");
        return next(tooLarge("it went past the limit while it was being read"));
      }
      next(err);
    });
  };
  return [early, parseWithLimit];
}

/** Bodies above this size give the event loop a turn between parsing, guarding and the handler. */
const YIELD_ABOVE_BYTES = 64 * 1024;

/**
 * Parsing a large body, walking it and validating it are each a few milliseconds to some tens (a
 * 2.4 MB samples body: about 10 ms of JSON.parse, then the guard, then the schema); run back to back
 * they add up to one long stall. A turn of the loop between them lets waiting requests (health, small
 * reads) be answered in between: the longest stall is the longest step, not their sum.
 */
const yieldAfterLargeBody: RequestHandler = (req, _res, next) => {
  const length = Number(req.headers["content-length"]);
  if (Number.isFinite(length) && length <= YIELD_ABOVE_BYTES) return next();
  setImmediate(next);
};
