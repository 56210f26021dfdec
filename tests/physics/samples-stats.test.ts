import { describe, expect, it } from "vitest";
import { DEFAULT_COSMOLOGY } from "../../common/convert.ts";
import type { SamplesJobResult, StackJobRequest } from "../../common/jobs.ts";
import { makeBinary } from "../../server/physics/binary.ts";
import { compileMapping, type CatalogueTheory, type CompiledMapping } from "../../server/physics/catalogue-mapping.ts";
import { createConversionContext } from "../../server/physics/convert.ts";
import { runPipeline, type PipelineInput, type PipelineResult } from "../../server/physics/samples/pipeline.ts";
import { weightedQuantiles } from "../../server/physics/samples/weighted.ts";
import { readStackValues, stackValues } from "../../server/jobs/samples-job.ts";
import { runStackJob } from "../../server/jobs/stack-job.ts";
import { canonicalValueOf } from "../../server/physics/quoted-forms.ts";
import { seedCatalogue } from "../api/convert-fixture.ts";
import { filled, gaussian } from "../helpers/samples-data.ts";

/**
 * The samples statistics against formulas written here (docs/samples-jobs.md): synthetic Gaussian
 * posteriors on beta at one fixed binary, where the coupling posterior under each prior is known in
 * closed form or as a one-dimensional integral, and the stack of two events against the product of
 * their Gaussian likelihoods.
 */

