/**
 * The coupling at which a theory's shifts of the ringdown would make the IMR consistency test exclude
 * GR (the method of Carson & Yagi 2020, arXiv:2002.08559, as reconstructed here [derived]):
 *
 * 1. inspiral estimate: the GR remnant of the binary, moved by the linear bias of a GR template fitted to
 *    the theory's ppE term when the caller supplies it (`inspiral`, from forecast-widths.ts);
 * 2. merger-ringdown estimate: the Kerr remnant a GR template infers from the theory's shifted
 *    (2,2,0) mode, by the exact inversion of the Kerr fit (C.2);
 * 3. the deviation mu(x) and the test's covariance give d^2(x) and Q_GR(x) = 1 - exp(-d^2/2); the
 *    bound is the smallest |x| on each physical side with Q_GR = p.
 *
 * The linear (Jacobian) reading of step 2 is computed beside the exact one; where they part by more
 * than 10 % the first-order picture of the shift is no longer trustworthy, which is reported.
 */
import { PhysicsInputError } from "../input-error.ts";
import { deviationMean, type DeviationGaussian } from "./gaussian-consistency.ts";
import { exactInferredRemnant, linearInferredShift } from "./inferred-remnant.ts";
import { inverse2, quadraticForm2, type Matrix2, type Vector2 } from "./matrix2.ts";
import type { QnmMode } from "./qnm.ts";

export interface ShiftFunctions {
  /** Fractional frequency and damping-time shifts of the mode at coupling x (0 when the theory has none). */
  readonly df: (x: number) => number;
  readonly dtau: (x: number) => number;
}

/** Fractional shifts of an estimate's (M_f, chi_f) at coupling x (dM_f/M_f, dchi_f/chi_f). */
export interface RemnantShiftFunctions {
  readonly dM: (x: number) => number;
  readonly dchi: (x: number) => number;
}

export interface ExclusionInput {
  readonly mode: QnmMode;
  /** How the template's misreading is computed: exact inversion of the fit (default) or the Jacobian. */
  readonly reading?: "exact" | "linear";
  /** True remnant (any mass unit) and spin. */
  readonly M: number;
  readonly chi: number;
  readonly shifts: ShiftFunctions;
  /**
   * The theory's shift of the true remnant (remnant mappings). The merger-ringdown analysis sees the
   * shifted remnant through the shifted modes; the inspiral analysis, which pushes GR-inferred
   * component parameters through GR remnant fits, does not see it.
   */
  readonly remnant?: RemnantShiftFunctions;
  /** The bias of the inspiral estimate at coupling x (from the theory's inspiral term), when modelled. */
  readonly inspiral?: RemnantShiftFunctions;
  /**
   * One standard deviation of the inspiral estimate, as (sigma(ln M_f), sigma(chi_f)/chi): the linear
   * bias is trusted only while the shift it gives stays within about one (Cutler & Vallisneri 2007).
   */
  readonly inspiralSigma?: Vector2;
  /** Covariance of the deviation variables (dM, dchi) of the test. */
  readonly covariance: Matrix2;
  readonly credibility: number;
  /** Which signs of the coupling are physical. */
  readonly sides: readonly (1 | -1)[];
}

export interface TrackPoint {
  readonly x: number;
  readonly mean: Vector2;
  readonly linear_mean: Vector2;
  readonly gr_quantile: number;
}

export interface SideExclusion {
  readonly side: 1 | -1;
  /** Smallest |x| (signed) with Q_GR = credibility, or null with the reason. */
  readonly x: number | null;
  readonly reason?: string;
  /** Smallest |x| (signed) at which the linear and exact deviations differ by more than 10 %. */
  readonly linear_breaks_at: number | null;
  /** Smallest |x| (signed), up to the bound, at which the inspiral bias exceeds one standard deviation of the inspiral estimate. */
  readonly bias_exceeds_sigma_at: number | null;
  /** The inspiral bias at the bound, in standard deviations of the inspiral estimate (the larger of the two). */
  readonly bias_sigmas_at_bound: number | null;
}

export interface ExclusionResult {
  readonly sides: SideExclusion[];
  readonly track: TrackPoint[];
}

const MIN_T = 1e-30;
const MAX_T = 1e30;
const PER_DECADE = 8;

export function evaluateAt(input: ExclusionInput, x: number, inv: Matrix2): TrackPoint | null {
  const df = input.shifts.df(x);
  const dtau = input.shifts.dtau(x);
  const rM = input.remnant ? input.remnant.dM(x) : 0;
  const rChi = input.remnant ? input.remnant.dchi(x) : 0;
  const iM = input.inspiral ? input.inspiral.dM(x) : 0;
  const iChi = input.inspiral ? input.inspiral.dchi(x) : 0;
  if (![df, dtau, rM, rChi, iM, iChi].every(Number.isFinite) || df <= -1 || dtau <= -1 || rM <= -1 || iM <= -1) return null;
  // The true remnant, and the inspiral's (GR-fit) estimate of it.
  const Mt = input.M * (1 + rM);
  const chiT = input.chi * (1 + rChi);
  const MI = input.M * (1 + iM);
  const chiI = input.chi * (1 + iChi);
  if (!(chiT > 0 && chiT < 1 && chiI > 0 && chiI < 1)) return null;
  const exact = exactInferredRemnant(input.mode, Mt, chiT, { df, dtau });
  if (!exact.ok) return null;
  const lin = linearInferredShift(input.mode, chiT, { df, dtau });
  const mean = deviationMean(MI, chiI, exact.M, exact.chi);
  const linear_mean = deviationMean(MI, chiI, Mt * Math.exp(lin.dlnM), chiT + lin.dchi);
  const used = input.reading === "linear" ? linear_mean : mean;
  return { x, mean, linear_mean, gr_quantile: 1 - Math.exp(-quadraticForm2(inv, used) / 2) };
}

