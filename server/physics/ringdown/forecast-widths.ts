/**
 * Widths of the two remnant estimates of an IMR consistency test at a given detector, forecast with
 * Fisher matrices (our own computation, following the recipe of the Gaussian test's docs):
 *
 * - inspiral: the forecast core's TaylorF2 Fisher matrix (server/physics/forecast) on the band
 *   f_low .. f_c (the split frequency, capped at the PhenomA merger frequency), GR model (the beta row
 *   and column dropped), priors as in the forecasts; the covariance of (ln Mc_z, mass ratio, chi_s,
 *   chi_a) is pushed through the Husa et al. 2016 remnant fits, J Sigma J^T, with J by central
 *   differences;
 * - merger-ringdown: one damped sinusoid, the (2,2,0) mode, carrying the post-inspiral SNR, in noise
 *   flat across the mode's width; its Fisher matrix in (ln A, phi, ln f, ln tau) is averaged over
 *   the phase, and (ln f, ln tau) is mapped to (ln M_f, chi_f) with the inverse Jacobian of the Kerr
 *   fit. Ignoring the merger makes it conservative.
 *
 * Both covariances are returned in (ln M_f, chi_f), frame-free.
 *
 * The same Fisher matrix gives the inspiral estimate's bias when the signal carries a ppE term the GR
 * template lacks (Cutler & Vallisneri 2007, arXiv:0707.2982, linear bias from an inaccurate template;
 * applied to the IMR test as in Carson & Yagi 2020, arXiv:2002.08559; our reconstruction, derived):
 * the best-fit GR parameters move by d theta = Gamma^-1 (d_i h | d_beta h) beta, so the beta column of
 * the matrix at exponent b, multiplied by the inverse of the GR block, is the bias per unit beta. It is
 * pushed through the same remnant-fit Jacobian J as the widths. Gamma is the prior-augmented GR block,
 * the one the widths use (priors centred on the true values, so beta = 0 gives no bias); without the
 * priors both Gamma and the column scale with the amplitude squared and the bias would not depend on
 * the distance at all; with them it does, weakly.
 */
import { DEFAULT_PRIORS, addPriors, runForecast, type CustomCurveData, type ForecastDetectorInput } from "../forecast/forecast.ts";
import { invertFisher } from "../forecast/linalg.ts";
import { BETA_INDEX } from "../forecast/phase.ts";
import { PhysicsInputError } from "../input-error.ts";
import { inverseQnmJacobian } from "./inferred-remnant.ts";
import type { Matrix2 } from "./matrix2.ts";
import { dimensionlessMode, type QnmMode } from "./qnm.ts";
import { remnantFromBinary } from "./remnant.ts";
import { splitFrequencyHz } from "./isco.ts";

export interface InspiralForecastInput {
  /** Source-frame component masses (solar masses) and aligned spins. */
  readonly m1: number;
  readonly m2: number;
  readonly chi1: number;
  readonly chi2: number;
  readonly z: number;
  readonly distance_mpc?: number | undefined;
  /** Any curve the forecasts take: a built-in id (ground or space) or custom:<id> with its table in `curves`. */
  readonly detector: ForecastDetectorInput;
  /** The uploaded curve the detector names (custom:<id>), already checked to be the caller's. */
  readonly curves?: readonly CustomCurveData[] | undefined;
  /** ppE exponents whose linear bias of the inspiral estimate is wanted (each within [-20, 10]). */
  readonly bias_b?: readonly number[] | undefined;
}

/** The linear bias of the inspiral estimate per unit ppE beta at exponent b. */
export interface InspiralBiasVector {
  readonly b: number;
  /** d ln M_f and d chi_f of the inspiral estimate per unit beta. */
  readonly remnant: [number, number];
  /** d theta per unit beta over the GR parameters, in the order of `parameters`. */
  readonly theta: number[];
}

export interface InspiralWidths {
  /** Covariance of (ln M_f, chi_f) of the inspiral estimate. */
  readonly covariance: Matrix2;
  readonly snr: number;
  readonly f_low: number;
  readonly f_high: number;
  /** Why the band ends where it does (the split frequency, or the PhenomA merger frequency below it). */
  readonly high_cut: string;
  readonly split_frequency_hz: number;
  readonly cautions: string[];
  /** The detector's name and the orientation of the forecast. */
  readonly label: string;
  /** The GR parameters of the bias vectors (ln_A, phi_c, t_c, ln_Mc, ln_eta or delta, chi_s, chi_a). */
  readonly parameters: string[];
  /** One per bias_b, in its order. */
  readonly bias: InspiralBiasVector[];
}

