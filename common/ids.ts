import { z } from "zod";

/** Largest value of a PostgreSQL `integer` column: ids and versions above it cannot exist. */
export const MAX_DB_INT = 2_147_483_647;

/**
 * A database id or version from a path, a query string or a JSON body: plain decimal digits only
 * ("1 ", "0x10" and "1e1" are refused, not coerced), 1 to MAX_DB_INT.
 */
export function dbId(what: string) {
  return z
    .union([z.number(), z.string()], { error: `${what} must be a number` })
    .transform((v, ctx) => {
      const n = typeof v === "number" ? v : /^\d{1,10}$/.test(v) ? Number(v) : Number.NaN;
      if (!Number.isInteger(n) || n < 1 || n > MAX_DB_INT) {
        ctx.addIssue({ code: "custom", message: `${what} must be a whole number from 1 to ${MAX_DB_INT}` });
        return z.NEVER;
      }
      return n;
    });
}
