import type { NextFunction, Request, Response } from "express";
import type { Logger } from "../logger.ts";
import { access, type RouteSpec } from "../http/route.ts";
import { SESSION_COOKIE } from "./session.ts";
import type { PassportInstance } from "./github-passport.ts";
import { safeReturnPath } from "./return-to.ts";

declare module "express-session" {
  interface SessionData {
    returnTo?: string;
  }
}

/**
 * Why a sign-in ended without a session. The client's sign-in page has one sentence per code
 * (client/features/auth/components/sign-in-errors.ts); the codes are the contract.
 */
export type SignInFailure = "access_denied" | "state_mismatch" | "provider_error" | "no_code" | "bad_login_hint" | "login_taken" | "bad_profile";

const LOGIN_HINT = /^[A-Za-z0-9](?:[A-Za-z0-9-]{0,38})$/;

const toSignIn = (res: Response, code: SignInFailure) => res.redirect(302, `/sign-in?error=${code}`);

/**
 * `pendingSessionMs`: the lifetime of the session that only carries an unfinished sign-in (the OAuth
 * state and return_to). A completed sign-in regenerates the session with the full SESSION_TTL_HOURS;
 * an abandoned one leaves a row that expires (and is pruned) within minutes, not weeks.
 */
export function authRoutes(passport: PassportInstance, logger: Logger, pendingSessionMs: number): RouteSpec[] {
  return [
    {
      method: "get",
      path: "/github",
      access: access.public,
      summary: "Start signing in with GitHub (optional login_hint, return_to)",
      tags: ["accounts"],
      errors: [302, 429],
      handler: (req: Request, res: Response, next: NextFunction) => {
        const hint = typeof req.query.login_hint === "string" ? req.query.login_hint : undefined;
        if (hint !== undefined && !LOGIN_HINT.test(hint)) return toSignIn(res, "bad_login_hint");
        if (!req.user) req.session.cookie.maxAge = pendingSessionMs;
        req.session.returnTo = safeReturnPath(req.query.return_to);
        passport.authenticate("github", { login_hint: hint } as object)(req, res, next);
      },
    },
    {
      method: "get",
      path: "/github/callback",
      access: access.public,
      summary: "GitHub sends the browser back here; on success the session is (re)issued",
      tags: ["accounts"],
      errors: [302, 429],
      handler: (req: Request, res: Response, next: NextFunction) => {
        if (typeof req.query.error === "string") {
          // passport-oauth2 would turn any error other than access_denied into an exception.
          return toSignIn(res, req.query.error === "access_denied" ? "access_denied" : "provider_error");
        }
        if (typeof req.query.code !== "string") return toSignIn(res, "no_code");
        const returnTo = safeReturnPath(req.session.returnTo);
        passport.authenticate("github", (err: unknown, user: Express.User | false, info?: { code?: string; message?: string }) => {
          if (err) {
            logger.warn({ err }, "GitHub sign-in failed at the provider");
            return toSignIn(res, "provider_error");
          }
          if (!user) {
            const code = info?.code === "login_taken" || info?.code === "bad_profile" ? info.code : "state_mismatch";
            return toSignIn(res, code);
          }
          // passport 0.7 regenerates the session here: a session id seen before sign-in is worthless after.
          req.logIn(user, (loginErr) => {
            if (loginErr) return next(loginErr);
            res.redirect(302, returnTo);
          });
        })(req, res, next);
      },
    },
    {
      method: "post",
      path: "/signout",
      access: access.public,
      summary: "End the session (a no-op when not signed in)",
      tags: ["accounts"],
      errors: [403],
      handler: (req: Request, res: Response, next: NextFunction) => {
        req.logout((err) => {
          if (err) return next(err);
          req.session.destroy((destroyErr) => {
            if (destroyErr) return next(destroyErr);
            res.clearCookie(SESSION_COOKIE, { path: "/" });
            res.status(204).end();
          });
        });
      },
    },
  ];
}