/** The remnant of (ln Mc, p, chi_s, chi_a), p = ln eta or delta = (m1 - m2)/M, through the Husa et al. 2016 fits. */
function remnantOf(theta: readonly number[], massParameter: string): [number, number] {
  const [lnMc, p, chiS, chiA] = theta as [number, number, number, number];
  const eta = massParameter === "delta" ? (1 - p * p) / 4 : Math.exp(p);
  const delta = massParameter === "delta" ? p : Math.sqrt(Math.max(0, 1 - 4 * eta));
  const M = Math.exp(lnMc) * eta ** -0.6;
  const r = remnantFromBinary({ m1: (M * (1 + delta)) / 2, m2: (M * (1 - delta)) / 2, chi1: chiS + chiA, chi2: chiS - chiA });
  return [Math.log(r.M_f), r.chi_f];
}

export function inspiralRemnantWidths(input: InspiralForecastInput): InspiralWidths {
  const gr = remnantFromBinary({ m1: input.m1, m2: input.m2, chi1: input.chi1, chi2: input.chi2 }, "binary.");
  const fc = splitFrequencyHz(gr.M_f * (1 + input.z), gr.chi_f);
  const forecast = runForecast({
    source: { m1: input.m1, m2: input.m2, chi1: input.chi1, chi2: input.chi2, frame: "source", z: input.z, ...(input.distance_mpc === undefined ? {} : { distance_mpc: input.distance_mpc }) },
    detectors: [{ ...input.detector, f_high: Math.min(fc, input.detector.f_high ?? Infinity) }],
    networks: [[0]],
    // The GR block is the same for every b; each b adds its beta row and column (used for the bias only).
    b: input.bias_b && input.bias_b.length > 0 ? [...input.bias_b] : [-7],
    upper_cut: "merger_extrapolated",
    include_matrices: true,
    // A one-decade band: 2000 log-spaced points keep the trapezoid sums well inside a per-mille.
    grid_points: 2000,
  }, [...(input.curves ?? [])]);
  const band = forecast.detectors[0]!;
  const full = forecast.matrices![0]!.per_detector[0]!.map((row) => [...row]);
  addPriors(full, DEFAULT_PRIORS);
  const keep = full.map((_, i) => i).filter((i) => i !== BETA_INDEX);
  const gamma = keep.map((i) => keep.map((j) => full[i]![j]!));
  const names = keep.map((i) => forecast.parameters[i]!);
  const inv = invertFisher(gamma, names);
  if (!inv.covariance) throw new PhysicsInputError("forecast", `the inspiral Fisher matrix cannot be inverted: ${inv.reason ?? "no constraint"}`);
  // Parameters 3..6 of the forecast: ln Mc_z, mass ratio, chi_s, chi_a (beta removed, so indices unchanged below it).
  const idx = [3, 4, 5, 6];
  const sigmaTheta = idx.map((i) => idx.map((j) => inv.covariance![i]![j]!));
  const massParameter = forecast.parameters[4]!;
  const eta = forecast.source.eta;
  const theta0 = [
    Math.log(forecast.source.mc_z_msun),
    massParameter === "delta" ? (forecast.source.m1 - forecast.source.m2) / (forecast.source.m1 + forecast.source.m2) : Math.log(eta),
    (forecast.source.chi1 + forecast.source.chi2) / 2,
    (forecast.source.chi1 - forecast.source.chi2) / 2,
  ];
  const steps = [1e-6, 1e-6, 1e-6, 1e-6];
  const J: number[][] = [
    [0, 0, 0, 0],
    [0, 0, 0, 0],
  ];
  for (let k = 0; k < 4; k++) {
    const up = [...theta0];
    const dn = [...theta0];
    up[k]! += steps[k]!;
    dn[k]! -= steps[k]!;
    const a = remnantOf(up, massParameter);
    const b = remnantOf(dn, massParameter);
    J[0]![k] = (a[0] - b[0]) / (2 * steps[k]!);
    J[1]![k] = (a[1] - b[1]) / (2 * steps[k]!);
  }
  const cov: Matrix2 = [
    [0, 0],
    [0, 0],
  ];
  for (let r = 0; r < 2; r++) for (let c = 0; c < 2; c++) {
    let s = 0;
    for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) s += J[r]![i]! * sigmaTheta[i]![j]! * J[c]![j]!;
    cov[r]![c] = s;
  }
  // Linear bias per unit beta at each exponent: Sigma_GR times the beta column of the GR rows (no prior on beta).
  const bias = (input.bias_b ?? []).map((b, bi): InspiralBiasVector => {
    const g = forecast.matrices![bi]!.per_detector[0]!;
    const column = keep.map((i) => g[i]![BETA_INDEX]!);
    const theta = inv.covariance!.map((row) => row.reduce((s, v, j) => s + v * column[j]!, 0));
    const d = idx.map((i) => theta[i]!);
    const row = (r: number) => d.reduce((s, v, k) => s + J[r]![k]! * v, 0);
    const remnant: [number, number] = [row(0), row(1)];
    return { b, remnant, theta };
  });
  const cautions = [
    `Inspiral widths from a Fisher forecast on ${band.label}, ${band.f_low.toPrecision(3)}–${band.f_high.toPrecision(4)} Hz (ending at ${band.high_cut === "f_high as given" ? "the split frequency" : `the ${band.high_cut}, below the split frequency ${fc.toPrecision(4)} Hz`}), SNR ${band.snr.toFixed(1)}: TaylorF2 past the ISCO of the total mass, so an illustration of the test's reach, not a measurement.`,
    ...forecast.networks[0]!.cautions,
  ];
  if (inv.status === "ill_conditioned") cautions.push(`The inspiral Fisher matrix is ill-conditioned (condition number ${inv.condition.toExponential(1)}): the widths are uncertain.`);
  return {
    covariance: cov,
    snr: band.snr,
    f_low: band.f_low,
    f_high: band.f_high,
    high_cut: band.high_cut === "f_high as given" ? "split frequency" : band.high_cut,
    split_frequency_hz: fc,
    cautions,
    label: band.label,
    parameters: names,
    bias,
  };
}

