import type { RequestHandler } from "express";
import { UnauthorizedError } from "../errors.ts";
import type { TokensService } from "../features/accounts/tokens-service.ts";

/**
 * Sets req.identity from an API token (Authorization: Bearer) or from the signed-in session, in that
 * order. A presented token that does not work is an error (401), never a silent fall-back to the
 * session or to anonymous: a script with a revoked token should hear about it.
 */
export function identityMiddleware(tokens: TokensService): RequestHandler {
  return async (req, _res, next) => {
    const header = req.get("authorization");
    if (header !== undefined) {
      const m = /^Bearer\s+(\S+)\s*$/i.exec(header);
      if (!m?.[1]) throw new UnauthorizedError('The Authorization header must read "Bearer <API token>".');
      req.identity = await tokens.authenticate(m[1]);
      return next();
    }
    if (req.user) req.identity = { ...req.user, via: "session" };
    next();
  };
}
