/** Numbers and unit strings as LaTeX, for the closed forms shown beside a converted limit. */

/** 4 significant figures; scientific notation outside [1e-3, 1e4). */
export function formatLatexNumber(x: number, digits = 4): string {
  if (!Number.isFinite(x)) return x > 0 ? "\\infty" : x < 0 ? "-\\infty" : "\\mathrm{NaN}";
  if (x === 0) return "0";
  const ax = Math.abs(x);
  if (ax >= 1e-3 && ax < 1e4) return trimZeros(x.toPrecision(digits));
  const [mantissa, exponent] = x.toExponential(digits - 1).split("e");
  return `${trimZeros(mantissa!)}\\times10^{${Number(exponent)}}`;
}

function trimZeros(s: string): string {
  return s.includes(".") ? s.replace(/\.?0+$/, "") : s;
}

const UNIT_NAMES: Readonly<Record<string, string>> = {
  km: "\\mathrm{km}",
  m: "\\mathrm{m}",
  um: "\\mu\\mathrm{m}",
  yr: "\\mathrm{yr}",
  s: "\\mathrm{s}",
  eV: "\\mathrm{eV}",
  Mpc: "\\mathrm{Mpc}",
  M_sun: "M_\\odot",
};

/**
 * "km^2" -> \mathrm{km}^{2}; "1/yr" -> \mathrm{yr}^{-1}; "M_sun/yr" -> M_\odot\,\mathrm{yr}^{-1};
 * "eV^(0.5)" -> \mathrm{eV}^{0.5}; "1" and "" -> "" (dimensionless).
 */
export function unitLatex(unit: string): string {
  const u = unit.trim();
  if (u === "" || u === "1") return "";
  const [num, den] = u.split("/", 2) as [string, string | undefined];
  const parts: string[] = [];
  if (num !== "1") parts.push(factorLatex(num, 1));
  if (den !== undefined) parts.push(factorLatex(den, -1));
  return parts.join("\\,");
}

function factorLatex(factor: string, sign: 1 | -1): string {
  const m = /^([A-Za-z_]+)(?:\^\(?(-?[0-9.]+)\)?)?$/.exec(factor.trim());
  if (!m) return `\\mathrm{${factor}}`;
  const name = UNIT_NAMES[m[1]!] ?? `\\mathrm{${m[1]}}`;
  const exponent = (m[2] === undefined ? 1 : Number(m[2])) * sign;
  return exponent === 1 ? name : `${name}^{${exponent}}`;
}
