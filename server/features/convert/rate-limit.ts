import type { RequestHandler } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import type { Config } from "../../config.ts";
import { TooManyRequestsError } from "../../errors.ts";

/**
 * The translator is open to anonymous callers, and a table or upload can ask for a few thousand
 * conversions at once, so its routes share one per-client budget per minute (RATE_LIMIT_PER_MINUTE).
 * Signed-in callers are counted by account, others by address. One limiter per app (keyed by its
 * config object), shared by every translating route, so test apps never share a budget.
 */
const perApp = new WeakMap<Config, RequestHandler>();

export function convertRateLimit(config: Config): RequestHandler {
  let limiter = perApp.get(config);
  if (!limiter) {
    limiter = createLimiter(config.RATE_LIMIT_PER_MINUTE);
    perApp.set(config, limiter);
  }
  return limiter;
}

function createLimiter(perMinute: number): RequestHandler {
  return rateLimit({
    windowMs: 60_000,
    limit: perMinute,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    // IPv6 callers are grouped by /56 (the library's default), so one host cannot rotate addresses.
    keyGenerator: (req) => (req.identity ? `user:${req.identity.id}` : `ip:${ipKeyGenerator(req.ip ?? "unknown")}`),
    handler: (_req, _res, next) => next(new TooManyRequestsError("Too many translations from this client; wait a minute and try again.")),
  });
}