/**
 * The (ln f, ln tau) covariance of one damped sinusoid h = A e^{-t/tau} cos(2 pi f t + phi), t >= 0, at
 * SNR rho in noise flat across the mode: Gamma = rho^2 <d h d h> / <h h>, averaged over phi (our own
 * computation). It depends on the quality factor Q = pi f tau only.
 */
export function dampedSinusoidLogCovariance(Q: number, snr: number): Matrix2 {
  if (!(Q > 0) || !(snr > 0)) throw new PhysicsInputError("ringdown_snr", "ringdown_snr must be positive");
  const omegaTau = 2 * Q;
  const dx = Math.min(0.002, 0.05 / omegaTau);
  const xMax = 40;
  const phases = 16;
  const G = Array.from({ length: 4 }, () => new Array<number>(4).fill(0));
  let hh = 0;
  for (let p = 0; p < phases; p++) {
    const phi = (2 * Math.PI * p) / phases;
    for (let x = 0; x <= xMax; x += dx) {
      const e = Math.exp(-x);
      const c = Math.cos(omegaTau * x + phi);
      const s = Math.sin(omegaTau * x + phi);
      const h = e * c;
      // d/d ln A, d/d phi, d/d ln f (the phase 2 pi f t = omegaTau x), d/d ln tau (the envelope e^{-t/tau}).
      const d = [h, -e * s, -e * s * omegaTau * x, h * x];
      hh += h * h;
      for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) G[i]![j]! += d[i]! * d[j]!;
    }
  }
  const scale = (snr * snr) / hh;
  const gamma = G.map((row) => row.map((v) => v * scale));
  const inv = invertFisher(gamma, ["ln_A", "phi", "ln_f", "ln_tau"]);
  if (!inv.covariance) throw new PhysicsInputError("ringdown_snr", "the ringdown Fisher matrix cannot be inverted");
  return [
    [inv.covariance[2]![2]!, inv.covariance[2]![3]!],
    [inv.covariance[3]![2]!, inv.covariance[3]![3]!],
  ];
}

/** Covariance of (ln M_f, chi_f) from a single-mode ringdown at this SNR, through the inverse Kerr-fit Jacobian. */
export function ringdownRemnantWidths(mode: QnmMode, chi: number, snr: number): Matrix2 {
  const C = dampedSinusoidLogCovariance(dimensionlessMode(mode, chi).Q, snr);
  const K = inverseQnmJacobian(mode, chi);
  const out: Matrix2 = [
    [0, 0],
    [0, 0],
  ];
  for (let r = 0; r < 2; r++) for (let c = 0; c < 2; c++) {
    let s = 0;
    for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) s += K[r]![i]! * C[i]![j]! * K[c]![j]!;
    out[r]![c] = s;
  }
  return out;
}
