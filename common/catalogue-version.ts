import { formatDateTime } from "./dates.ts";

/**
 * The catalogue version token ("15.15.mx5p15fd": entries, sum of their revision numbers, time of
 * the latest change in base 36 milliseconds) read for people: "15 entries, as of 2 Dec 2026, 06:30
 * UTC". The exact token stays in JSON and on hover, since it is what tells two versions apart.
 */
export interface CatalogueVersion {
  token: string;
  entries: number | null;
  changed_at: Date | null;
}

export function readCatalogueVersion(token: string): CatalogueVersion {
  const m = /^(\d+)\.(\d+)\.([0-9a-z]+)$/.exec(token);
  if (!m) return { token, entries: null, changed_at: null };
  const ms = parseInt(m[3]!, 36);
  return { token, entries: Number(m[1]), changed_at: m[3] === "0" || !Number.isFinite(ms) ? null : new Date(ms) };
}

export function catalogueVersionText(token: string): string {
  const v = readCatalogueVersion(token);
  if (v.entries === null) return `version ${token}`;
  const entries = `${v.entries} ${v.entries === 1 ? "entry" : "entries"}`;
  return v.changed_at ? `${entries}, as of ${formatDateTime(v.changed_at)}` : entries;
}
