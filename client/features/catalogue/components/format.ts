/** Display helpers shared by the catalogue's components. */
import { displayName } from "../../../components/ui/text-format.ts";
import { formatDate } from "../../../../common/dates.ts";

export { displayName, unitLabel } from "../../../components/ui/text-format.ts";

/** A signed number with a true minus sign, as physicists print it (−7, not -7). */
export function signed(n: number): string {
  return n < 0 ? `−${Math.abs(n)}` : String(n);
}

/** "−1PN", "2PN", "0PN (Newtonian order)". */
export function pnLabel(n: number | null): string {
  if (n === null) return "—";
  return `${signed(n)}PN`;
}

/** The app's one date format ("2 Dec 2026"). */
export function shortDate(iso: string): string {
  return formatDate(iso);
}

export function authorList(authors: readonly string[], max = 3): string {
  const names = authors.map(displayName);
  if (names.length <= max) return names.join(", ");
  return `${names.slice(0, max).join(", ")} et al.`;
}

const GREEK = new Set(["alpha", "beta", "gamma", "delta", "epsilon", "zeta", "eta", "theta", "kappa", "lambda", "mu", "nu", "xi", "pi", "rho", "sigma", "tau", "phi", "chi", "psi", "omega", "Gamma", "Delta", "Theta", "Lambda", "Xi", "Pi", "Sigma", "Phi", "Psi", "Omega"]);

/** A plain symbol as TeX: Greek names become letters, underscores subscripts (alpha_13 → \alpha_{13}). */
export function symbolTex(symbol: string): string {
  const [head = symbol, ...rest] = symbol.split("_");
  const base = GREEK.has(head) ? `\\${head}` : head.length > 1 ? `\\mathrm{${head}}` : head;
  return rest.length ? `${base}_{${rest.join(",")}}` : base;
}

/** "lhs = rhs" unless the TeX already states its left-hand side. */
export function equationTex(lhs: string, rhs: string): string {
  return /(^|[^\\<>!])=/.test(rhs) ? rhs : `${lhs} = ${rhs}`;
}

/**
 * A short plain-text factor such as "1/sqrt(8*pi)" as TeX, for display beside its numeric value.
 * Only the few constructs conversion factors use; anything else is shown as typed.
 */
export function factorTex(expr: string): string {
  let s = expr.trim();
  for (let i = 0; i < 5 && /sqrt\(([^()]*)\)/.test(s); i++) s = s.replace(/sqrt\(([^()]*)\)/g, "\\sqrt{$1}");
  s = s.replace(/\bpi\b/g, "\\pi").replace(/\*/g, "\\,");
  const frac = /^([^/]+)\/(.+)$/.exec(s);
  return frac ? `\\frac{${frac[1]}}{${frac[2]}}` : s;
}
