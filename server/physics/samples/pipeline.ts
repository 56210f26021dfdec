import type { CatalogueTheory, CompiledMapping } from "../catalogue-mapping.ts";
import { symbolTableFor } from "../catalogue-mapping.ts";
import { BLACK_HOLE_SCALAR_SENSITIVITY, edgbSpinFactor, inBandTimeKm, type BodyKind } from "../binary.ts";
import { validateCosmology, type Cosmology } from "../cosmology.ts";
import { compileVectorized } from "../expr/compile.ts";
import { expandDefinitions } from "../expr/symbols.ts";
import { detectPowerLaw } from "../invert.ts";
import { quotedValueOf } from "../quoted-forms.ts";
import { gimrFactor, type GimrIndex } from "../taylorf2.ts";
import { SPEED_OF_LIGHT_KM_S, solarMassToKm } from "../units.ts";
import { distanceAlphaColumn, redshiftColumn } from "./distance-table.ts";
import { invertColumns, NotMonotonicError, type ColumnInversion } from "./invert-columns.ts";
import { SampleInputError } from "./sample-input-error.ts";
import { effectiveSampleSize, weightedHistogram, weightedQuantiles, type Histogram } from "./weighted.ts";

/**
 * The per-sample pipeline on typed arrays (docs/samples-jobs.md): columns -> source-frame binaries
 * -> the mapping's prefactor K_i (compiled, vectorised) -> x_i -> prior weights -> weighted credible
 * bound -> validity of the bound for every sample's binary. Pure: no I/O; progress is reported to
 * the caller, which may stop the run by throwing from it.
 */

export type CouplingRange = "positive" | "non_negative" | "any_sign";
export type PriorKind = "as_translated" | "uniform" | "log_uniform";
export type Verdict = "valid" | "outside_validity" | "not_assessed";

export interface SampleColumns {
  deviation: Float64Array;
  m1?: Float64Array;
  m2?: Float64Array;
  mchirp?: Float64Array;
  q?: Float64Array;
  mtotal?: Float64Array;
  chi1?: Float64Array;
  chi2?: Float64Array;
  z?: Float64Array;
  distance_mpc?: Float64Array;
}
export type ColumnRole = keyof SampleColumns;

export interface PipelineInput {
  entry: CatalogueTheory;
  mapping: CompiledMapping;
  parameter: "ppe_beta" | "gimr_dphi";
  k?: GimrIndex;
  includesSpin: boolean;
  signConvention: "plus" | "minus";
  credibility: number;
  frame: "source" | "detector";
  bodies: readonly [BodyKind, BodyKind];
  cosmology: Cosmology;
  /** Lowest observed frequency of the band (Hz): the in-band time tau of the validity conditions. */
  fLowHz: number;
  columns: SampleColumns;
  /** The file's own name for each role, for messages. */
  names: Partial<Record<ColumnRole, string>>;
  prior: { kind: PriorKind; range?: readonly [number, number] | undefined };
  /** The analysis prior, uniform in the deviation over this range (default: the samples' span). */
  analysisRange?: readonly [number, number] | undefined;
  maxNonFiniteFraction: number;
  fileLabel: string;
  onProgress?: (fraction: number) => Promise<void> | void;
}

export interface ConditionSummary {
  label: string;
  condition: string;
  kind: "hard" | "rule_of_thumb";
  /** Weighted fraction of the posterior whose binary fails this condition at the bound. */
  fraction_outside: number;
  /** Power q of the condition in the coupling (value = V_i x^q), null when it is not a power law. */
  power: number | null;
}

