import { createHash, randomBytes } from "node:crypto";
import connectPgSimple from "connect-pg-simple";
import session from "express-session";
import type { RequestHandler } from "express";
import type { Config } from "../config.ts";
import type { Knex } from "../db/knex.ts";
import type { Logger } from "../logger.ts";

export const SESSION_COOKIE = "dragoman.sid";
export const SESSION_TABLE = "user_sessions";

/**
 * The secret that signs session cookies (and, derived from it, CSRF tokens). Production requires
 * SESSION_SECRET (config.ts enforces it). Elsewhere a missing secret gets a random one for this process
 * only, so nobody ships a default secret; sessions then end when the server restarts.
 */
export function sessionSecret(config: Config, logger: Logger): string {
  if (config.SESSION_SECRET) return config.SESSION_SECRET;
  logger.warn("SESSION_SECRET is not set: using a random secret, so sign-ins end when the server restarts");
  return randomBytes(32).toString("hex");
}

export const deriveSecret = (secret: string, purpose: string): string =>
  createHash("sha256").update(`${purpose}:${secret}`).digest("hex");

/**
 * connect-pg-simple speaks to "pg-promise"-like objects through `any(sql, params)`. Handing it this
 * adapter over the app's knex pool keeps one connection pool per app (tests drop their databases
 * with force; a second, private pool would be left with dead connections).
 */
function knexAsPgPromise(db: Knex) {
  return {
    any: async (sql: string, params: unknown[] = []): Promise<unknown[]> => {
      const bindings: unknown[] = [];
      const text = sql.replace(/\$(\d+)/g, (_m, n: string) => {
        const v = params[Number(n) - 1];
        bindings.push(v !== null && typeof v === "object" && !(v instanceof Date) ? JSON.stringify(v) : v);
        return "?";
      });
      const result = (await db.raw(text, bindings as Knex.RawBinding[])) as { rows: unknown[] };
      return result.rows;
    },
  };
}

export function sessionMiddleware(db: Knex, config: Config, secret: string): RequestHandler {
  const PgStore = connectPgSimple(session);
  const store = new PgStore({
    pgPromise: knexAsPgPromise(db),
    tableName: SESSION_TABLE,
    createTableIfMissing: false,
    pruneSessionInterval: config.NODE_ENV === "test" ? false : 15 * 60,
  });
  return session({
    name: SESSION_COOKIE,
    secret,
    store,
    resave: false,
    // No row and no cookie for visitors who never start signing in.
    saveUninitialized: false,
    rolling: false,
    cookie: {
      httpOnly: true,
      sameSite: "lax",
      secure: config.NODE_ENV === "production",
      maxAge: config.SESSION_TTL_HOURS * 3600_000,
      path: "/",
    },
  });
}
