/** Small text formatting used by more than one feature (units, author names, numbers). Symbols and formulas as text: common/symbol-text.ts. */

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

export { sciText, thresholdText } from "../../../common/number-text.ts";
