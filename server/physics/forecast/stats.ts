/**
 * Quantile of the standard normal distribution, by the rational approximation of P. J. Acklam
 * (relative error below 1.2e-9; common practice), ample for a credibility multiplier.
 */
const A = [-3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1, 2.506628277459239];
const B = [-5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1];
const C = [-7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
const D = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416];

function horner(coefficients: readonly number[], x: number): number {
  let s = 0;
  for (const c of coefficients) s = s * x + c;
  return s;
}

export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError("probability must lie strictly between 0 and 1");
  const low = 0.02425;
  if (p < low) {
    const q = Math.sqrt(-2 * Math.log(p));
    return horner(C, q) / (horner(D, q) * q + 1);
  } else if (p > 1 - low) {
    const q = Math.sqrt(-2 * Math.log(1 - p));
    return -horner(C, q) / (horner(D, q) * q + 1);
  } else {
    const q = p - 0.5;
    const r = q * q;
    return (horner(A, r) * q) / (horner(B, r) * r + 1);
  }
}

/** Multiplier k of sigma in a Gaussian bound: |beta| < k sigma (two-sided) or one-sided. */
export function boundMultiplier(credibility: number, sides: "one" | "two"): number {
  return sides === "two" ? normalQuantile((1 + credibility) / 2) : normalQuantile(credibility);
}
