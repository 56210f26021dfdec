/**
 * Numbers as physicists read them: three significant figures, scientific notation outside
 * [1e-3, 1e4), written with a real superscript rather than "e-23".
 */
export function splitScientific(x: number, digits = 3): { mantissa: string; exponent: number | null } {
  if (!Number.isFinite(x)) return { mantissa: x > 0 ? "∞" : x < 0 ? "−∞" : "NaN", exponent: null };
  if (x === 0) return { mantissa: "0", exponent: null };
  const ax = Math.abs(x);
  if (ax >= 1e-3 && ax < 1e4) return { mantissa: Number(x.toPrecision(digits)).toString().replace("-", "−"), exponent: null };
  const [m, e] = x.toExponential(digits - 1).split("e");
  return { mantissa: (m ?? "").replace("-", "−"), exponent: Number(e) };
}

/** Plain-text form for titles and SVG labels: "1.27×10⁻²³". */
export function formatPlain(x: number, digits = 3): string {
  const { mantissa, exponent } = splitScientific(x, digits);
  return exponent === null ? mantissa : `${mantissa}×10${superscript(exponent)}`;
}

function superscript(k: number): string {
  return [...String(k)].map((c) => SUPERSCRIPT[c] ?? c).join("");
}

export function SciNumber({ value, digits = 3, className = "" }: { value: number; digits?: number; className?: string }) {
  const { mantissa, exponent } = splitScientific(value, digits);
  return (
    <span className={`whitespace-nowrap tabular-nums ${className}`} data-value={value}>
      {mantissa}
      {exponent !== null && (
        <>
          ×10<sup>{String(exponent).replace("-", "−")}</sup>
        </>
      )}
    </span>
  );
}

export { unitText } from "../../../../common/number-text.ts";

const SUPERSCRIPT: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };

/** Axis label for a log scale: "10⁻³" at each decade, nothing in between (SI prefixes read oddly for β). */
export function decadeLabel(d: number): string {
  if (!(d > 0)) return "";
  const e = Math.log10(d);
  const k = Math.round(e);
  if (Math.abs(e - k) > 1e-9) return "";
  if (k === 0) return "1";
  if (k === 1) return "10";
  return `10${superscript(k)}`;
}
