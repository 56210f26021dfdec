/** Numbers as a physicist writes them, in pages, sentences and exports alike. */

const SUPERSCRIPT: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", "/": "ᐟ" };

/**
 * A threshold as people write it: 1/6 rather than 0.16666666666666666, 0.5 rather than 0.5000; a
 * value that is no simple fraction keeps three significant figures.
 */
export function thresholdText(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (Number.isInteger(x)) return String(x);
  for (let d = 2; d <= 12; d++) {
    const n = Math.round(x * d);
    if (n !== 0 && Math.abs(x * d - n) < 1e-9 * d && Math.abs(n) < 100) {
      const g = gcd(Math.abs(n), d);
      if (g === 1) return d === 2 || d === 4 || d === 5 || d === 10 ? String(Number(x.toPrecision(3))) : `${n}/${d}`;
    }
  }
  return sciText(x, 3);
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

/** 1.27e-23 → "1.27 × 10⁻²³" (as printed in papers); ordinary magnitudes stay plain. */
export function sciText(x: number, digits = 3): string {
  if (x === 0 || !Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e5) return String(Number(x.toPrecision(digits)));
  const [mantissa = "", exponent = "0"] = x.toExponential(digits - 1).split("e");
  const m = String(Number(mantissa));
  const e = [...String(Number(exponent))].map((ch) => SUPERSCRIPT[ch] ?? ch).join("");
  return `${m.replace("-", "−")} × 10${e}`;
}

/** "km^2" -> km², "1/yr" -> yr⁻¹, "1" -> "" (dimensionless). */
export function unitText(unit: string): string {
  const u = unit.trim();
  if (u === "" || u === "1") return "";
  const sup: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", ".": "·" };
  const power = (p: string) => [...p].map((c) => sup[c] ?? c).join("");
  const one = (f: string, sign: 1 | -1) => {
    const m = /^([A-Za-z_]+)(?:\^\(?(-?[0-9.]+)\)?)?$/.exec(f.trim());
    if (!m) return f;
    const name = m[1] === "M_sun" ? "M☉" : m[1] === "um" ? "µm" : m[1]!;
    const e = (m[2] === undefined ? 1 : Number(m[2])) * sign;
    return e === 1 ? name : `${name}${power(String(e))}`;
  };
  const [num, den] = u.split("/", 2) as [string, string | undefined];
  return [num === "1" ? "" : one(num, 1), den === undefined ? "" : one(den, -1)].filter(Boolean).join(" ");
}
