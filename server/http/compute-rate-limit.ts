import type { RequestHandler } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import type { Config } from "../config.ts";
import { TooManyRequestsError } from "../errors.ts";

/**
 * Per-address limit for the anonymous compute routes (expression checks, derivations, conversions):
 * they run CPU work, so a script in a loop must not starve everyone else. RATE_LIMIT_PER_MINUTE
 * (tests/helpers/app.ts lifts it for suites; a test that wants to see the 429 sets it low).
 */
export function computeRateLimit(config: Config, scope: string): RequestHandler {
  const limit = config.RATE_LIMIT_PER_MINUTE;
  return rateLimit({
    windowMs: 60_000,
    limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    keyGenerator: (req) => `${scope}:${ipKeyGenerator(req.ip ?? "unknown")}`,
    handler: (_req, _res, next) => next(new TooManyRequestsError(`Too many ${scope} requests from your address (limit ${limit} a minute); wait a minute and try again.`)),
  });
}