/** The inspiral bias at x in standard deviations of the inspiral estimate (the larger of M_f and chi_f), or null when not modelled. */
export function inspiralBiasSigmas(input: ExclusionInput, x: number): number | null {
  if (!input.inspiral || !input.inspiralSigma) return null;
  const dM = input.inspiral.dM(x);
  const dChi = input.inspiral.dchi(x);
  if (!(dM > -1) || !Number.isFinite(dChi)) return Infinity;
  return Math.max(Math.abs(Math.log1p(dM)) / input.inspiralSigma[0], Math.abs(dChi) / input.inspiralSigma[1]);
}

function linearGap(p: TrackPoint): number {
  const dx = p.mean[0] - p.linear_mean[0];
  const dy = p.mean[1] - p.linear_mean[1];
  const norm = Math.hypot(p.mean[0], p.mean[1]);
  // Below 1e-6 the exact inversion's own precision (1e-14 in the spin) dominates any difference.
  return norm < 1e-6 ? 0 : Math.hypot(dx, dy) / norm;
}

export function couplingExclusion(input: ExclusionInput): ExclusionResult {
  if (!(input.credibility > 0 && input.credibility < 1)) throw new PhysicsInputError("credibility", "credibility must lie strictly between 0 and 1");
  const inv = inverse2(input.covariance, "covariance");
  const sides: SideExclusion[] = [];
  const factor = 10 ** (1 / PER_DECADE);
  let xMax = 0;
  for (const side of input.sides) {
    let prev = MIN_T;
    let found: number | null = null;
    let reason: string | undefined;
    let linearBreak: number | null = null;
    let biasPast: number | null = null;
    let biasPrev = MIN_T;
    for (let t = MIN_T * factor; t <= MAX_T; t *= factor) {
      const p = evaluateAt(input, side * t, inv);
      if (!p) {
        reason = `beyond |x| ~ ${prev.toPrecision(3)} the shifted mode matches no Kerr remnant (or a shift reaches -100 %, or a spin leaves (0, 1)), before the test excludes GR`;
        break;
      }
      if (linearBreak === null && linearGap(p) > 0.1) linearBreak = side * t;
      if (biasPast === null && (inspiralBiasSigmas(input, side * t) ?? 0) > 1) biasPast = t;
      else if (biasPast === null) biasPrev = t;
      if (p.gr_quantile >= input.credibility) {
        let a = prev;
        let b = t;
        for (let k = 0; k < 200 && b / a - 1 > 1e-12; k += 1) {
          const mid = Math.sqrt(a * b);
          const q = evaluateAt(input, side * mid, inv);
          if (q && q.gr_quantile < input.credibility) a = mid;
          else b = mid;
        }
        found = side * b;
        break;
      }
      prev = t;
    }
    if (found === null && reason === undefined) reason = "the test never excludes GR on this side (the theory's shift saturates or vanishes)";
    if (found !== null) xMax = Math.max(xMax, Math.abs(found));
    // Between the last grid point and the bound the bias may still have passed one standard deviation.
    if (biasPast === null && found !== null && (inspiralBiasSigmas(input, found) ?? 0) > 1) biasPast = Math.abs(found);
    // Where the bias passes one standard deviation, to the grid's precision refined by bisection; not past the bound.
    let biasAt: number | null = null;
    if (biasPast !== null) {
      let a = biasPrev;
      let b = biasPast;
      for (let k = 0; k < 200 && b / a - 1 > 1e-12; k += 1) {
        const mid = Math.sqrt(a * b);
        if ((inspiralBiasSigmas(input, side * mid) ?? 0) > 1) b = mid;
        else a = mid;
      }
      if (found === null || b <= Math.abs(found)) biasAt = side * b;
    }
    sides.push({
      side,
      x: found,
      ...(reason ? { reason } : {}),
      linear_breaks_at: linearBreak,
      bias_exceeds_sigma_at: biasAt,
      bias_sigmas_at_bound: found === null ? null : inspiralBiasSigmas(input, found),
    });
  }
  // Track for the plot: 60 points out to 1.5 times the largest bound, on each physical side.
  const track: TrackPoint[] = [];
  if (xMax > 0) {
    for (const side of input.sides) {
      for (let k = 0; k <= 60; k += 1) {
        const p = evaluateAt(input, (side * 1.5 * xMax * k) / 60, inv);
        if (p) track.push(p);
      }
    }
    track.sort((a, b) => a.x - b.x);
  }
  return { sides, track };
}

/** The deviation covariance of a test whose two estimates have these widths, at the GR point (M, chi). */
export function testCovarianceAtGr(M: number, chi: number, covI: Matrix2, covR: Matrix2): DeviationGaussian["covariance"] {
  // At M_I = M_R = M and chi_I = chi_R = chi, J_I = diag(1/M, 1/chi) and J_R = -J_I (derived from the delta method).
  const j: Vector2 = [1 / M, 1 / chi];
  const out: Matrix2 = [
    [0, 0],
    [0, 0],
  ];
  for (let a = 0; a < 2; a += 1) for (let b = 0; b < 2; b += 1) out[a]![b] = j[a]! * j[b]! * (covI[a]![b]! + covR[a]![b]!);
  return out;
}
