import cookieParser from "cookie-parser";
import express, { type Express } from "express";
import type { Config } from "../config.ts";
import type { Knex } from "../db/knex.ts";
import type { RouteTable } from "../http/route.ts";
import type { Logger } from "../logger.ts";
import { accountsService, type AccountsService } from "../features/accounts/accounts-service.ts";
import { tokensService, type TokensService } from "../features/accounts/tokens-service.ts";
import { authRoutes } from "./auth-routes.ts";
import { csrfProtection, type CsrfUtilities } from "./csrf.ts";
import { createPassport } from "./github-passport.ts";
import { identityMiddleware } from "./identity-middleware.ts";
import { authRateLimit } from "./rate-limits.ts";
import { securityHeaders } from "./security-headers.ts";
import { sessionMiddleware, sessionSecret } from "./session.ts";

export interface AuthParts {
  accounts: AccountsService;
  tokens: TokensService;
  csrf: CsrfUtilities;
}

/** Where sessions, tokens and CSRF apply. Static client files need none of it (and no database). */
const AUTHENTICATED_PREFIXES = ["/api", "/auth"];

/**
 * Installs, in this order: security headers; rate limits on the guessable endpoints; cookies,
 * session, passport; identity (token or session); CSRF (session-authenticated writes only); the
 * /auth routes. Call it before the API routers are mounted.
 */
export function installAuth(app: Express, table: RouteTable, deps: { db: Knex; config: Config; logger: Logger; clock?: () => Date }): AuthParts {
  const { db, config, logger } = deps;
  const clock = deps.clock ?? (() => new Date());
  const secret = sessionSecret(config, logger);
  const accounts = accountsService(db, { adminLogins: config.ADMIN_LOGINS, clock });
  const tokens = tokensService(db, clock);
  const passport = createPassport(config, accounts);
  const csrf = csrfProtection(config, secret);

  app.use(securityHeaders(config));
  const limiter = authRateLimit(config);
  app.use(["/auth", "/api/v1/tokens"], limiter);

  app.use(AUTHENTICATED_PREFIXES, cookieParser(), sessionMiddleware(db, config, secret), passport.initialize(), passport.session());
  app.use(AUTHENTICATED_PREFIXES, identityMiddleware(tokens));
  app.use(AUTHENTICATED_PREFIXES, csrf.doubleCsrfProtection);

  const auth = express.Router();
  table.mount(auth, "/auth", authRoutes(passport, logger, config.SIGNIN_SESSION_MINUTES * 60_000));
  app.use("/auth", auth);
  return { accounts, tokens, csrf };
}
