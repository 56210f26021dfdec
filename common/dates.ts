/**
 * The one date format of every page, e-mail and export: "2 Dec 2026" and, where the hour matters,
 * "2 Dec 2026, 14:05 UTC". Always in UTC, so two readers in different places see the same words.
 */
const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"] as const;

function asDate(when: string | Date): Date | null {
  const d = when instanceof Date ? when : new Date(when);
  return Number.isNaN(d.getTime()) ? null : d;
}

export function formatDate(when: string | Date): string {
  const d = asDate(when);
  if (!d) return String(when);
  return `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()}`;
}

export function formatDateTime(when: string | Date): string {
  const d = asDate(when);
  if (!d) return String(when);
  const hh = String(d.getUTCHours()).padStart(2, "0");
  const mm = String(d.getUTCMinutes()).padStart(2, "0");
  return `${formatDate(d)}, ${hh}:${mm} UTC`;
}
