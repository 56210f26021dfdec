import { doubleCsrf } from "csrf-csrf";
import type { Request } from "express";
import type { Config } from "../config.ts";
import { deriveSecret } from "./session.ts";

/**
 * CSRF protection (double-submit cookie, bound to the session id). It applies exactly when the
 * session cookie is what authenticates the request: a request carrying a valid API token cannot be
 * forged by another site (browsers never attach Authorization on their own), and an anonymous request
 * has no authority to abuse, so scripts may POST to public routes without cookies or tokens.
 */
export function csrfProtection(config: Config, secret: string) {
  const production = config.NODE_ENV === "production";
  return doubleCsrf({
    getSecret: () => deriveSecret(secret, "csrf"),
    getSessionIdentifier: (req: Request) => req.session?.id ?? "",
    // __Host- needs Secure, which needs https: production only.
    cookieName: production ? "__Host-dragoman.csrf" : "dragoman.csrf",
    cookieOptions: { sameSite: "strict", secure: production, httpOnly: true, path: "/" },
    getCsrfTokenFromRequest: (req: Request) => req.get("x-csrf-token"),
    skipCsrfProtection: (req: Request) => req.identity?.via !== "session",
  });
}

export type CsrfUtilities = ReturnType<typeof csrfProtection>;
