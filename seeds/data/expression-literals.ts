/**
 * Writes a derived constant into an expression string without relying on exponent notation:
 * 4.37e-20 -> (4.37*10^(-20)). Keeps catalogue expressions in the plain infix syntax while the
 * constants themselves come from server/physics/units.ts rather than being typed twice.
 */
export function literal(x: number): string {
  if (!Number.isFinite(x)) throw new RangeError(`not a finite constant: ${x}`);
  const [mantissa, exponent] = x.toExponential(15).split("e") as [string, string];
  const e = Number(exponent);
  const m = mantissa.replace(/\.?0+$/, "");
  if (e === 0) return x < 0 ? `(${m})` : m;
  return `(${m}*10^(${e}))`;
}
