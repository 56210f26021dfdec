/** Small text formatting used by more than one feature (units, author names, numbers). */

/** "Yunes, Nicolas" → "Nicolas Yunes", so a list of names can be joined with commas unambiguously. */
export function displayName(name: string): string {
  const m = /^([^,]+),\s*(.+)$/.exec(name.trim());
  return m ? `${m[2]} ${m[1]}` : name.trim();
}

const SUPERSCRIPT: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", "/": "ᐟ" };

/** "km^2" → "km²", "1/km" stays; a unit of "1" reads "dimensionless". */
export function unitLabel(unit: string): string {
  if (unit.trim() === "1" || unit.trim() === "") return "dimensionless";
  return unit.replace(/\^(-?[0-9/]+)/g, (_, p: string) => [...p].map((ch) => SUPERSCRIPT[ch] ?? ch).join(""));
}

/** A number short enough to read, long enough to check: 4 significant figures, exponent when tiny or huge. */
export function shortNumber(x: number): string {
  if (x === 0 || !Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  return a < 0.01 || a >= 1e5 ? x.toExponential(3) : String(Number(x.toPrecision(4)));
}

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
