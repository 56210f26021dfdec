import { rateLimit } from "express-rate-limit";
import type { RequestHandler } from "express";
import type { Config } from "../config.ts";
import { TooManyRequestsError } from "../errors.ts";

/**
 * Per-address limit for sign-in and token endpoints, the two places worth guessing at. Unset, it is
 * 30 a minute, or 10 000 under NODE_ENV=test so suites never trip it by accident (a test sets a low
 * value on purpose to see the 429).
 */
export function authRateLimit(config: Config): RequestHandler {
  const limit = config.AUTH_RATE_LIMIT_PER_MINUTE ?? (config.NODE_ENV === "test" ? 10_000 : 30);
  return rateLimit({
    windowMs: 60_000,
    limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    handler: (_req, _res, next) => next(new TooManyRequestsError(`Too many sign-in or token requests from your address (limit ${limit} a minute); wait a minute and try again.`)),
  });
}
