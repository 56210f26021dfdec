/**
 * Fisher-matrix forecast of the ppE amplitude beta for a network of detectors observing one binary
 * (Cutler & Flanagan 1994, Phys. Rev. D 49, 2658; independent detectors add their Fisher matrices).
 *
 * For every detector: a frequency band (inspiral only, up to the ISCO of the detector-frame total
 * mass unless an extrapolation is asked for; space detectors see the window of their observing time
 * before merger), the weight 4 A^2 f^(-7/3) / S_n on a log-spaced grid (trapezoid rule in ln f), and
 * the phase derivatives of phase.ts. The part of the matrix that does not involve beta is computed
 * once per detector; each b only adds the beta row. Networks sum their detectors, add the Gaussian
 * priors once and invert once (linalg.ts).
 */
import { PhysicsInputError, requireFinite } from "../input-error.ts";
import { PLANCK_2018, luminosityDistanceMpc, redshiftFromLuminosityDistance, validateCosmology, type Cosmology } from "../cosmology.ts";
import { degeneracyOfB } from "../taylorf2.ts";
import { JULIAN_YEAR_S, MEGAPARSEC_M, SOLAR_MASS_TIME_S, SPEED_OF_LIGHT_M_S } from "../units.ts";
import {
  amplitudeWeight,
  frequencyAtTimeToMerger,
  iscoFrequency,
  phenomAMergerFrequency,
  type Orientation,
} from "./amplitude.ts";
import { builtInCurve, tabulatedPsd, type CurveConvention, type NoiseCurve } from "./curves.ts";
import { invertFisher, type InversionStatus } from "./linalg.ts";
import { BETA_INDEX, N_PARAMS, PARAMETER_NAMES, PARAMETER_TEXT, PHI_C_INDEX, T_C_INDEX, phaseDerivatives, phaseModel, type PhaseModel } from "./phase.ts";
import { boundMultiplier } from "./stats.ts";

export interface ForecastSourceInput {
  m1: number;
  m2: number;
  chi1?: number;
  chi2?: number;
  frame: "source" | "detector";
  distance_mpc?: number;
  z?: number;
}

export interface ForecastDetectorInput {
  curve: string;
  label?: string;
  f_low?: number;
  f_high?: number;
  years_observed?: number;
  years_before_merger?: number;
  orientation?: Orientation;
}

export interface PriorWidths {
  phi_c: number | null;
  chi_s: number | null;
  chi_a: number | null;
}

export const DEFAULT_PRIORS: PriorWidths = Object.freeze({ phi_c: Math.PI, chi_s: 1, chi_a: 1 });

export type UpperCut = "isco" | "merger_extrapolated";

/**
 * How the coalescence phase and time are shared in a network. "shared": one phi_c and t_c for every
 * detector (phase-coherent detectors). "phi_c_per_detector" and "phi_c_t_c_per_detector": each detector
 * of a network gets its own phi_c (and t_c), as is common practice when the detectors are not
 * phase-coherent (a space and a ground detector years apart); this can only loosen a bound.
 */
export const COALESCENCE_OPTIONS = ["shared", "phi_c_per_detector", "phi_c_t_c_per_detector"] as const;
export type Coalescence = (typeof COALESCENCE_OPTIONS)[number];

export interface ForecastInput {
  source: ForecastSourceInput;
  cosmology?: Cosmology;
  detectors: ForecastDetectorInput[];
  networks: (number[])[];
  b: number[];
  priors?: Partial<PriorWidths>;
  credibility?: number;
  sides?: "one" | "two";
  upper_cut?: UpperCut;
  coalescence?: Coalescence;
  include_matrices?: boolean;
  grid_points?: number;
}

/** A user's tabulated curve as the engine needs it (serialisable, so it can cross to a worker). */
export interface CustomCurveData {
  id: string;
  name: string;
  convention: CurveConvention;
  space: boolean;
  frequencies: number[];
  psd: number[];
}

