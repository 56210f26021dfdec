import type { RequestHandler } from "express";
import { ValidationError } from "../errors.ts";

const MAX_DEPTH = 64;

/** Why a string cannot be stored: PostgreSQL text refuses NUL, and a lone surrogate is not Unicode. */
function badText(s: string): string | undefined {
  if (s.includes("\u0000")) return "contains a NUL character (U+0000)";
  if (!s.isWellFormed()) return "contains a lone UTF-16 surrogate (not valid Unicode)";
  return undefined;
}

function findBad(value: unknown, path: string, depth: number): [string, string] | undefined {
  if (typeof value === "string") {
    const why = badText(value);
    return why ? [path || "body", why] : undefined;
  }
  if (value === null || typeof value !== "object") return undefined;
  if (depth > MAX_DEPTH) return [path || "body", `is nested more than ${MAX_DEPTH} levels deep`];
  const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
  for (const [k, v] of entries) {
    const keyWhy = badText(k);
    const here = path ? `${path}.${k}` : k;
    if (keyWhy) return [here, `key ${keyWhy}`];
    const found = findBad(v, here, depth + 1);
    if (found) return found;
  }
  return undefined;
}

/**
 * One gate for every request, before any route: text that no column could hold gets a 400 naming
 * where it sits, instead of a database error surfacing as a 500 half-way through a write.
 */
export const textGuard: RequestHandler = (req, _res, next) => {
  let decodedPath: string;
  try {
    decodedPath = decodeURIComponent(req.path);
  } catch {
    return next(new ValidationError("The address is not valid percent-encoding.", { path: "malformed percent-encoding" }));
  }
  const pathWhy = badText(decodedPath);
  if (pathWhy) return next(new ValidationError(`The address ${pathWhy}.`, { path: pathWhy }));
  const found = findBad(req.query, "", 0) ?? (req.body === undefined ? undefined : findBad(req.body, "", 0));
  if (found) {
    const [field, why] = found;
    return next(new ValidationError(`${field} ${why}.`, { [field]: why }));
  }
  next();
};
