import express, { type RequestHandler } from "express";
import { PayloadTooLargeError } from "../errors.ts";
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
  const parse = express.json({ limit });
  const parseWithLimit: RequestHandler = (req, res, next) => {
    parse(req, res, (err?: unknown) => {
      if (err !== undefined && err !== null && typeof err === "object" && (err as { type?: string }).type === "entity.too.large") {
        res.setHeader("Connection", "close");
        return next(tooLarge("it went past the limit while it was being read"));
      }
      next(err);
    });
  };
  return [early, parseWithLimit, yieldAfterLargeBody, bodyTextGuard, yieldAfterLargeBody];
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