export interface DetectorBand {
  index: number;
  curve: string;
  label: string;
  convention: CurveConvention;
  orientation: Orientation;
  f_low: number;
  f_high: number;
  low_cut: string;
  high_cut: string;
  extrapolated: boolean;
  to_confirm: string | null;
  years_observed: number | null;
  years_before_merger: number | null;
  snr: number;
}

export interface ForecastRow {
  b: number;
  sigma_beta: number | null;
  bound: number | null;
  condition_number: number | null;
  status: InversionStatus;
  note?: string;
}

export interface NetworkResult {
  detectors: number[];
  labels: string[];
  snr: { total: number; per_detector: number[] };
  cautions: string[];
  rows: ForecastRow[];
}

export interface ForecastResult {
  source: {
    m1: number;
    m2: number;
    chi1: number;
    chi2: number;
    z: number;
    distance_mpc: number;
    distance_from: "given" | "z" | "both_given";
    mc_z_msun: number;
    m_z_msun: number;
    eta: number;
    f_isco_hz: number;
  };
  cosmology: Cosmology;
  parameters: string[];
  priors: PriorWidths;
  credibility: number;
  sides: "one" | "two";
  multiplier: number;
  upper_cut: UpperCut;
  coalescence: Coalescence;
  detectors: DetectorBand[];
  networks: NetworkResult[];
  cautions: string[];
  /** Per-detector Fisher matrices (without priors) by b, when asked for. */
  matrices?: { b: number; per_detector: ((number[])[])[] }[];
}

export const LOW_SNR = 10;
export const DEFAULT_GRID_POINTS = 10_000;

function resolveCurve(id: string, custom: CustomCurveData[], field: string): NoiseCurve {
  const builtIn = builtInCurve(id);
  if (builtIn) return builtIn;
  const c = custom.find((x) => x.id === id);
  if (!c) throw new PhysicsInputError(field, `${field}: unknown curve "${id}" (built-in ids or custom:<id> of one of your uploaded curves)`);
  const psd = tabulatedPsd(c);
  return {
    id: c.id,
    name: c.name,
    source: "uploaded by the user",
    convention: c.convention,
    conventionNote: "as declared at upload",
    fMin: c.frequencies[0]!,
    fMax: c.frequencies[c.frequencies.length - 1]!,
    defaultFLow: c.frequencies[0]!,
    space: c.space,
    psd: (f) => psd(f),
  };
}

function positive(field: string, value: number | undefined, what: string): number | undefined {
  if (value === undefined) return undefined;
  requireFinite(field, value);
  if (value <= 0) throw new PhysicsInputError(field, `${field} must be positive (${what})`);
  return value;
}

function spin(field: string, value: number | undefined): number {
  if (value === undefined) return 0;
  requireFinite(field, value);
  if (Math.abs(value) >= 1) throw new PhysicsInputError(field, `${field} must satisfy |${field.split(".").pop()}| < 1`);
  return value;
}

interface DetectorPlan {
  band: Omit<DetectorBand, "snr">;
  curve: NoiseCurve;
  years: number;
}

interface DetectorIntegrals {
  /** SNR^2 = Gamma_{lnA,lnA}. */
  snr2: number;
  /** 6 x 6 block of phi_c, t_c, ln Mc, mass ratio, chi_s, chi_a (row-major). */
  base: Float64Array;
  weights: Float64Array;
  lnu: Float64Array;
  /** Derivative columns, 6 x N. */
  columns: Float64Array[];
}

