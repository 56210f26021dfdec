/**
 * The consistency test from posterior samples of the two remnant estimates. Each inspiral sample is
 * paired with a merger-ringdown sample (a seeded random pairing, which samples the convolution of the
 * two posteriors), each pair gives (dM, dchi) normalised by the pair's mean, and the 2-D density of
 * the pairs comes from d3-contour's contourDensity (binning and a Gaussian-like blur on a grid; no
 * kernels of our own). Credible regions are highest-density regions of that grid: the contour at
 * level p is the density value above which a fraction p of the mass lies, and the GR quantile is the
 * mass above the density at (0, 0).
 */
import { contourDensity } from "d3-contour";
import { PhysicsInputError } from "../input-error.ts";
import { MIN_MEAN_SPIN, type DeviationGaussian } from "./gaussian-consistency.ts";
import type { Vector2 } from "./matrix2.ts";

export interface RemnantSamples {
  readonly M_f: ArrayLike<number>;
  readonly chi_f: ArrayLike<number>;
}

export interface SampleConsistencyOptions {
  readonly levels: readonly number[];
  /** Number of (inspiral, merger-ringdown) pairs drawn; default max(n_I, n_R) capped at 50 000. */
  readonly pairs?: number;
  readonly seed?: number;
}

export interface SampleConsistencyResult {
  readonly deviation: DeviationGaussian;
  readonly gr_quantile: number;
  /** True when (0, 0) lies outside the gridded region (the quantile is then 1 to the grid's accuracy). */
  readonly gr_outside_grid: boolean;
  readonly contours: { level: number; paths: Vector2[][] }[];
  readonly pairs: number;
  readonly cautions: string[];
}

const MAX_PAIRS = 50_000;
const MIN_SAMPLES = 100;
/** Plot box in pixels for the density estimate; a cell is 2 x 2 pixels. */
const BOX = 240;
const CELL = 2;
/**
 * Fraction of Scott's rule used as the bandwidth. Smoothing widens the density and pulls the GR
 * quantile down; with tens of thousands of pairs a narrower kernel costs little noise (our own choice).
 */
const BANDWIDTH_FACTOR = 0.8;

function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function checkSamples(s: RemnantSamples, prefix: string): number {
  const n = s.M_f.length;
  if (s.chi_f.length !== n) {
    throw new PhysicsInputError(`${prefix}.chi_f`, `${prefix}: M_f has ${n} samples but chi_f has ${s.chi_f.length}; the columns must have the same length`);
  }
  if (n < MIN_SAMPLES) throw new PhysicsInputError(`${prefix}.M_f`, `${prefix}: at least ${MIN_SAMPLES} samples are needed, got ${n}`);
  for (let i = 0; i < n; i += 1) {
    const m = s.M_f[i]!;
    const c = s.chi_f[i]!;
    if (!Number.isFinite(m) || m <= 0) throw new PhysicsInputError(`${prefix}.M_f`, `${prefix}: sample ${i + 1} has M_f = ${m}; masses must be positive and finite`);
    if (!Number.isFinite(c) || Math.abs(c) >= 1) throw new PhysicsInputError(`${prefix}.chi_f`, `${prefix}: sample ${i + 1} has chi_f = ${c}; spins must satisfy |chi_f| < 1`);
  }
  return n;
}

function mean(xs: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < xs.length; i += 1) s += xs[i]!;
  return s / xs.length;
}

function moments(x: Float64Array, y: Float64Array): DeviationGaussian {
  const mx = mean(x);
  const my = mean(y);
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (let i = 0; i < x.length; i += 1) {
    const dx = x[i]! - mx;
    const dy = y[i]! - my;
    sxx += dx * dx;
    syy += dy * dy;
    sxy += dx * dy;
  }
  const n = x.length - 1;
  return {
    mean: [mx, my],
    covariance: [
      [sxx / n, sxy / n],
      [sxy / n, syy / n],
    ],
  };
}

