/**
 * What a GR ringdown template infers when a theory shifts a mode: the theory's mode is
 * f = f_Kerr(M_f, chi_f)(1 + df), tau = tau_Kerr(M_f, chi_f)(1 + dtau), and a Kerr template returns
 * the (M', chi') whose Kerr mode has that f and tau [derived].
 *
 * Two answers: the linear one, (d ln M, d chi) = J^-1 (df, dtau) with J from qnmJacobian, and the
 * exact inversion of the fit (f tau = Q / pi depends on the spin alone, so the spin follows from the
 * quality factor and the mass from the frequency). Their difference tells where the linear reading
 * stops being trustworthy.
 */
import { PhysicsInputError, requireFinite } from "../input-error.ts";
import { QNM_FIT_MAX_SPIN, dimensionlessMode, qnmJacobian, type QnmMode } from "./qnm.ts";

export interface QnmShift {
  /** Fractional frequency shift df = delta f / f_Kerr. */
  readonly df: number;
  /** Fractional damping-time shift dtau = delta tau / tau_Kerr. */
  readonly dtau: number;
}

/** J^-1 of qnmJacobian: maps (df, dtau) to (d ln M_f, d chi_f) to first order. */
export function inverseQnmJacobian(mode: QnmMode, chi: number): [[number, number], [number, number]] {
  const [[a, b], [c, d]] = qnmJacobian(mode, chi);
  const det = a * d - b * c;
  return [
    [d / det, -b / det],
    [-c / det, a / det],
  ];
}

/** First-order shift of the inferred remnant: fractional mass shift and absolute spin shift. */
export function linearInferredShift(mode: QnmMode, chi: number, shift: QnmShift): { dlnM: number; dchi: number } {
  const [[a, b], [c, d]] = inverseQnmJacobian(mode, chi);
  return { dlnM: a * shift.df + b * shift.dtau, dchi: c * shift.df + d * shift.dtau };
}

export type ExactInference =
  | { readonly ok: true; readonly M: number; readonly chi: number }
  | { readonly ok: false; readonly reason: string };

/**
 * The Kerr (M', chi') with the shifted mode, by inverting the fit. M in any unit (returned in the same).
 * Fails (ok: false) when no Kerr remnant with 0 <= chi' <= 0.99 has the shifted quality factor.
 */
export function exactInferredRemnant(mode: QnmMode, M: number, chi: number, shift: QnmShift): ExactInference {
  requireFinite("df", shift.df);
  requireFinite("dtau", shift.dtau);
  if (shift.df <= -1) throw new PhysicsInputError("df", "df must be > -1 (a frequency stays positive)");
  if (shift.dtau <= -1) throw new PhysicsInputError("dtau", "dtau must be > -1 (a damping time stays positive)");
  const base = dimensionlessMode(mode, chi);
  const target = base.Q * (1 + shift.df) * (1 + shift.dtau);
  const qAt = (j: number) => dimensionlessMode(mode, j).Q;
  const lo0 = qAt(0);
  const hi0 = qAt(QNM_FIT_MAX_SPIN);
  if (target < lo0 || target > hi0) {
    return {
      ok: false,
      reason: `the shifted quality factor ${target.toPrecision(4)} lies outside the Kerr range ${lo0.toPrecision(4)}..${hi0.toPrecision(4)} of the fit: no Kerr remnant has this mode`,
    };
  }
  let lo = 0;
  let hi = QNM_FIT_MAX_SPIN;
  for (let k = 0; k < 100 && hi - lo > 1e-14; k += 1) {
    const mid = (lo + hi) / 2;
    if (qAt(mid) < target) lo = mid;
    else hi = mid;
  }
  const chiInferred = (lo + hi) / 2;
  const F = dimensionlessMode(mode, chiInferred).F;
  return { ok: true, chi: chiInferred, M: (M * F) / (base.F * (1 + shift.df)) };
}