// Standard normal CDF through erf (Abramowitz & Stegun 1964, 7.1.26, |error| < 1.5e-7).
function Phi(x: number): number {
  const z = Math.abs(x) / Math.SQRT2;
  const t = 1 / (1 + 0.3275911 * z);
  const erf = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-z * z);
  return x >= 0 ? 0.5 * (1 + erf) : 0.5 * (1 - erf);
}
function inversePhi(p: number): number {
  let lo = -10;
  let hi = 10;
  for (let i = 0; i < 100; i++) {
    const mid = (lo + hi) / 2;
    if (Phi(mid) < p) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
/** The c-quantile of an unnormalised density on [a, b] (trapezoid rule on 200 001 points). */
function quantileOf(density: (x: number) => number, a: number, b: number, c: number): number {
  const n = 200_000;
  const h = (b - a) / n;
  const cum = new Float64Array(n + 1);
  let prev = density(a);
  for (let i = 1; i <= n; i++) {
    const f = density(a + i * h);
    cum[i] = cum[i - 1]! + ((prev + f) * h) / 2;
    prev = f;
  }
  const target = c * cum[n]!;
  let i = 0;
  while (cum[i + 1]! < target) i++;
  return a + (i + (target - cum[i]!) / (cum[i + 1]! - cum[i]!)) * h;
}
/** Weighted CDF of the analytic density at x: for a tolerance in probability, scale-free. */
function cdfAt(density: (x: number) => number, a: number, b: number, x: number): number {
  const n = 200_000;
  const h = (b - a) / n;
  let total = 0;
  let below = 0;
  for (let i = 0; i < n; i++) {
    const m = a + (i + 0.5) * h;
    const f = density(m) * h;
    total += f;
    if (m <= x) below += f;
  }
  return below / total;
}

const catalogue = seedCatalogue();
function target(slug: string, b: number): { entry: CatalogueTheory; mapping: CompiledMapping } {
  const t = catalogue.bySlug.get(slug)!;
  return { entry: t.theory.entry as CatalogueTheory, mapping: t.mappings.find((m) => m.compiled.b === b)!.compiled };
}
function prefactor(mapping: CompiledMapping, m1: number, m2: number): number {
  const env = createConversionContext(makeBinary({ m1, m2, frame: "source" }), { cosmology: DEFAULT_COSMOLOGY }).envFor(mapping);
  return mapping.evaluate(1, env);
}

function input(t: { entry: CatalogueTheory; mapping: CompiledMapping }, beta: Float64Array, m1: number, m2: number, prior: PipelineInput["prior"], credibility = 0.9): PipelineInput {
  const n = beta.length;
  return {
    entry: t.entry,
    mapping: t.mapping,
    parameter: "ppe_beta",
    includesSpin: false,
    signConvention: "plus",
    credibility,
    frame: "source",
    bodies: ["bh", "bh"],
    cosmology: DEFAULT_COSMOLOGY,
    fLowHz: 20,
    columns: { deviation: beta, m1: filled(n, m1), m2: filled(n, m2) },
    names: { deviation: "beta", m1: "m1", m2: "m2" },
    prior,
    maxNonFiniteFraction: 0.01,
    fileLabel: "synthetic",
  };
}

describe("posterior samples: weighted credible bounds", () => {
  // EdGB at b = -7 (Yagi 2012 mapping as catalogued): beta = K alpha^2 with K < 0 for a 10 + 5 Msun binary of non-spinning holes.
  const edgb = target("edgb", -7);
  const K = prefactor(edgb.mapping, 10, 5);
  const sigma = 2e-3;
  const mu = -0.5 * sigma;
  const n = 100_000;
  const beta = gaussian(2024, n, mu, sigma);
  // In y = beta / K the posterior is N(m, sd) cut at y > 0 (the side EdGB reaches), alpha = sqrt(y).
  const m = mu / K;
  const sd = sigma / Math.abs(K);
  const like = (alpha: number) => Math.exp(-0.5 * ((K * alpha * alpha - mu) / sigma) ** 2);
  const alphaMax = Math.sqrt(m + 8 * sd);

  it("when the prior is 'as translated', then the bound is the truncated-Gaussian quantile in closed form (derived)", async () => {
    const r = await runPipeline(input(edgb, beta, 10, 5, { kind: "as_translated" }));
    expect(K).toBeLessThan(0);
    expect(r.side).toBe("upper");
    expect(r.power).toBe(2);
    // Kept fraction: P(beta < 0) = Phi(-mu/sigma) = Phi(0.5) (derived); binomial error at n = 1e5 is 0.0016.
    expect(Math.abs(r.samples.used / n - Phi(0.5))).toBeLessThan(0.006);
    const p0 = Phi(-m / sd);
    const yc = m + sd * inversePhi(p0 + 0.9 * (1 - p0));
    expect(Math.abs(r.canonical.value! / Math.sqrt(yc) - 1)).toBeLessThan(0.01);
    expect(r.effective_sample_size).toBe(r.samples.used);
    // sqrt_alpha is quoted: the quoted value is alpha^(1/2).
    expect(r.quoted.value).toBeCloseTo(Math.sqrt(r.canonical.value!), 12);
  });

  it("when the prior is uniform in alpha, then the weighted bound matches the quantile of N(K alpha^2; mu, sigma) on alpha > 0 (derived, numerical integral)", async () => {
    const r = await runPipeline(input(edgb, beta, 10, 5, { kind: "uniform" }));
    const exact = quantileOf(like, 0, alphaMax, 0.9);
    // Importance-sampling error on the CDF is about sqrt(c(1-c)/ESS); allow 5 times that.
    expect(Math.abs(cdfAt(like, 0, alphaMax, r.canonical.value!) - 0.9)).toBeLessThan(5 * Math.sqrt(0.09 / r.effective_sample_size));
    expect(Math.abs(r.canonical.value! / exact - 1)).toBeLessThan(0.02);
    expect(r.effective_sample_size).toBeLessThan(r.samples.used);
    expect(r.effective_sample_size).toBeGreaterThan(1000);
    // The reweighting matters here: the as-translated bound is elsewhere (so this test would fail without the weights).
    const plain = await runPipeline(input(edgb, beta, 10, 5, { kind: "as_translated" }));
    expect(Math.abs(plain.canonical.value! / exact - 1)).toBeGreaterThan(0.05);
  });

  it("when the prior is log-uniform in alpha over a range, then the bound matches the quantile of N(K alpha^2; mu, sigma) / alpha on that range (derived)", async () => {
    const a = 0.2 * Math.sqrt(sd);
    const b = alphaMax;
    const r = await runPipeline(input(edgb, beta, 10, 5, { kind: "log_uniform", range: [a, b] }));
    const density = (alpha: number) => like(alpha) / alpha;
    const exact = quantileOf(density, a, b, 0.9);
    expect(Math.abs(cdfAt(density, a, b, r.canonical.value!) - 0.9)).toBeLessThan(5 * Math.sqrt(0.09 / r.effective_sample_size));
    expect(Math.abs(r.canonical.value! / exact - 1)).toBeLessThan(0.03);
    expect(Math.abs(r.canonical.value! / quantileOf(like, 0, alphaMax, 0.9) - 1)).toBeGreaterThan(0.05);
  });

  it("when a coupling may take either sign and beta is linear in it, then the result is a signed equal-tailed interval (derived)", async () => {
    // Time-varying G at b = -13 (beta = -(275/851968) Gdot Mc), declared here with range "any_sign".
    const vg = catalogue.bySlug.get("varying-g")!.theory.entry as CatalogueTheory;
    const entry = { ...vg, couplings: vg.couplings.map((c, i) => (i === 0 ? { ...c, range: "any_sign" } : c)) } as CatalogueTheory;
    const mapping = compileMapping(entry, 0);
    const Kg = prefactor(mapping, 10, 5);
    const betas = gaussian(77, 50_000, 1e-3, 4e-3);
    const r = await runPipeline(input({ entry, mapping }, betas, 10, 5, { kind: "as_translated" }));
    expect(r.signed).toBe(true);
    expect(r.side).toBe("interval");
    // x = beta / K is Gaussian with mean 1e-3/K and sd 4e-3/|K|: the 5% and 95% points (derived).
    const lo = (1e-3 + 4e-3 * inversePhi(Kg < 0 ? 0.95 : 0.05)) / Kg;
    const hi = (1e-3 + 4e-3 * inversePhi(Kg < 0 ? 0.05 : 0.95)) / Kg;
    const [a, b] = r.canonical.interval!;
    expect(Math.abs(a - lo) / (hi - lo)).toBeLessThan(0.01);
    expect(Math.abs(b - hi) / (hi - lo)).toBeLessThan(0.01);
    expect(r.samples.used).toBe(50_000);
    // The in-band condition |Gdot/G| tau << 1 needs f_low and tau per sample: it is assessed, not left as NaN.
    expect(r.conditions.length).toBeGreaterThan(0);
    for (const c of r.conditions) expect(c.power).toBe(1);
  });

  it("when weights are given, then the weighted quantile interpolates the weighted CDF (derived on four points)", () => {
    const x = Float64Array.from([3, 1, 2, 4]);
    const w = Float64Array.from([1, 1, 2, 0]);
    // Sorted: 1 (C=0.25), 2 (C=0.75), 3 (C=1), 4 (C=1). q = 0.5 lies between 1 and 2: 1 + (0.5-0.25)/0.5 = 1.5.
    expect(weightedQuantiles(x, w, Float64Array.from(x).sort(), [0.5, 0.25, 0.9])).toEqual([1.5, 1, 2 + (0.9 - 0.75) / 0.25]);
  });

  it("when the bound is set, then the verdict counts the posterior's binaries outside each hard condition at the bound", async () => {
    const r = await runPipeline(input(edgb, beta, 10, 5, { kind: "as_translated" }));
    // Every sample has the same binary: the fraction outside is 0 or 1, and matches 16 pi alpha^2 / m2^4 <= 1/6 at the bound (the condition as catalogued).
    const kmPerMsun = 1.3271244e20 / 299_792_458 ** 2 / 1000;
    const worst = (16 * Math.PI * r.canonical.value! ** 2) / (5 * kmPerMsun) ** 4;
    const hard = r.conditions.filter((c) => c.kind === "hard");
    expect(hard.length).toBeGreaterThan(0);
    expect(r.fraction_outside).toBe(worst > 1 / 6 ? 1 : 0);
    expect(r.verdict).toBe(worst > 1 / 6 ? "outside_validity" : "valid");
  });
});

/** What a finished samples job hands to stacking: the parts of its result the stack reads, and its per-sample values. */
function asEvent(r: PipelineResult, mapping: CompiledMapping): { result: SamplesJobResult; values: ReturnType<typeof readStackValues> } {
  const result = { verdict: r.verdict, power: r.power, conditions: r.conditions, coupling: { side: r.side, symbol: mapping.coupling.quoted.symbol } } as unknown as SamplesJobResult;
  return { result, values: readStackValues(stackValues(r)) };
}

describe("several events: stacking", () => {
  const edgb = target("edgb", -7);
  const K1 = prefactor(edgb.mapping, 10, 5);
  const K2 = prefactor(edgb.mapping, 8, 3);
  const e1 = { mu: 0, sigma: 2e-3 };
  const e2 = { mu: -5e-4, sigma: 4e-3 };
  // Product of the two Gaussian likelihoods in beta_i = K_i alpha^2, uniform prior in alpha >= 0 (derived).
  const product = (a: number) => Math.exp(-0.5 * ((K1 * a * a - e1.mu) / e1.sigma) ** 2 - 0.5 * ((K2 * a * a - e2.mu) / e2.sigma) ** 2);
  const amax = Math.sqrt(Math.min((6 * e1.sigma) / Math.abs(K1), (6 * e2.sigma) / Math.abs(K2)) * 3);
  const exact = quantileOf(product, 0, amax, 0.9);
  const request = (events: StackJobRequest["events"]): StackJobRequest => ({
    theory: "edgb",
    parameter: "ppe_beta",
    b: -7,
    credibility: 0.9,
    bodies: ["bh", "bh"],
    prior: { kind: "uniform" },
    events,
    include_outside_validity: true,
    f_low: 20,
  });

  it("when two events come as samples jobs, then the combined bound matches the analytic product's quantile", async () => {
    const runs: Record<string, { result: SamplesJobResult; values: ReturnType<typeof readStackValues> }> = {};
    for (const [id, e, m1, m2, seed] of [["AAAAAAAAAAAAAAAAAAAAAAA1", e1, 10, 5, 5], ["AAAAAAAAAAAAAAAAAAAAAAA2", e2, 8, 3, 6]] as const) {
      const r: PipelineResult = await runPipeline(input(edgb, gaussian(seed, 100_000, e.mu, e.sigma), m1, m2, { kind: "as_translated" }));
      runs[id] = asEvent(r, edgb.mapping);
    }
    const out = await runStackJob({
      request: request([
        { label: "one", job: "AAAAAAAAAAAAAAAAAAAAAAA1" },
        { label: "two", job: "AAAAAAAAAAAAAAAAAAAAAAA2" },
      ]),
      catalogue,
      load: async (id) => runs[id] ?? null,
      onProgress: async () => undefined,
    });
    const alpha = out.coupling.value! ** 2; // quoted sqrt(alpha) -> alpha
    expect(Math.abs(alpha / exact - 1)).toBeLessThan(0.03);
    // The combination is tighter than either event alone (each event's own bound is listed).
    for (const e of out.events) expect(e.bound!).toBeGreaterThan(out.coupling.value!);
    expect(out.events.every((e) => e.used)).toBe(true);
  });

  it("when the same two events come as summaries (quick estimate), then the combined bound matches the product to the grid's accuracy", async () => {
    const out = await runStackJob({
      request: request([
        { label: "one", summary: { centre: e1.mu, width: e1.sigma }, binary: { m1: 10, m2: 5, chi1: 0, chi2: 0 } },
        { label: "two", summary: { centre: e2.mu, width: e2.sigma }, binary: { m1: 8, m2: 3, chi1: 0, chi2: 0 } },
      ]),
      catalogue,
      load: async () => null,
      onProgress: async () => undefined,
    });
    expect(Math.abs(out.coupling.value! ** 2 / exact - 1)).toBeLessThan(0.01);
    expect(out.cautions.some((c) => /Quick estimate/.test(c.message))).toBe(true);
  });
});

describe("several events: stacking signed couplings and lower bounds", () => {
  const noop = async () => undefined;
  const z95 = inversePhi(0.95);

  // Varying G at b = -13: beta = K Gdot with K = -(275/851968) Mc (Tahura & Yagi 2018), Gdot of either sign: a signed interval.
  const vg = target("varying-g", -13);
  const Ka = prefactor(vg.mapping, 10, 5);
  const Kb = prefactor(vg.mapping, 8, 3);
  const ea = { mu: 0.02, sigma: 0.05 };
  const eb = { mu: -0.03, sigma: 0.08 };
  // Product of Gaussian likelihoods in beta_i = K_i x under a uniform prior in x (common practice: the combined
  // posterior is the product of the per-event posteriors with their priors divided out): a Gaussian in x with
  // precision sum_i K_i^2 / sigma_i^2 and mean sum_i K_i mu_i / sigma_i^2 over that precision (derived).
  const precision = Ka ** 2 / ea.sigma ** 2 + Kb ** 2 / eb.sigma ** 2;
  const mean = (Ka * ea.mu / ea.sigma ** 2 + Kb * eb.mu / eb.sigma ** 2) / precision;
  const sd = 1 / Math.sqrt(precision);
  const stackRequest = (theory: string, b: number, events: StackJobRequest["events"], prior: StackJobRequest["prior"]): StackJobRequest => ({
    theory,
    parameter: "ppe_beta",
    b,
    credibility: 0.9,
    bodies: ["bh", "bh"],
    prior,
    events,
    include_outside_validity: true,
    f_low: 20,
  });

  it("when two signed-coupling events come as samples jobs, then the combined 90% interval is the analytic Gaussian product's mean -+ 1.645 sd", async () => {
    const runs: Record<string, ReturnType<typeof asEvent>> = {};
    for (const [id, e, m1, m2, seed] of [["SIGNEDAAAAAAAAAAAAAAAAA1", ea, 10, 5, 21], ["SIGNEDAAAAAAAAAAAAAAAAA2", eb, 8, 3, 22]] as const) {
      const r = await runPipeline(input(vg, gaussian(seed, 200_000, e.mu, e.sigma), m1, m2, { kind: "as_translated" }));
      expect(r.side).toBe("interval");
      runs[id] = asEvent(r, vg.mapping);
    }
    const out = await runStackJob({
      request: stackRequest("varying-g", -13, [{ label: "a", job: "SIGNEDAAAAAAAAAAAAAAAAA1" }, { label: "b", job: "SIGNEDAAAAAAAAAAAAAAAAA2" }], { kind: "uniform" }),
      catalogue,
      load: async (id) => runs[id] ?? null,
      onProgress: noop,
    });
    expect(out.coupling.side).toBe("interval");
    const [lo, hi] = out.coupling.signed_interval!.map((v) => canonicalValueOf("per_year", v));
    // Histogram noise of 200 000 samples on a 400-bin grid: within 5% of the product's width.
    expect(Math.abs(lo! - (mean - z95 * sd)) / sd).toBeLessThan(0.05);
    expect(Math.abs(hi! - (mean + z95 * sd)) / sd).toBeLessThan(0.05);
    for (const e of out.events) expect(e.interval).toHaveLength(2);
    // The grid carries both signs of the coupling, ascending.
    expect(out.grid.x[0]!).toBeLessThan(0);
    expect(out.grid.x.at(-1)!).toBeGreaterThan(0);
  });

  it("when the same signed events come as summaries, then the interval matches the product to the grid's accuracy, and a log-uniform prior is refused", async () => {
    const events: StackJobRequest["events"] = [
      { label: "a", summary: { centre: ea.mu, width: ea.sigma }, binary: { m1: 10, m2: 5, chi1: 0, chi2: 0 } },
      { label: "b", summary: { centre: eb.mu, width: eb.sigma }, binary: { m1: 8, m2: 3, chi1: 0, chi2: 0 } },
    ];
    const out = await runStackJob({ request: stackRequest("varying-g", -13, events, { kind: "uniform" }), catalogue, load: async () => null, onProgress: noop });
    const [lo, hi] = out.coupling.signed_interval!.map((v) => canonicalValueOf("per_year", v));
    expect(Math.abs(lo! - (mean - z95 * sd)) / sd).toBeLessThan(0.01);
    expect(Math.abs(hi! - (mean + z95 * sd)) / sd).toBeLessThan(0.01);
    await expect(runStackJob({ request: stackRequest("varying-g", -13, events, { kind: "log_uniform", range: [1e-30, 1] }), catalogue, load: async () => null, onProgress: noop })).rejects.toThrow(/log-uniform prior needs a positive coupling/);
  });

  // Massive graviton at b = -3: beta = -pi^2 D_0 Mc / lambda_g^2 (Will 1998): beta falls as lambda_g grows, a lower bound.
  const mg = target("massive-graviton", -3);
  const zEvent = 0.1;
  const Kz = (m1: number, m2: number) => {
    const env = createConversionContext(makeBinary({ m1, m2, frame: "source", z: zEvent }), { cosmology: DEFAULT_COSMOLOGY }).envFor(mg.mapping);
    return mg.mapping.evaluate(1, env);
  };
  const K1 = Kz(30, 25);
  const K2 = Kz(12, 8);
  const g1 = { mu: 0, sigma: 0.1 };
  const g2 = { mu: 0.02, sigma: 0.15 };
  const scale = Math.sqrt(Math.abs(K1) / g1.sigma);
  const rb = 30 * scale;
  // Uniform prior in lambda_g on [0, rb]; the product of the Gaussian likelihoods in beta_i = K_i lambda^-2 (derived),
  // and the lower bound: P(lambda >= X) = 0.9, the 0.1-quantile of the product on a fine grid.
  const productG = (l: number) => (l <= 0 ? 0 : Math.exp(-0.5 * ((K1 / l ** 2 - g1.mu) / g1.sigma) ** 2 - 0.5 * ((K2 / l ** 2 - g2.mu) / g2.sigma) ** 2));
  const exactLower = quantileOf(productG, scale / 50, rb, 0.1);

  it("when two events bound a coupling from below (massive graviton), then the combined lower bound is the analytic product's 10% quantile", async () => {
    const summaries: StackJobRequest["events"] = [
      { label: "one", summary: { centre: g1.mu, width: g1.sigma }, binary: { m1: 30, m2: 25, chi1: 0, chi2: 0, z: zEvent } },
      { label: "two", summary: { centre: g2.mu, width: g2.sigma }, binary: { m1: 12, m2: 8, chi1: 0, chi2: 0, z: zEvent } },
    ];
    const fromSummaries = await runStackJob({ request: stackRequest("massive-graviton", -3, summaries, { kind: "uniform", range: [0, rb] }), catalogue, load: async () => null, onProgress: noop });
    expect(fromSummaries.coupling.side).toBe("lower");
    expect(Math.abs(fromSummaries.coupling.value! / exactLower - 1)).toBeLessThan(0.01);

    const runs: Record<string, ReturnType<typeof asEvent>> = {};
    for (const [id, e, m1, m2, seed] of [["LOWERAAAAAAAAAAAAAAAAAA1", g1, 30, 25, 31], ["LOWERAAAAAAAAAAAAAAAAAA2", g2, 12, 8, 32]] as const) {
      const base = input(mg, gaussian(seed, 200_000, e.mu, e.sigma), m1, m2, { kind: "as_translated" });
      const n = base.columns.deviation.length;
      const r = await runPipeline({ ...base, columns: { ...base.columns, z: filled(n, zEvent) }, names: { ...base.names, z: "z" } });
      expect(r.side).toBe("lower");
      runs[id] = asEvent(r, mg.mapping);
    }
    const fromSamples = await runStackJob({
      request: stackRequest("massive-graviton", -3, [{ label: "one", job: "LOWERAAAAAAAAAAAAAAAAAA1" }, { label: "two", job: "LOWERAAAAAAAAAAAAAAAAAA2" }], { kind: "uniform", range: [0, rb] }),
      catalogue,
      load: async (id) => runs[id] ?? null,
      onProgress: noop,
    });
    expect(Math.abs(fromSamples.coupling.value! / exactLower - 1)).toBeLessThan(0.03);
    // Each event alone bounds the coupling less tightly (a lower bound: a smaller value).
    for (const e of fromSamples.events) expect(e.bound!).toBeLessThan(fromSamples.coupling.value!);
  });

  it("when a lower bound is stacked under a prior without an upper end, then the job refuses naming prior.range", async () => {
    const events: StackJobRequest["events"] = [{ label: "one", summary: { centre: 0, width: 0.1 }, binary: { m1: 30, m2: 25, chi1: 0, chi2: 0, z: zEvent } }];
    await expect(runStackJob({ request: stackRequest("massive-graviton", -3, events, { kind: "uniform" }), catalogue, load: async () => null, onProgress: noop })).rejects.toThrow(/prior\.range: .*improper/);
  });
});

describe("posterior samples: mappings that are not a power law of the coupling", () => {
  // Varying G's entry with its mapping replaced by shapes that are not power laws in Gdot (y = Gdot Mc, A = 275/851968):
  const vg = catalogue.bySlug.get("varying-g")!.theory.entry as CatalogueTheory;
  const withShape = (expression: string, range: "positive" | "any_sign"): { entry: CatalogueTheory; mapping: CompiledMapping } => {
    const entry = { ...vg, couplings: vg.couplings.map((c) => ({ ...c, range })), mappings: [{ ...vg.mappings[0]!, expression }] } as unknown as CatalogueTheory;
    return { entry, mapping: compileMapping(entry, 0) };
  };
  const A = 275 / 851968;
  const McKm = (m1: number, m2: number) => (((m1 * m2) ** 0.6 / (m1 + m2) ** 0.2) * 1.3271244e20) / 299_792_458 ** 2 / 1000;

  it("when beta = -A y / (1 + y) (monotonic, saturating), then every sample is inverted as the closed form y = -beta / (A + beta) gives, and the weights are 1/|dF/dx|", async () => {
    const t = withShape("-(275/851968)*Gdot*Mc/(1 + Gdot*Mc)", "positive");
    const mc = McKm(10, 5);
    const betas = gaussian(91, 20_000, -1e-4, 3e-5);
    const r = await runPipeline(input(t, betas, 10, 5, { kind: "uniform" }));
    expect(r.power).toBeNull();
    expect(r.side).toBe("upper");
    let worst = 0;
    let worstWeight = 0;
    for (let j = 0; j < r.perSample.x.length; j++) {
      const b = r.perSample.beta[j]!;
      // Closed-form inverse and slope (derived): y = -b/(A + b), x = y/Mc; dF/dx = -A Mc / (1 + Mc x)^2.
      const x = -b / (A + b) / mc;
      worst = Math.max(worst, Math.abs(r.perSample.x[j]! / x - 1));
      const slope = (A * mc) / (1 + mc * x) ** 2;
      worstWeight = Math.max(worstWeight, Math.abs(r.perSample.weight[j]! * slope - 1));
    }
    expect(worst).toBeLessThan(1e-10);
    expect(worstWeight).toBeLessThan(1e-6);
    // Samples beyond the mapping's reach (beta <= -A, or beta >= 0) are dropped as unreachable.
    const reachable = Array.from(betas).filter((b) => b < 0 && b > -A).length;
    expect(r.samples.used).toBe(reachable);
    expect(r.notes.some((m) => /not a power law/.test(m))).toBe(true);
  });

  it("when beta = -A (y + y^3) for a coupling of either sign, then the roots match Cardano's formula and the result is a signed interval", async () => {
    const t = withShape("-(275/851968)*(Gdot*Mc + (Gdot*Mc)^3)", "any_sign");
    const mc = McKm(10, 5);
    const betas = gaussian(92, 20_000, 2e-4, 4e-4);
    const r = await runPipeline(input(t, betas, 10, 5, { kind: "as_translated" }));
    expect(r.side).toBe("interval");
    expect(r.samples.used).toBe(20_000);
    let worst = 0;
    for (let j = 0; j < r.perSample.x.length; j++) {
      // y + y^3 = c with c = -beta/A: one real root, y = cbrt(c/2 + s) + cbrt(c/2 - s), s = sqrt(c^2/4 + 1/27) (Cardano).
      const c = -r.perSample.beta[j]! / A;
      const s = Math.sqrt((c * c) / 4 + 1 / 27);
      const y = Math.cbrt(c / 2 + s) + Math.cbrt(c / 2 - s);
      const x = y / mc;
      worst = Math.max(worst, Math.abs(r.perSample.x[j]! - x) / Math.max(Math.abs(x), 1e-12 / mc));
    }
    expect(worst).toBeLessThan(1e-8);
    expect(r.canonical.interval![0]).toBeLessThan(r.canonical.interval![1]);
  });

  it("when beta = -A y (1 - y) rises and falls in the coupling's range, then the translation is refused naming the mapping, the row and why", async () => {
    const t = withShape("-(275/851968)*Gdot*Mc*(1 - Gdot*Mc)", "positive");
    const betas = gaussian(93, 1000, -1e-5, 1e-5);
    await expect(runPipeline(input(t, betas, 10, 5, { kind: "as_translated" }))).rejects.toThrow(/varying-g mapping at b = -13 is not monotonic in Gdot for the binary of row 0 .*rises and falls/);
  });
});
