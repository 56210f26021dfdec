import { ApiError } from "../../../lib/api-client.ts";

/** The newer version a 409 names (details first, then the sentence), or undefined if it names none. */
export function newerVersion(err: unknown): number | undefined {
  if (!(err instanceof ApiError) || err.status !== 409) return undefined;
  for (const key of ["current_version", "latest_version", "newer_version", "version"]) {
    const v = err.details[key];
    if (typeof v === "number" && Number.isInteger(v)) return v;
  }
  const m = /version\s+(\d+)/i.exec(err.message);
  return m ? Number(m[1]) : undefined;
}

/** A 409 about versions (stale save), as opposed to one about the submission's state. */
export function isStaleVersion(err: unknown): boolean {
  return newerVersion(err) !== undefined;
}
