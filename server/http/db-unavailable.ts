/**
 * Recognises "the database cannot be reached right now" among the errors a request may end with, so
 * the error middleware answers 503 with Retry-After (try again shortly) instead of a 500 (our bug).
 * Covers: connection refused/reset/timed out (node-postgres), knex's pool acquisition timeout, a
 * connection the server ended (shutdown, crash, restart), and PostgreSQL's own "connection exception"
 * (class 08) and "operator intervention" (class 57P) codes, node-postgres's own connection time-out
 * ("timeout expired": the server accepted the connection but never answered), and the circuit
 * breaker's refusal while the database is known to be unreachable (server/db/breaker.ts).
 */
const NETWORK_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EPIPE", "EHOSTUNREACH", "ENETUNREACH", "ENOTFOUND", "EAI_AGAIN"]);
const MESSAGES = [
  /^Knex: Timeout acquiring a connection/,
  /^Connection terminated/,
  /^Connection ended unexpectedly/,
  /^timeout exceeded when trying to connect/,
  /^timeout expired$/,
  /terminating connection due to/,
  /the database system is (starting up|shutting down|in recovery mode)/,
  /^Client has encountered a connection error/,
];

export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (typeof err !== "object" || err === null || depth > 3) return false;
  const e = err as { name?: string; code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
  if (e.name === "KnexTimeoutError" || e.name === "DatabaseUnavailableError") return true;
  if (typeof e.code === "string") {
    if (NETWORK_CODES.has(e.code)) return true;
    if (/^08/.test(e.code) || /^57P0[1-3]$/.test(e.code)) return true;
  }
  if (typeof e.message === "string" && MESSAGES.some((m) => m.test(e.message as string))) return true;
  // AggregateError (a refused connection to every address) and wrapped causes.
  if (Array.isArray(e.errors) && e.errors.some((x) => isDatabaseUnavailable(x, depth + 1))) return true;
  return e.cause !== undefined && isDatabaseUnavailable(e.cause, depth + 1);
}

/** Seconds a client should wait before trying again while the database is unreachable. */
export const DB_RETRY_AFTER_SECONDS = 5;