/** Integrals of one detector on its log-spaced grid (trapezoid rule in ln f). */
export function detectorIntegrals(model: PhaseModel, curve: NoiseCurve, years: number, fLow: number, fHigh: number, amplitude2: number, points: number): DetectorIntegrals {
  const n = points;
  const l0 = Math.log(fLow);
  const step = (Math.log(fHigh) - l0) / (n - 1);
  const weights = new Float64Array(n);
  const lnu = new Float64Array(n);
  const columns = Array.from({ length: 6 }, () => new Float64Array(n));
  const d = new Float64Array(7);
  let snr2 = 0;
  for (let i = 0; i < n; i++) {
    const f = Math.exp(l0 + i * step);
    const trap = i === 0 || i === n - 1 ? 0.5 * step : step;
    const w = (trap * f * amplitude2 * f ** (-7 / 3)) / curve.psd(f, years);
    weights[i] = w;
    snr2 += w;
    phaseDerivatives(model, f, 0, 0, d);
    lnu[i] = Math.log(Math.PI * model.mcZ * f) / 3;
    for (let j = 0; j < 6; j++) columns[j]![i] = d[j]!;
  }
  const base = new Float64Array(36);
  for (let a = 0; a < 6; a++) {
    for (let b = a; b < 6; b++) {
      const ca = columns[a]!;
      const cb = columns[b]!;
      let s = 0;
      for (let i = 0; i < n; i++) s += weights[i]! * ca[i]! * cb[i]!;
      base[a * 6 + b] = s;
      base[b * 6 + a] = s;
    }
  }
  return { snr2, base, weights, lnu, columns };
}

/** The full 8 x 8 Fisher matrix of one detector at exponent b (no priors). */
export function detectorFisher(integrals: DetectorIntegrals, b: number): number[][] {
  const g = Array.from({ length: N_PARAMS }, () => new Array<number>(N_PARAMS).fill(0));
  g[0]![0] = integrals.snr2;
  for (let a = 0; a < 6; a++) for (let c = 0; c < 6; c++) g[a + 1]![c + 1] = integrals.base[a * 6 + c]!;
  const { weights, lnu, columns } = integrals;
  const [c0, c1, c2, c3, c4, c5] = columns as [Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array];
  const n = weights.length;
  // ln u is evenly spaced on the grid, so u^b is a geometric sequence: one exp per block of points
  // instead of one per point (re-anchored every 256 points, so rounding cannot accumulate).
  const ratio = n > 1 ? Math.exp(b * (lnu[1]! - lnu[0]!)) : 1;
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let s4 = 0;
  let s5 = 0;
  let bb = 0;
  let ub = 0;
  for (let i = 0; i < n; i++) {
    ub = (i & 255) === 0 ? Math.exp(b * lnu[i]!) : ub * ratio;
    const wu = weights[i]! * ub;
    bb += wu * ub;
    s0 += wu * c0[i]!;
    s1 += wu * c1[i]!;
    s2 += wu * c2[i]!;
    s3 += wu * c3[i]!;
    s4 += wu * c4[i]!;
    s5 += wu * c5[i]!;
  }
  const cross = [s0, s1, s2, s3, s4, s5];
  for (let j = 0; j < 6; j++) {
    g[BETA_INDEX]![j + 1] = cross[j]!;
    g[j + 1]![BETA_INDEX] = cross[j]!;
  }
  g[BETA_INDEX]![BETA_INDEX] = bb;
  return g;
}

/** Adds independent Gaussian priors (zero mean) on phi_c, chi_s, chi_a to the diagonal, in place. */
export function addPriors(gamma: number[][], priors: PriorWidths): number[][] {
  if (priors.phi_c !== null) gamma[1]![1]! += 1 / priors.phi_c ** 2;
  if (priors.chi_s !== null) gamma[5]![5]! += 1 / priors.chi_s ** 2;
  if (priors.chi_a !== null) gamma[6]![6]! += 1 / priors.chi_a ** 2;
  return gamma;
}

function resolvePriors(input: Partial<PriorWidths> | undefined): PriorWidths {
  const out: Record<keyof PriorWidths, number | null> = { ...DEFAULT_PRIORS };
  for (const key of ["phi_c", "chi_s", "chi_a"] as const) {
    const v = input?.[key];
    if (v === undefined) continue;
    if (v === null) {
      out[key] = null;
      continue;
    }
    requireFinite(`priors.${key}`, v);
    if (v <= 0) throw new PhysicsInputError(`priors.${key}`, `priors.${key} must be a positive width (or null for no prior)`);
    out[key] = v;
  }
  return out;
}

