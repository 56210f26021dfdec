/**
 * Inverting a Fisher matrix the careful way: scale to unit diagonal (s_i = Gamma_ii^(-1/2)),
 * Cholesky-factor the scaled matrix, read the covariance back through the scaling, and measure
 * the condition number of the scaled matrix by its singular values. The singular vector of the
 * smallest singular value names the combination of parameters the data cannot tell apart.
 * Thresholds: a scaled condition number above 1e10 is flagged, above 1e14 (or a failed Cholesky)
 * is refused; values of 1e6-1e8 are normal for an eight-parameter inspiral problem (our own
 * computation). Decompositions come from ml-matrix.
 */
import { CholeskyDecomposition, Matrix, SingularValueDecomposition } from "ml-matrix";

export const FLAG_CONDITION = 1e10;
export const REFUSE_CONDITION = 1e14;

export type InversionStatus = "ok" | "ill_conditioned" | "no_constraint";

export interface Inversion {
  readonly status: InversionStatus;
  /** Condition number of the unit-diagonal matrix (Infinity when singular). */
  readonly condition: number;
  /** Marginalised covariance; absent when refused. */
  readonly covariance: number[][] | null;
  /** The least-constrained combination, e.g. "0.71 beta + 0.70 phi_c", when it matters. */
  readonly degenerateDirection: string | null;
  readonly reason: string | null;
}

function describeDirection(vector: readonly number[], names: readonly string[]): string {
  const terms = vector
    .map((c, i) => ({ c, name: names[i]! }))
    .filter((t) => Math.abs(t.c) >= 0.2)
    .sort((a, b) => Math.abs(b.c) - Math.abs(a.c));
  const sign = terms[0] && terms[0].c < 0 ? -1 : 1;
  return terms
    .map((t, i) => {
      const c = sign * t.c;
      const magnitude = Math.abs(c).toFixed(2);
      if (i === 0) return `${c < 0 ? "-" : ""}${magnitude} ${t.name}`;
      return `${c < 0 ? "-" : "+"} ${magnitude} ${t.name}`;
    })
    .join(" ");
}

export function invertFisher(gamma: readonly (readonly number[])[], names: readonly string[]): Inversion {
  const n = gamma.length;
  const diagonal = gamma.map((row, i) => row[i]!);
  if (diagonal.some((d) => !(d > 0) || !Number.isFinite(d))) {
    const zero = diagonal.map((d, i) => (d > 0 ? null : names[i])).filter((x) => x !== null);
    return {
      status: "no_constraint",
      condition: Infinity,
      covariance: null,
      degenerateDirection: zero.join(", ") || null,
      reason: `the data carry no information on ${zero.join(", ")}`,
    };
  }
  const s = diagonal.map((d) => 1 / Math.sqrt(d));
  const scaled = new Matrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      const v = 0.5 * (gamma[i]![j]! + gamma[j]![i]!) * s[i]! * s[j]!;
      scaled.set(i, j, i === j ? 1 : v);
      scaled.set(j, i, i === j ? 1 : v);
    }
  }
  const svd = new SingularValueDecomposition(scaled, { autoTranspose: false });
  const singular = svd.diagonal;
  const largest = Math.max(...singular);
  const smallestIndex = singular.reduce((best, v, i) => (v < singular[best]! ? i : best), 0);
  const smallest = singular[smallestIndex]!;
  const condition = smallest > 0 ? largest / smallest : Infinity;
  const direction = describeDirection(svd.rightSingularVectors.getColumn(smallestIndex), names);
  const cholesky = new CholeskyDecomposition(scaled);
  if (!cholesky.isPositiveDefinite() || condition > REFUSE_CONDITION) {
    return {
      status: "no_constraint",
      condition,
      covariance: null,
      degenerateDirection: direction,
      reason: `the Fisher matrix is singular for practical purposes (scaled condition number ${condition.toExponential(1)} > ${REFUSE_CONDITION.toExponential(0)}); the data cannot separate ${direction}`,
    };
  }
  const inverse = cholesky.solve(Matrix.eye(n));
  const covariance: number[][] = [];
  for (let i = 0; i < n; i++) {
    const row: number[] = [];
    for (let j = 0; j < n; j++) row.push(s[i]! * inverse.get(i, j) * s[j]!);
    covariance.push(row);
  }
  const flagged = condition > FLAG_CONDITION;
  return {
    status: flagged ? "ill_conditioned" : "ok",
    condition,
    covariance,
    degenerateDirection: flagged ? direction : null,
    reason: flagged
      ? `the Fisher matrix is ill-conditioned (scaled condition number ${condition.toExponential(1)} > ${FLAG_CONDITION.toExponential(0)}): the numbers are fragile; the weakest combination is ${direction}`
      : null,
  };
}
