/** 2 x 2 linear algebra for the deviation plane: small enough that a library would only add weight. */
import { PhysicsInputError } from "../input-error.ts";

export type Vector2 = [number, number];
export type Matrix2 = [[number, number], [number, number]];

/** Throws unless the matrix is symmetric and positive definite; `field` names it in the message. */
export function checkPositiveDefinite2(m: Matrix2, field: string): void {
  const [[a, b], [c, d]] = m;
  if (![a, b, c, d].every(Number.isFinite)) throw new PhysicsInputError(field, `${field} must contain finite numbers`);
  const scale = Math.max(Math.abs(b), Math.abs(c), 1e-300);
  if (Math.abs(b - c) > 1e-9 * scale) throw new PhysicsInputError(field, `${field} must be symmetric`);
  if (!(a > 0) || !(d > 0) || !(a * d - b * c > 0)) {
    throw new PhysicsInputError(field, `${field} is not positive definite (its diagonal and determinant must be positive)`);
  }
}

export function inverse2(m: Matrix2, field: string): Matrix2 {
  checkPositiveDefinite2(m, field);
  const [[a, b], [c, d]] = m;
  const det = a * d - b * c;
  return [
    [d / det, -b / det],
    [-c / det, a / det],
  ];
}

export function quadraticForm2(m: Matrix2, v: Vector2): number {
  return v[0] * (m[0][0] * v[0] + m[0][1] * v[1]) + v[1] * (m[1][0] * v[0] + m[1][1] * v[1]);
}

/** Lower Cholesky factor L with L L^T = m. */
export function choleskyLower2(m: Matrix2, field: string): Matrix2 {
  checkPositiveDefinite2(m, field);
  const l00 = Math.sqrt(m[0][0]);
  const l10 = m[1][0] / l00;
  const l11 = Math.sqrt(m[1][1] - l10 * l10);
  return [
    [l00, 0],
    [l10, l11],
  ];
}