function formatHz(f: number): string {
  return `${Number(f.toPrecision(4))} Hz`;
}

export function runForecast(input: ForecastInput, customCurves: CustomCurveData[] = []): ForecastResult {
  const src = input.source;
  let m1 = positive("source.m1", requireFinite("source.m1", src.m1), "solar masses")!;
  let m2 = positive("source.m2", requireFinite("source.m2", src.m2), "solar masses")!;
  let chi1 = spin("source.chi1", src.chi1);
  let chi2 = spin("source.chi2", src.chi2);
  if (m2 > m1) {
    [m1, m2] = [m2, m1];
    [chi1, chi2] = [chi2, chi1];
  }
  const cosmology = validateCosmology(input.cosmology ?? PLANCK_2018);
  const givenD = positive("source.distance_mpc", src.distance_mpc, "Mpc");
  const givenZ = positive("source.z", src.z, "redshift");
  if (givenD === undefined && givenZ === undefined) {
    throw new PhysicsInputError("source.distance_mpc", "source.distance_mpc or source.z is required");
  }
  const z = givenZ ?? redshiftFromLuminosityDistance(givenD!, cosmology);
  const distanceMpc = givenD ?? luminosityDistanceMpc(z, cosmology);
  if (src.frame === "detector") {
    m1 /= 1 + z;
    m2 /= 1 + z;
  } else if (src.frame !== "source") {
    throw new PhysicsInputError("source.frame", 'source.frame must be "source" or "detector"');
  }
  const M = m1 + m2;
  const eta = (m1 * m2) / (M * M);
  const mZ = M * (1 + z);
  const mcZ = eta ** 0.6 * mZ;
  const mZs = mZ * SOLAR_MASS_TIME_S;
  const mcZs = mcZ * SOLAR_MASS_TIME_S;
  const distanceS = (distanceMpc * MEGAPARSEC_M) / SPEED_OF_LIGHT_M_S;
  const fIsco = iscoFrequency(mZs);
  const upperCut: UpperCut = input.upper_cut ?? "isco";
  const fTop = upperCut === "isco" ? fIsco : phenomAMergerFrequency(eta, mZs);
  const priors = resolvePriors(input.priors);
  const credibility = input.credibility ?? 0.9;
  if (!(credibility > 0 && credibility < 1)) throw new PhysicsInputError("credibility", "credibility must lie strictly between 0 and 1");
  const sides = input.sides ?? "two";
  const multiplier = boundMultiplier(credibility, sides);
  const coalescence: Coalescence = input.coalescence ?? "shared";
  if (!COALESCENCE_OPTIONS.includes(coalescence)) throw new PhysicsInputError("coalescence", `coalescence must be one of ${COALESCENCE_OPTIONS.join(", ")}`);
  const separate: number[] = coalescence === "shared" ? [] : coalescence === "phi_c_per_detector" ? [PHI_C_INDEX] : [PHI_C_INDEX, T_C_INDEX];
  const points = input.grid_points ?? DEFAULT_GRID_POINTS;
  if (!Number.isInteger(points) || points < 100 || points > 200_000) {
    throw new PhysicsInputError("grid_points", "grid_points must be an integer between 100 and 200000");
  }
  if (input.detectors.length === 0) throw new PhysicsInputError("detectors", "detectors must list at least one detector");
  if (input.b.length === 0) throw new PhysicsInputError("b", "b must list at least one exponent");
  input.b.forEach((b, i) => {
    requireFinite(`b.${i}`, b);
    if (b < -20 || b > 10) throw new PhysicsInputError(`b.${i}`, `b.${i} must lie in [-20, 10] (b = 2n - 5 at PN order n)`);
  });

  const plans: DetectorPlan[] = input.detectors.map((det, i) => planDetector(det, i, customCurves, { mcZs, fTop, fIsco, upperCut }));
  const model = phaseModel(mcZs, { eta, chi_s: (chi1 + chi2) / 2, chi_a: (chi1 - chi2) / 2 });
  const integrals = plans.map((p) => {
    const a2 = amplitudeWeight(p.band.convention, p.band.orientation, mcZs, distanceS);
    return detectorIntegrals(model, p.curve, p.years, p.band.f_low, p.band.f_high, a2, points);
  });
  const bands: DetectorBand[] = plans.map((p, i) => ({ ...p.band, snr: Math.sqrt(integrals[i]!.snr2) }));
  const perB = input.b.map((b) => integrals.map((ig) => detectorFisher(ig, b)));
  const names = PARAMETER_NAMES.map((n) => (n === "ln_eta" ? model.massParameter : n));

  if (input.networks.length === 0) throw new PhysicsInputError("networks", "networks must list at least one network");
  const networks = input.networks.map((net, ni): NetworkResult => {
    if (net.length === 0) throw new PhysicsInputError(`networks.${ni}`, `networks.${ni} must name at least one detector`);
    net.forEach((d, k) => {
      if (!Number.isInteger(d) || d < 0 || d >= plans.length) {
        throw new PhysicsInputError(`networks.${ni}.${k}`, `networks.${ni}.${k} must be the index of a detector (0..${plans.length - 1})`);
      }
    });
    if (new Set(net).size !== net.length) throw new PhysicsInputError(`networks.${ni}`, `networks.${ni} lists a detector twice`);
    const perDetector = net.map((d) => bands[d]!.snr);
    const total = Math.sqrt(perDetector.reduce((s, x) => s + x * x, 0));
    // With separate coalescence parameters, detector j > 0 of the network gets its own copies of
    // phi_c (and t_c), appended after the eight shared parameters.
    const split = net.length > 1 ? separate : [];
    const cautions: string[] = [];
    if (total < LOW_SNR) {
      cautions.push(
        `network SNR ${total.toFixed(1)} is below ${LOW_SNR}: a Fisher estimate is not trustworthy there (common practice; Vallisneri 2008, Phys. Rev. D 77, 042001)`,
      );
    }
    if (split.length > 0) {
      const extra = (net.length - 1) * split.length;
      cautions.push(`each detector has its own ${split.length === 1 ? "coalescence phase" : "coalescence phase and time"} (not phase-coherent): ${extra} more parameter${extra === 1 ? "" : "s"} marginalised`);
    }
    if (net.some((d) => bands[d]!.extrapolated)) cautions.push("TaylorF2 is extrapolated past the ISCO in this network: the numbers lean on an inspiral model beyond its range");
    const size = N_PARAMS + split.length * (net.length - 1);
    const slot = (j: number, p: number) => {
      const k = split.indexOf(p);
      return j === 0 || k < 0 ? p : N_PARAMS + (j - 1) * split.length + k;
    };
    // Notes name the parameters as people write them (ln ℳ, φ_c), not by their API identifiers.
    const shownNames = names.map((n) => PARAMETER_TEXT[n]);
    const netNames: string[] = [...shownNames];
    for (let j = 1; j < net.length; j++) for (const p of split) netNames.push(`${shownNames[p]!} (${bands[net[j]!]!.label})`);
    const rows = input.b.map((b, bi): ForecastRow => {
      const gamma = Array.from({ length: size }, () => new Array<number>(size).fill(0));
      net.forEach((d, j) => {
        const g = perB[bi]![d]!;
        for (let r = 0; r < N_PARAMS; r++) {
          const sr = slot(j, r);
          for (let c = 0; c < N_PARAMS; c++) gamma[sr]![slot(j, c)]! += g[r]![c]!;
        }
      });
      // The phi_c prior stays on the first detector's phase; the other detectors' phases are left free.
      // A Gaussian prior on every copy would add information a periodic phase does not carry, and
      // could then tighten the bound (docs/forecasts.md).
      addPriors(gamma, priors);
      const inv = invertFisher(gamma, netNames);
      const condition = Number.isFinite(inv.condition) ? inv.condition : null;
      const degenerate = degeneracyOfB(b);
      if (degenerate) return { b, sigma_beta: null, bound: null, condition_number: condition, status: "no_constraint", note: degenerate };
      if (inv.status === "no_constraint" || !inv.covariance) {
        return { b, sigma_beta: null, bound: null, condition_number: condition, status: "no_constraint", note: inv.reason ?? "no constraint" };
      }
      const sigma = Math.sqrt(inv.covariance[BETA_INDEX]![BETA_INDEX]!);
      if (!Number.isFinite(sigma) || !(sigma > 0)) {
        return { b, sigma_beta: null, bound: null, condition_number: condition, status: "no_constraint", note: "the marginalised variance of β is not positive" };
      }
      const row: ForecastRow = { b, sigma_beta: sigma, bound: multiplier * sigma, condition_number: condition, status: inv.status };
      return inv.reason ? { ...row, note: inv.reason } : row;
    });
    return { detectors: [...net], labels: net.map((d) => bands[d]!.label), snr: { total, per_detector: perDetector }, cautions, rows };
  });

  const cautions = [
    "Fisher-matrix estimate: valid only at high SNR and away from parameter boundaries (Vallisneri 2008, Phys. Rev. D 77, 042001)",
    `restricted TaylorF2 inspiral (3.5PN, aligned spins), sky-averaged unless stated; upper cut ${upperCut === "isco" ? `at the ISCO of the detector-frame total mass (${formatHz(fIsco)})` : `extrapolated to the PhenomA merger frequency (${formatHz(fTop)}), past the ISCO (${formatHz(fIsco)})`}`,
    `Gaussian priors: ${(["phi_c", "chi_s", "chi_a"] as const).map((k) => `${PARAMETER_TEXT[k]} ${priors[k] === null ? "none" : `σ = ${Number(priors[k]!.toPrecision(4))}`}`).join(", ")}`,
  ];
  for (const band of bands) if (band.to_confirm) cautions.push(`${band.label}: ${band.to_confirm}`);
  if (coalescence !== "shared") {
    cautions.push(`networks of several detectors give each detector its own ${coalescence === "phi_c_per_detector" ? "coalescence phase φ_c" : "coalescence phase φ_c and time t_c"} (the prior on φ_c applies to the first detector's phase only; the others are free)`);
  }
  if (model.massParameter === "delta") cautions.push("near-equal masses: the mass ratio enters the Fisher matrix as δ = (m₁ − m₂)/M instead of ln η");
  if (givenD !== undefined && givenZ !== undefined) cautions.push("distance and redshift were both given: they are used as given, not related through the cosmology");

  const result: ForecastResult = {
    source: {
      m1,
      m2,
      chi1,
      chi2,
      z,
      distance_mpc: distanceMpc,
      distance_from: givenD !== undefined && givenZ !== undefined ? "both_given" : givenD !== undefined ? "given" : "z",
      mc_z_msun: mcZ,
      m_z_msun: mZ,
      eta,
      f_isco_hz: fIsco,
    },
    cosmology,
    parameters: names,
    priors,
    credibility,
    sides,
    multiplier,
    upper_cut: upperCut,
    coalescence,
    detectors: bands,
    networks,
    cautions,
  };
  if (input.include_matrices) return { ...result, matrices: input.b.map((b, bi) => ({ b, per_detector: perB[bi]! })) };
  return result;
}