export interface PipelineResult {
  /** beta = K_i x^p; null when the mapping is not a power law (each sample inverted on its own). */
  power: number | null;
  range: CouplingRange;
  signed: boolean;
  side: "upper" | "lower" | "interval";
  /** Canonical-unit bound (one-signed) or interval. */
  canonical: { value?: number; interval?: [number, number] };
  quoted: { value?: number; interval?: [number, number] };
  samples: { read: number; used: number; dropped: number; dropped_reasons: { reason: string; count: number }[]; kept_side?: number };
  effective_sample_size: number;
  analysis_range: [number, number];
  verdict: Verdict;
  fraction_outside: number;
  conditions: ConditionSummary[];
  histogram: Histogram;
  notes: string[];
  /** Per kept sample: file row, deviation, beta, x (canonical), weight; and the validity thresholds. */
  perSample: {
    row: Uint32Array;
    deviation: Float64Array;
    beta: Float64Array;
    x: Float64Array;
    weight: Float64Array;
    /** Likelihood weights 1 / (pi_dev |d dev/dx|) (uniform-in-x, no range), for stacking. */
    likelihoodWeight: Float64Array;
    /** Hard conditions hold for |x| in [validLo, validHi] at this sample's binary. */
    validLo: Float64Array;
    validHi: Float64Array;
  };
}

const HISTOGRAM_BINS = 40;

function fail(input: PipelineInput, role: ColumnRole, row: number, message: string): never {
  const column = input.names[role] ?? role;
  throw new SampleInputError(`${input.fileLabel}: column "${column}", row ${row}: ${message}.`, { file: input.fileLabel, column, row });
}

