import helmet from "helmet";
import type { RequestHandler } from "express";
import type { Config } from "../config.ts";

/**
 * Content Security Policy: our own origin only. KaTeX positions glyphs with inline style attributes,
 * hence 'unsafe-inline' for styles (never for scripts); fonts under 4 kB are inlined as data: URLs.
 */
export function securityHeaders(config: Config): RequestHandler {
  const production = config.NODE_ENV === "production";
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        "default-src": ["'self'"],
        "script-src": ["'self'"],
        "script-src-attr": ["'none'"],
        "style-src": ["'self'", "'unsafe-inline'"],
        "font-src": ["'self'", "data:"],
        "img-src": ["'self'", "data:"],
        "connect-src": ["'self'"],
        "object-src": ["'none'"],
        "base-uri": ["'self'"],
        "form-action": ["'self'"],
        "frame-ancestors": ["'none'"],
        ...(production ? { "upgrade-insecure-requests": [] } : {}),
      },
    },
    // HSTS over plain-http localhost would only confuse browsers.
    strictTransportSecurity: production,
  });
}
