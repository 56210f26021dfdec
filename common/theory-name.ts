/** Theory names where space is short: table cells, plot labels. */

// Words that keep a lower-case initial in a theory's abbreviation (dynamical Chern-Simons -> dCS).
const LOWER_INITIAL = new Set(["dynamical", "dilaton"]);

/**
 * A short name for a table cell: the qualifier after a parenthesis or colon dropped, and the trade's
 * abbreviation when the theory's slug is the initials of its name (edgb -> EdGB, dcs -> dCS).
 */
export function shortTheoryName(name: string, slug: string): string {
  const base = name.replace(/\s*[(:].*$/, "").trim() || name;
  const words = base.split(/[\s-]+/).filter(Boolean);
  const initials = words.map((w) => (LOWER_INITIAL.has(w.toLowerCase()) ? w[0]!.toLowerCase() : w[0]!));
  const compact = slug.replace(/-/g, "");
  if (compact.length >= 2 && compact.length <= 5 && compact.length < words.length + 1) {
    const acronym = initials.slice(0, compact.length).join("");
    if (acronym.toLowerCase() === compact) return acronym;
  }
  return base;
}
