/**
 * The inspiral-merger-ringdown consistency test from two Gaussian estimates of the remnant
 * (Ghosh et al. 2016, Phys. Rev. D 94, 021101; Ghosh et al. 2018, Class. Quantum Grav. 35, 014002).
 *
 * Deviation variables, normalised by the MEAN of the two estimates (not by a GR value):
 *   dM = 2 (M_I - M_R) / (M_I + M_R),  dchi = 2 (chi_I - chi_R) / (chi_I + chi_R).
 * Their covariance follows from the two independent estimates to first order (delta method) [derived]:
 *   J_I = diag(4 M_R/(M_I + M_R)^2, 4 chi_R/(chi_I + chi_R)^2), J_R = diag(-4 M_I/(..)^2, -4 chi_I/(..)^2),
 *   Sigma = J_I Sigma_I J_I^T + J_R Sigma_R J_R^T.
 * For a 2-D Gaussian the squared Mahalanobis distance is chi-square with two degrees of freedom, so the
 * credible level of the contour through (0, 0) is Q_GR = 1 - exp(-d^2 / 2) and the region at level p
 * is d^2 <= -2 ln(1 - p) [derived].
 */
import { PhysicsInputError, requireFinite } from "../input-error.ts";
import { type Matrix2, type Vector2, choleskyLower2, inverse2, quadraticForm2 } from "./matrix2.ts";

export interface RemnantSummary {
  readonly M_f: number;
  readonly chi_f: number;
  readonly sigma_M_f: number;
  readonly sigma_chi_f: number;
  /** Correlation of M_f and chi_f in this estimate, |rho| < 1. */
  readonly rho: number;
}

export interface DeviationGaussian {
  readonly mean: Vector2;
  readonly covariance: Matrix2;
}

/** Below this |mean spin| the spin deviation's denominator is too small to mean anything. */
export const MIN_MEAN_SPIN = 0.05;

export function checkSummary(s: RemnantSummary, prefix: string): void {
  const f = (k: keyof RemnantSummary) => `${prefix}.${k}`;
  for (const k of ["M_f", "chi_f", "sigma_M_f", "sigma_chi_f", "rho"] as const) requireFinite(f(k), s[k]);
  if (s.M_f <= 0) throw new PhysicsInputError(f("M_f"), `${f("M_f")} must be positive (solar masses)`);
  if (Math.abs(s.chi_f) >= 1) throw new PhysicsInputError(f("chi_f"), `${f("chi_f")} must satisfy |chi_f| < 1 (a Kerr black hole)`);
  if (s.sigma_M_f <= 0) throw new PhysicsInputError(f("sigma_M_f"), `${f("sigma_M_f")} must be positive`);
  if (s.sigma_chi_f <= 0) throw new PhysicsInputError(f("sigma_chi_f"), `${f("sigma_chi_f")} must be positive`);
  if (Math.abs(s.rho) >= 1) {
    throw new PhysicsInputError(f("rho"), `${f("rho")} must satisfy |rho| < 1, or the covariance matrix is not positive definite`);
  }
}

export function summaryCovariance(s: RemnantSummary): Matrix2 {
  const c = s.rho * s.sigma_M_f * s.sigma_chi_f;
  return [
    [s.sigma_M_f ** 2, c],
    [c, s.sigma_chi_f ** 2],
  ];
}

/** Refuses a mean spin so close to zero that dchi is ill-defined. */
export function checkMeanSpin(chiI: number, chiR: number, field: string): void {
  const mean = (chiI + chiR) / 2;
  if (Math.abs(mean) < MIN_MEAN_SPIN) {
    throw new PhysicsInputError(
      field,
      `the mean remnant spin (${mean.toPrecision(3)}) is within ${MIN_MEAN_SPIN} of zero: the spin deviation 2 (chi_I - chi_R)/(chi_I + chi_R) is ill-defined there`,
    );
  }
}

/** Mean of the deviation variables for two point estimates. */
export function deviationMean(MI: number, chiI: number, MR: number, chiR: number): Vector2 {
  return [(2 * (MI - MR)) / (MI + MR), (2 * (chiI - chiR)) / (chiI + chiR)];
}

/** Delta-method propagation of two independent covariances (each in (M_f, chi_f)) onto (dM, dchi). */
export function deviationCovariance(MI: number, chiI: number, MR: number, chiR: number, covI: Matrix2, covR: Matrix2): Matrix2 {
  const sM = MI + MR;
  const sC = chiI + chiR;
  const jI: Vector2 = [(4 * MR) / (sM * sM), (4 * chiR) / (sC * sC)];
  const jR: Vector2 = [(-4 * MI) / (sM * sM), (-4 * chiI) / (sC * sC)];
  const out: Matrix2 = [
    [0, 0],
    [0, 0],
  ];
  for (let a = 0; a < 2; a += 1) {
    for (let b = 0; b < 2; b += 1) {
      out[a]![b] = jI[a]! * jI[b]! * covI[a]![b]! + jR[a]! * jR[b]! * covR[a]![b]!;
    }
  }
  return out;
}

export function gaussianDeviation(inspiral: RemnantSummary, mergerRingdown: RemnantSummary): DeviationGaussian {
  checkSummary(inspiral, "inspiral");
  checkSummary(mergerRingdown, "merger_ringdown");
  checkMeanSpin(inspiral.chi_f, mergerRingdown.chi_f, "merger_ringdown.chi_f");
  const { M_f: MI, chi_f: cI } = inspiral;
  const { M_f: MR, chi_f: cR } = mergerRingdown;
  return {
    mean: deviationMean(MI, cI, MR, cR),
    covariance: deviationCovariance(MI, cI, MR, cR, summaryCovariance(inspiral), summaryCovariance(mergerRingdown)),
  };
}

/** Squared Mahalanobis distance of the point `at` from the Gaussian. */
export function mahalanobis2(g: DeviationGaussian, at: Vector2 = [0, 0]): number {
  const d: Vector2 = [at[0] - g.mean[0], at[1] - g.mean[1]];
  return quadraticForm2(inverse2(g.covariance, "covariance"), d);
}

/** Credible level of the contour through (0, 0): 1 - exp(-d^2/2). */
export function gaussianGrQuantile(g: DeviationGaussian): number {
  return 1 - Math.exp(-mahalanobis2(g) / 2);
}

/** Squared radius of the credible region at level p: -2 ln(1 - p). */
export function chiSquare2Quantile(p: number): number {
  return -2 * Math.log(1 - p);
}

/** Closed ellipse of the credible region at level p, as `points` vertices (the first repeated last). */
export function gaussianContour(g: DeviationGaussian, level: number, points = 120): Vector2[] {
  const L = choleskyLower2(g.covariance, "covariance");
  const r = Math.sqrt(chiSquare2Quantile(level));
  const out: Vector2[] = [];
  for (let k = 0; k <= points; k += 1) {
    const t = (2 * Math.PI * k) / points;
    const u = r * Math.cos(t);
    const v = r * Math.sin(t);
    out.push([g.mean[0] + L[0][0] * u, g.mean[1] + L[1][0] * u + L[1][1] * v]);
  }
  return out;
}