export async function runPipeline(input: PipelineInput): Promise<PipelineResult> {
  const cosmology = validateCosmology(input.cosmology);
  const cols = input.columns;
  const n = cols.deviation.length;
  const notes: string[] = [];
  const report = async (f: number) => input.onProgress?.(Math.min(1, Math.max(0, f)));

  // 1. Non-finite values: counted per column and skipped, or refused above the threshold.
  const skip = new Uint8Array(n);
  const present = (Object.keys(cols) as ColumnRole[]).filter((r) => cols[r] !== undefined);
  let skipped = 0;
  for (const role of present) {
    const c = cols[role]!;
    let bad = 0;
    let first = -1;
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(c[i]!)) {
        bad++;
        if (first < 0) first = i;
        if (!skip[i]) {
          skip[i] = 1;
          skipped++;
        }
      }
    }
    if (bad > 0) {
      if (bad / n > input.maxNonFiniteFraction) {
        fail(input, role, first, `${bad} of ${n} values are NaN or infinite (more than ${(input.maxNonFiniteFraction * 100).toPrecision(3)}% allowed)`);
      }
      notes.push(`${bad} row(s) with a NaN or infinite "${input.names[role] ?? role}" were skipped (first: row ${first}).`);
    }
  }

  // 2. Masses, spins, redshift: source frame, m1 >= m2.
  const m1 = new Float64Array(n);
  const m2 = new Float64Array(n);
  if (cols.m1 && cols.m2) {
    m1.set(cols.m1);
    m2.set(cols.m2);
  } else if (cols.q && (cols.mchirp || cols.mtotal)) {
    const q = cols.q;
    const scale = (cols.mchirp ?? cols.mtotal)!;
    const chirp = cols.mchirp !== undefined;
    for (let i = 0; i < n; i++) {
      if (skip[i]) continue;
      let qi = q[i]!;
      if (!(qi > 0)) fail(input, "q", i, `mass ratio ${qi} is not positive`);
      if (qi > 1) qi = 1 / qi;
      const s = scale[i]!;
      if (!(s > 0)) fail(input, chirp ? "mchirp" : "mtotal", i, `mass ${s} is not positive`);
      const a = chirp ? (s * (1 + qi) ** 0.2) / qi ** 0.6 : s / (1 + qi);
      m1[i] = a;
      m2[i] = qi * a;
    }
  } else {
    throw new SampleInputError(`${input.fileLabel}: map the masses as m1 and m2, chirp mass and q, or total mass and q.`, { file: input.fileLabel });
  }
  for (let i = 0; i < n; i++) {
    if (skip[i]) continue;
    if (!(m1[i]! > 0)) fail(input, cols.m1 ? "m1" : "q", i, `mass ${m1[i]} is not positive`);
    if (!(m2[i]! > 0)) fail(input, cols.m2 ? "m2" : "q", i, `mass ${m2[i]} is not positive`);
  }
  const chi1 = cols.chi1 ? Float64Array.from(cols.chi1) : new Float64Array(n);
  const chi2 = cols.chi2 ? Float64Array.from(cols.chi2) : new Float64Array(n);
  for (const [role, c] of [["chi1", chi1], ["chi2", chi2]] as const) {
    if (!cols[role]) continue;
    for (let i = 0; i < n; i++) if (!skip[i] && !(Math.abs(c[i]!) < 1)) fail(input, role, i, `spin ${c[i]} is outside |chi| < 1`);
  }
  let z: Float64Array | undefined;
  if (cols.z) {
    z = cols.z;
    for (let i = 0; i < n; i++) if (!skip[i] && !(z[i]! >= 0)) fail(input, "z", i, `redshift ${z[i]} is negative`);
  } else if (cols.distance_mpc) {
    const d = cols.distance_mpc;
    for (let i = 0; i < n; i++) if (!skip[i] && !(d[i]! >= 0)) fail(input, "distance_mpc", i, `luminosity distance ${d[i]} Mpc is negative`);
    const clean = Float64Array.from(d, (v, i) => (skip[i] ? 0 : v));
    z = redshiftColumn(clean, cosmology);
    notes.push(`Redshifts were inferred from the luminosity distances with H0 = ${cosmology.H0} km/s/Mpc, Omega_m = ${cosmology.Omega_m}.`);
  }
  if (input.frame === "detector") {
    if (!z) throw new SampleInputError(`${input.fileLabel}: detector-frame masses need a redshift or luminosity-distance column.`, { file: input.fileLabel, column: "z" });
    for (let i = 0; i < n; i++) {
      const f = 1 + (skip[i] ? 0 : z[i]!);
      m1[i] = m1[i]! / f;
      m2[i] = m2[i]! / f;
    }
    notes.push("Detector-frame masses were divided by 1 + z of each sample.");
  }
  const swapped = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (m2[i]! > m1[i]!) {
      swapped[i] = 1;
      const t = m1[i]!;
      m1[i] = m2[i]!;
      m2[i] = t;
      const c = chi1[i]!;
      chi1[i] = chi2[i]!;
      chi2[i] = c;
    }
  }
  await report(0.1);

  // 3. Columns of the mapping's primitive symbols.
  const mapping = input.mapping;
  const requires = new Set(mapping.requires ?? []);
  if ((requires.has("z") || requires.has("D_0") || requires.has("D_alpha")) && !z) {
    throw new SampleInputError(`${input.fileLabel}: this mapping is a propagation effect: map a redshift (z) or luminosity-distance column.`, { file: input.fileLabel, column: "z" });
  }
  const bodyOf = (i: number, body: 1 | 2): BodyKind => (swapped[i] ? input.bodies[2 - body]! : input.bodies[body - 1]!);
  const env = new Map<string, Float64Array>();
  const km1 = new Float64Array(n);
  const km2 = new Float64Array(n);
  const kmPerSun = solarMassToKm(1);
  for (let i = 0; i < n; i++) {
    km1[i] = m1[i]! * kmPerSun;
    km2[i] = m2[i]! * kmPerSun;
  }
  env.set("m1", km1);
  env.set("m2", km2);
  env.set("chi1", chi1);
  env.set("chi2", chi2);
  const s1 = new Float64Array(n);
  const s2 = new Float64Array(n);
  const sg1 = new Float64Array(n);
  const sg2 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    s1[i] = bodyOf(i, 1) === "ns" ? 0 : edgbSpinFactor(chi1[i]!);
    s2[i] = bodyOf(i, 2) === "ns" ? 0 : edgbSpinFactor(chi2[i]!);
    sg1[i] = bodyOf(i, 1) === "bh" ? BLACK_HOLE_SCALAR_SENSITIVITY : Number.NaN;
    sg2[i] = bodyOf(i, 2) === "bh" ? BLACK_HOLE_SCALAR_SENSITIVITY : Number.NaN;
  }
  const fLowPerKm = input.fLowHz / SPEED_OF_LIGHT_KM_S;
  env.set("f_low", new Float64Array(n).fill(fLowPerKm));
  const tau = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const M = km1[i]! + km2[i]!;
    const mc = ((km1[i]! * km2[i]!) / (M * M)) ** 0.6 * M;
    tau[i] = inBandTimeKm(mc, input.fLowHz, z && !skip[i] ? z[i]! : 0);
  }
  env.set("tau", tau);
  env.set("s1", s1);
  env.set("s2", s2);
  env.set("sigma1", sg1);
  env.set("sigma2", sg2);
  if (z) {
    const zc = Float64Array.from(z, (v, i) => (skip[i] ? 0 : v));
    env.set("z", zc);
    if (mapping.distance) {
      env.set("D_alpha", distanceAlphaColumn(zc, mapping.distance.alphaMd, cosmology));
      env.set("D_0", distanceAlphaColumn(zc, 0, cosmology));
    }
  }
  const table = symbolTableFor(input.entry);
  const args = table.primitives;
  const couplingSymbol = mapping.coupling.symbol;
  const entryCoupling = input.entry.couplings.find((c) => c.symbol === couplingSymbol) as { range?: CouplingRange } | undefined;
  const xcol = new Float64Array(n);
  const nanCol = new Float64Array(n).fill(Number.NaN);
  const heldFixed = (input.entry.mappings[mapping.index] as { held_fixed?: Record<string, number> } | undefined)?.held_fixed ?? {};
  const argColumns = args.map((a) => {
    if (a === couplingSymbol) return xcol;
    if (a in heldFixed) return new Float64Array(n).fill(heldFixed[a]!);
    return env.get(a) ?? nanCol;
  });
  const evalAt = (expression: string, x: number, out?: Float64Array) => {
    xcol.fill(x);
    return compileVectorized(expression, args)(argColumns, out);
  };
  const K = evalAt(mapping.expanded, 1);
  const K2 = evalAt(mapping.expanded, 2);
  await report(0.3);

  // Power law: found on the first usable sample, then checked on every sample.
  let first = -1;
  for (let i = 0; i < n; i++) if (!skip[i] && K[i] !== 0 && Number.isFinite(K[i]!)) { first = i; break; }
  if (first < 0) {
    throw new SampleInputError(`${input.fileLabel}: the mapping vanishes or is undefined for every sample's binary (e.g. equal masses and spins emit no scalar dipole; neutron stars need scalar sensitivities).`, { file: input.fileLabel });
  }
  const sampleEnv: Record<string, number> = {};
  for (const [name, c] of env) sampleEnv[name] = c[first]!;
  const law = detectPowerLaw(mapping.bind ? mapping.bind(sampleEnv) : (x: number) => mapping.evaluate(x, sampleEnv));
  // Not a power law: every sample is inverted on its own (vectorised bisection), if F is monotonic (invert-columns.ts).
  const general = !law || law.power === 0;
  const p = general ? Number.NaN : law.power;
  const twoP = 2 ** p;
  const range: CouplingRange = entryCoupling?.range ?? "non_negative";
  if (!entryCoupling?.range) notes.push(`The catalogue entry states no range for ${couplingSymbol}: it is taken as ${couplingSymbol} >= 0.`);
  const oddInteger = Number.isInteger(p) && Math.abs(p) % 2 === 1;
  const signed = range === "any_sign" && (general || oddInteger);
  if (range === "any_sign" && !general && !oddInteger) notes.push(`${couplingSymbol} may take either sign, but beta depends on it through a power ${p}: the bound is on |${couplingSymbol}|.`);

  // 4. beta per sample, reachable side, x.
  const dev = cols.deviation;
  const beta = new Float64Array(n);
  const perDev = new Float64Array(n); // |d beta / d deviation|
  const signFlip = input.signConvention === "minus" ? -1 : 1;
  if (input.parameter === "ppe_beta") {
    for (let i = 0; i < n; i++) {
      beta[i] = signFlip * dev[i]!;
      perDev[i] = 1;
    }
  } else {
    for (let i = 0; i < n; i++) {
      if (skip[i]) continue;
      const M = m1[i]! + m2[i]!;
      const eta = (m1[i]! * m2[i]!) / (M * M);
      const f = gimrFactor(input.k!, eta, {
        includesSpin: input.includesSpin,
        spins: { eta, dm: (m1[i]! - m2[i]!) / M, chi_s: (chi1[i]! + chi2[i]!) / 2, chi_a: (chi1[i]! - chi2[i]!) / 2, bodies: [bodyOf(i, 1), bodyOf(i, 2)] },
      });
      if (f.status !== "ok") throw new SampleInputError(`${input.fileLabel}: ${f.reason}.`, { file: input.fileLabel });
      beta[i] = f.factor * dev[i]!;
      perDev[i] = Math.abs(f.factor);
    }
  }
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    if (skip[i]) continue;
    if (dev[i]! < lo) lo = dev[i]!;
    if (dev[i]! > hi) hi = dev[i]!;
  }
  const analysisRange: [number, number] = input.analysisRange ? [input.analysisRange[0], input.analysisRange[1]] : [lo, hi];

  let inversion: ColumnInversion | null = null;
  if (general) {
    const compiled = compileVectorized(mapping.expanded, args);
    const evaluate = (values: Float64Array, out: Float64Array) => {
      xcol.set(values);
      return compiled(argColumns, out);
    };
    const skipOrOut = Uint8Array.from(skip, (v, i) => (v || dev[i]! < analysisRange[0] || dev[i]! > analysisRange[1] ? 1 : 0));
    try {
      inversion = invertColumns(evaluate, beta, skipOrOut, range === "any_sign");
    } catch (err) {
      if (!(err instanceof NotMonotonicError)) throw err;
      const [a, b] = err.between;
      throw new SampleInputError(
        `${input.fileLabel}: the ${input.entry.slug} mapping at b = ${mapping.b} is not monotonic in ${couplingSymbol} for the binary of row ${err.row} (beta rises and falls between ${couplingSymbol} = ${a.toPrecision(3)} and ${b.toPrecision(3)}): a bound on beta then allows disjoint ranges of ${couplingSymbol}, and no single bound follows.`,
        { file: input.fileLabel, row: err.row },
      );
    }
    notes.push(`The mapping is not a power law in ${couplingSymbol}: each sample was inverted on its own (bisection over ${range === "any_sign" ? "both signs of" : "positive"} ${couplingSymbol}, 1e-60 to 1e60 in canonical units, after checking that beta is monotonic in ${couplingSymbol} for that sample's binary).`);
  }
  const keep = new Uint8Array(n);
  const reasons = new Map<string, number>();
  const drop = (why: string) => reasons.set(why, (reasons.get(why) ?? 0) + 1);
  let used = 0;
  let unreachable = 0;
  let mismatch = 0;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (skip[i]) {
      drop("a mapped column holds NaN or an infinite value");
      continue;
    }
    const k = K[i]!;
    if (!Number.isFinite(k) || k === 0) {
      drop("the mapping vanishes or is undefined for this sample's binary");
      continue;
    }
    if (!general && Math.abs(K2[i]! / k - twoP) > 1e-9 * twoP) mismatch++;
    if (dev[i]! < analysisRange[0] || dev[i]! > analysisRange[1]) {
      drop("the deviation lies outside the stated analysis prior range");
      continue;
    }
    if (inversion) {
      if (inversion.unreachable[i] || !(inversion.slope[i]! > 0)) {
        unreachable++;
        drop("the sample lies on the side of beta this theory cannot reach");
        continue;
      }
      x[i] = inversion.x[i]!;
      keep[i] = 1;
      used++;
      continue;
    }
    const y = beta[i]! / k;
    if (signed) {
      x[i] = Math.sign(y) * Math.abs(y) ** (1 / p);
    } else {
      if (!(y > 0)) {
        unreachable++;
        drop("the sample lies on the side of beta this theory cannot reach");
        continue;
      }
      x[i] = y ** (1 / p);
    }
    keep[i] = 1;
    used++;
  }
  if (mismatch > 0) {
    throw new SampleInputError(`${input.fileLabel}: the mapping is not a power law in ${couplingSymbol} for ${mismatch} sample(s); sample-by-sample translation needs one.`, { file: input.fileLabel });
  }
  if (used === 0) {
    throw new SampleInputError(`${input.fileLabel}: no sample is usable (${[...reasons.keys()].join("; ")}).`, { file: input.fileLabel });
  }
  await report(0.45);

  // 5. Weights: w = pi_x(x) / (pi_dev(dev) |d dev / dx|), |d dev/dx| = |p K| |x|^(p-1) / |d beta/d dev|.
  const rows = new Uint32Array(used);
  const xs = new Float64Array(used);
  const ws = new Float64Array(used);
  const lw = new Float64Array(used);
  const devs = new Float64Array(used);
  const betas = new Float64Array(used);
  const prior = input.prior;
  const [ra, rb] = prior.range ?? [-Infinity, Infinity];
  if (prior.kind === "log_uniform" && prior.range && !(ra > 0)) {
    throw new SampleInputError(`prior.range: a log-uniform prior needs a range with a positive lower end.`, {});
  }
  let j = 0;
  for (let i = 0; i < n; i++) {
    if (!keep[i]) continue;
    const xi = x[i]!;
    const ax = Math.abs(xi);
    const jac = (inversion ? inversion.slope[i]! : Math.abs(p * K[i]!) * ax ** (p - 1)) / perDev[i]!;
    const like = 1 / jac;
    let w = 1;
    const inRange = signed && prior.kind !== "log_uniform" ? xi >= ra && xi <= rb : ax >= ra && ax <= rb;
    if (prior.kind === "uniform") w = inRange ? like : 0;
    else if (prior.kind === "log_uniform") w = inRange ? like / ax : 0;
    else if (prior.range) w = inRange ? 1 : 0;
    rows[j] = i;
    xs[j] = xi;
    ws[j] = w;
    lw[j] = like;
    devs[j] = dev[i]!;
    betas[j] = beta[i]!;
    j++;
  }
  let wsum = 0;
  for (let i = 0; i < used; i++) wsum += ws[i]!;
  if (!(wsum > 0) || !Number.isFinite(wsum)) {
    throw new SampleInputError(`prior.range: no translated sample lies inside the prior range [${ra}, ${rb}].`, {});
  }
  const ess = prior.kind === "as_translated" && !prior.range ? used : effectiveSampleSize(ws);
  await report(0.55);

  // 6. Weighted credible bound.
  const sorted = Float64Array.from(xs).sort();
  const c = input.credibility;
  const weights = prior.kind === "as_translated" && !prior.range ? null : ws;
  let side: PipelineResult["side"];
  const canonical: PipelineResult["canonical"] = {};
  if (signed) {
    const [a, b] = weightedQuantiles(xs, weights, sorted, [(1 - c) / 2, (1 + c) / 2]);
    side = "interval";
    canonical.interval = [a!, b!];
  } else {
    const upper = inversion ? inversion.grEnd === "zero" : p > 0;
    side = upper ? "upper" : "lower";
    canonical.value = weightedQuantiles(xs, weights, sorted, [upper ? c : 1 - c])[0]!;
  }
  await report(0.7);

  // 7. Validity at the bound for every kept sample's binary: conditions are power laws V_i |x|^q.
  const validLo = new Float64Array(used);
  const validHi = new Float64Array(used).fill(Infinity);
  const conditions: ConditionSummary[] = [];
  const bound = signed ? Math.max(Math.abs(canonical.interval![0]), Math.abs(canonical.interval![1])) : canonical.value!;
  let anyHardFailWeight = 0;
  const failedHard = new Uint8Array(used);
  for (const cond of mapping.validity ?? []) {
    const expr = compiledConditionExpression(input.entry, mapping.index, cond.label);
    const V1 = expr === null ? null : evalAt(expr, 1);
    const V2 = expr === null ? null : evalAt(expr, 2);
    let q: number | null = null;
    let outside = 0;
    if (V1 && V2) {
      for (let t = 0; t < used; t++) {
        const i = rows[t]!;
        const v1 = V1[i]!;
        if (v1 > 0 && Number.isFinite(v1) && V2[i]! > 0) {
          q = Math.log2(V2[i]! / v1);
          break;
        }
      }
    }
    for (let t = 0; t < used; t++) {
      const i = rows[t]!;
      if (cond.body && cond.appliesTo && !cond.appliesTo.includes(bodyOf(i, cond.body))) continue;
      const v1 = V1 ? V1[i]! : Number.NaN;
      let ok: boolean;
      if (q !== null && Number.isFinite(v1)) {
        const value = v1 * bound ** q;
        ok = value <= cond.max;
        if (cond.kind === "hard" && v1 > 0) {
          const threshold = (cond.max / v1) ** (1 / q);
          if (q > 0) validHi[t] = Math.min(validHi[t]!, threshold);
          else validLo[t] = Math.max(validLo[t]!, threshold);
        }
      } else {
        ok = false;
      }
      if (!ok) {
        outside += weights ? weights[t]! : 1;
        if (cond.kind === "hard") failedHard[t] = 1;
      }
    }
    conditions.push({ label: cond.label, condition: cond.condition, kind: cond.kind, fraction_outside: outside / (weights ? wsum : used), power: q });
  }
  for (let t = 0; t < used; t++) if (failedHard[t]) anyHardFailWeight += weights ? weights[t]! : 1;
  const fractionOutside = anyHardFailWeight / (weights ? wsum : used);
  const verdict: Verdict = conditions.length === 0 ? "not_assessed" : fractionOutside <= 1 - c ? "valid" : "outside_validity";
  await report(0.85);

  // 8. Quoted values and the histogram.
  const form = mapping.coupling.quoted.form;
  const quoted: PipelineResult["quoted"] = {};
  if (canonical.value !== undefined) quoted.value = quotedValueOf(form, canonical.value);
  if (canonical.interval) quoted.interval = [quotedValueOf(form, canonical.interval[0]), quotedValueOf(form, canonical.interval[1])];
  const inQuoted = new Float64Array(used);
  for (let t = 0; t < used; t++) inQuoted[t] = quotedValueOf(form, xs[t]!);
  const histogram = weightedHistogram(inQuoted, weights, HISTOGRAM_BINS, signed ? "linear" : "log");

  const dropped = n - used;
  return {
    power: general ? null : p,
    range,
    signed,
    side,
    canonical,
    quoted,
    samples: {
      read: n,
      used,
      dropped,
      dropped_reasons: [...reasons].map(([reason, count]) => ({ reason, count })),
      ...(signed ? {} : { kept_side: used }),
    },
    effective_sample_size: ess,
    analysis_range: analysisRange,
    verdict,
    fraction_outside: fractionOutside,
    conditions,
    histogram,
    notes: unreachable > 0 ? [...notes, `${used} of ${n - skipped} samples lie on the side of beta the theory can reach and were kept; ${unreachable} were dropped.`] : notes,
    perSample: { row: rows, deviation: devs, beta: betas, x: xs, weight: ws, likelihoodWeight: lw, validLo, validHi },
  };
}

/** The stored expression of a validity condition, expanded to primitives. */
function compiledConditionExpression(entry: CatalogueTheory, index: number, label: string): string | null {
  const v = entry.mappings[index]?.validity?.find((c) => c.label === label);
  if (!v) return null;
  return expandForColumns(entry, v.expression);
}

function expandForColumns(entry: CatalogueTheory, expression: string): string {
  return expandDefinitions(expression, symbolTableFor(entry));
}