/** One estimate's sample mean, standard deviations and correlation of (M_f, chi_f) (unbiased sample moments). */
export function remnantSampleSummary(s: RemnantSamples): { M_f: number; chi_f: number; sigma_M_f: number; sigma_chi_f: number; rho: number } {
  const m = moments(Float64Array.from(s.M_f), Float64Array.from(s.chi_f));
  const sM = Math.sqrt(m.covariance[0][0]);
  const sC = Math.sqrt(m.covariance[1][1]);
  return { M_f: m.mean[0], chi_f: m.mean[1], sigma_M_f: sM, sigma_chi_f: sC, rho: sM > 0 && sC > 0 ? m.covariance[0][1] / (sM * sC) : 0 };
}

export function sampleConsistency(inspiral: RemnantSamples, mergerRingdown: RemnantSamples, options: SampleConsistencyOptions): SampleConsistencyResult {
  const nI = checkSamples(inspiral, "inspiral");
  const nR = checkSamples(mergerRingdown, "merger_ringdown");
  const meanSpin = (mean(inspiral.chi_f) + mean(mergerRingdown.chi_f)) / 2;
  if (Math.abs(meanSpin) < MIN_MEAN_SPIN) {
    throw new PhysicsInputError(
      "merger_ringdown.chi_f",
      `the mean remnant spin (${meanSpin.toPrecision(3)}) is within ${MIN_MEAN_SPIN} of zero: the spin deviation is ill-defined there`,
    );
  }
  const pairs = Math.min(options.pairs ?? Math.max(nI, nR), MAX_PAIRS);
  const rng = mulberry32(options.seed ?? 20161);
  const dM = new Float64Array(pairs);
  const dC = new Float64Array(pairs);
  let tiny = 0;
  for (let k = 0; k < pairs; k += 1) {
    const i = Math.floor(rng() * nI);
    const j = Math.floor(rng() * nR);
    const MI = inspiral.M_f[i]!;
    const MR = mergerRingdown.M_f[j]!;
    const cI = inspiral.chi_f[i]!;
    const cR = mergerRingdown.chi_f[j]!;
    dM[k] = (2 * (MI - MR)) / (MI + MR);
    dC[k] = (2 * (cI - cR)) / (cI + cR);
    if (Math.abs(cI + cR) < 2 * MIN_MEAN_SPIN) tiny += 1;
  }
  const deviation = moments(dM, dC);
  const sd: Vector2 = [Math.sqrt(deviation.covariance[0][0]), Math.sqrt(deviation.covariance[1][1])];
  if (!(sd[0] > 0) || !(sd[1] > 0)) {
    throw new PhysicsInputError("merger_ringdown.M_f", "the deviation samples have zero spread in one variable; the density cannot be estimated");
  }

  // Robust plot box: the central mass of the samples plus a margin, widened to hold (0, 0) when it is near.
  const lo: Vector2 = [Infinity, Infinity];
  const hi: Vector2 = [-Infinity, -Infinity];
  const sorted = [Float64Array.from(dM).sort(), Float64Array.from(dC).sort()];
  for (const a of [0, 1] as const) {
    const s = sorted[a]!;
    const q = (p: number) => s[Math.min(s.length - 1, Math.floor(p * s.length))]!;
    const width = q(0.995) - q(0.005);
    lo[a] = q(0.005) - 0.35 * width;
    hi[a] = q(0.995) + 0.35 * width;
    const m = deviation.mean[a];
    if (Math.abs(m) < 8 * sd[a]) {
      lo[a] = Math.min(lo[a], -0.15 * width);
      hi[a] = Math.max(hi[a], 0.15 * width);
    }
  }
  const toPx = (v: number, a: 0 | 1) => ((v - lo[a]) / (hi[a] - lo[a])) * BOX;
  const fromPx = (p: number, a: 0 | 1) => lo[a] + (p / BOX) * (hi[a] - lo[a]);

  // A fraction of Scott's rule in the pixel plane, with the geometric mean of the two axes' spreads.
  const pxSd = Math.sqrt(((sd[0] * BOX) / (hi[0] - lo[0])) * ((sd[1] * BOX) / (hi[1] - lo[1])));
  const bandwidth = Math.max(1, BANDWIDTH_FACTOR * pxSd * pairs ** (-1 / 6));

  const sortedLevels = [...new Set(options.levels)].sort((a, b) => a - b);
  let thresholds: number[] = [];
  let grQuantile = 1;
  let grOutside = true;
  const density = contourDensity<number>()
    .x((k) => toPx(dM[k]!, 0))
    .y((k) => toPx(dC[k]!, 1))
    .size([BOX, BOX])
    .cellSize(CELL)
    .bandwidth(bandwidth)
    .thresholds((values: ArrayLike<number>) => {
      // Called once with the blurred grid: highest-density levels and the density at (0, 0).
      const grid = Float64Array.from(values);
      const total = grid.reduce((s, v) => s + v, 0);
      const desc = Float64Array.from(grid).sort().reverse();
      const cum = new Float64Array(desc.length);
      let run = 0;
      desc.forEach((v, i) => {
        run += v;
        cum[i] = run / total;
      });
      const pow4k = CELL * CELL;
      // Highest level first = lowest density first: d3 sorts thresholds ascending, so this order survives.
      thresholds = [...sortedLevels].reverse().map((p) => {
        let i = 0;
        while (i < cum.length - 1 && cum[i]! < p) i += 1;
        return desc[i]! / pow4k;
      });
      // The grid's layout as contourDensity builds it: blur radius r, padding 3 r, cells of CELL pixels.
      const r = (Math.sqrt(4 * bandwidth * bandwidth + 1) - 1) / 2;
      const o = r * 3;
      const n = (BOX + o * 2) >> 1;
      const m = (BOX + o * 2) >> 1;
      const gx = (toPx(0, 0) + o) / CELL - 0.5;
      const gy = (toPx(0, 1) + o) / CELL - 0.5;
      if (gx >= 0 && gy >= 0 && gx < n - 1 && gy < m - 1) {
        grOutside = false;
        const x0 = Math.floor(gx);
        const y0 = Math.floor(gy);
        const tx = gx - x0;
        const ty = gy - y0;
        const at = (x: number, y: number) => grid[x + y * n]!;
        const v0 =
          (1 - tx) * (1 - ty) * at(x0, y0) + tx * (1 - ty) * at(x0 + 1, y0) + (1 - tx) * ty * at(x0, y0 + 1) + tx * ty * at(x0 + 1, y0 + 1);
        let above = 0;
        for (const v of grid) if (v > v0) above += v;
        grQuantile = above / total;
      }
      return thresholds;
    });
  const index = Array.from({ length: pairs }, (_, k) => k);
  const polygons = density(index);
  const contours = sortedLevels.map((level, i) => {
    const poly = polygons[sortedLevels.length - 1 - i];
    const paths: Vector2[][] = [];
    for (const polygon of poly?.coordinates ?? []) {
      for (const ring of polygon) paths.push(ring.map(([px, py]) => [fromPx(px!, 0), fromPx(py!, 1)] as Vector2));
    }
    return { level, paths };
  });

  const cautions = [
    `density from ${pairs} random (inspiral, merger-ringdown) pairs, smoothed on a grid (bandwidth ${bandwidth.toFixed(1)} of ${BOX} cells across); quantiles carry a Monte-Carlo error of order 1/sqrt(pairs) plus the smoothing`,
  ];
  if (grOutside) cautions.push("(0, 0) lies outside the gridded region, far in the tail: the GR quantile is 1 to the accuracy of the grid");
  if (tiny > 0) cautions.push(`${tiny} pairs have a mean spin within ${MIN_MEAN_SPIN} of zero, where dchi is ill-defined; they stretch the spin axis`);
  return { deviation, gr_quantile: Math.min(1, Math.max(0, grQuantile)), gr_outside_grid: grOutside, contours, pairs, cautions };
}