interface SourceScales {
  mcZs: number;
  fTop: number;
  fIsco: number;
  upperCut: UpperCut;
}

function planDetector(det: ForecastDetectorInput, i: number, custom: CustomCurveData[], s: SourceScales): DetectorPlan {
  const field = `detectors.${i}`;
  const curve = resolveCurve(det.curve, custom, `${field}.curve`);
  const orientation: Orientation = det.orientation ?? "sky_averaged";
  const fLowIn = positive(`${field}.f_low`, det.f_low, "Hz");
  const fHighIn = positive(`${field}.f_high`, det.f_high, "Hz");
  if (fLowIn !== undefined && fLowIn < curve.fMin) {
    throw new PhysicsInputError(`${field}.f_low`, `${field}.f_low = ${fLowIn} Hz is below the range of ${curve.id} (defined from ${curve.fMin} Hz)`);
  }
  if (fHighIn !== undefined && fHighIn > curve.fMax) {
    throw new PhysicsInputError(`${field}.f_high`, `${field}.f_high = ${fHighIn} Hz is above the range of ${curve.id} (defined up to ${curve.fMax} Hz)`);
  }
  if (fLowIn !== undefined && fHighIn !== undefined && fLowIn >= fHighIn) {
    throw new PhysicsInputError(`${field}.f_low`, `${field}.f_low must be below ${field}.f_high`);
  }
  let fLow = fLowIn ?? curve.defaultFLow;
  let lowCut = fLowIn !== undefined ? "f_low as given" : "default lower cut of the curve";
  let years = 4;
  let yearsObserved: number | null = null;
  let yearsBefore: number | null = null;
  let windowEnd = Infinity;
  if (curve.space) {
    yearsObserved = positive(`${field}.years_observed`, det.years_observed, "years") ?? 4;
    yearsBefore = positive(`${field}.years_before_merger`, det.years_before_merger, "years") ?? 4;
    years = yearsObserved;
    const fStart = frequencyAtTimeToMerger(s.mcZs, yearsBefore * JULIAN_YEAR_S);
    if (fStart > fLow) {
      fLow = fStart;
      lowCut = `start of observation, ${yearsBefore} yr before merger`;
    }
    if (yearsBefore > yearsObserved) windowEnd = frequencyAtTimeToMerger(s.mcZs, (yearsBefore - yearsObserved) * JULIAN_YEAR_S);
  } else if (det.years_observed !== undefined || det.years_before_merger !== undefined) {
    throw new PhysicsInputError(
      `${field}.${det.years_observed !== undefined ? "years_observed" : "years_before_merger"}`,
      `${field}: observing windows apply to space detectors only; ${curve.id} sees the source up to merger`,
    );
  }
  const candidates: { f: number; why: string }[] = [
    { f: s.fTop, why: s.upperCut === "isco" ? "ISCO of the detector-frame total mass" : "PhenomA merger frequency (extrapolated past the ISCO)" },
    { f: curve.fMax, why: `upper end of the ${curve.id} curve` },
  ];
  if (Number.isFinite(windowEnd)) candidates.push({ f: windowEnd, why: `end of observation, ${yearsBefore! - yearsObserved!} yr before merger` });
  if (fHighIn !== undefined) candidates.push({ f: fHighIn, why: "f_high as given" });
  const top = candidates.reduce((a, c) => (c.f < a.f ? c : a));
  if (fLow >= curve.fMax) {
    throw new PhysicsInputError(
      curve.space ? `${field}.years_before_merger` : `${field}.f_low`,
      `${field}: the band starts at ${formatHz(fLow)}, above the range of ${curve.id} (up to ${formatHz(curve.fMax)})`,
    );
  }
  if (top.f <= fLow) {
    const blame = top.why.startsWith("end of observation") ? `${field}.years_observed` : fLowIn !== undefined ? `${field}.f_low` : curve.space ? `${field}.years_before_merger` : `${field}.f_low`;
    throw new PhysicsInputError(blame, `${field}: the band is empty: it would start at ${formatHz(fLow)} (${lowCut}) but ends at ${formatHz(top.f)} (${top.why})`);
  }
  const extrapolated = s.upperCut === "merger_extrapolated" && top.f > s.fIsco;
  return {
    curve,
    years,
    band: {
      index: i,
      curve: curve.id,
      label: det.label ?? curve.name,
      convention: curve.convention,
      orientation,
      f_low: fLow,
      f_high: top.f,
      low_cut: lowCut,
      high_cut: top.why,
      extrapolated,
      to_confirm: curve.toConfirm ?? null,
      years_observed: yearsObserved,
      years_before_merger: yearsBefore,
    },
  };
}
