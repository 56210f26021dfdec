import { DEFAULT_TEST_CURVE, type CouplingExclusionRequest, type CouplingExclusionResponse } from "../../../common/consistency.ts";
import type { CompiledMapping } from "../../physics/catalogue-mapping.ts";
import { createConversionContext } from "../../physics/convert.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import { couplingExclusion, testCovarianceAtGr, type RemnantShiftFunctions } from "../../physics/ringdown/coupling-exclusion.ts";
import type { ForecastDetectorInput } from "../../physics/forecast/forecast.ts";
import { ringdownRemnantWidths, type InspiralBiasVector, type InspiralForecastInput, type InspiralWidths } from "../../physics/ringdown/forecast-widths.ts";
import { summaryCovariance } from "../../physics/ringdown/gaussian-consistency.ts";
import type { Matrix2 } from "../../physics/ringdown/matrix2.ts";
import { remnantFromBinary } from "../../physics/ringdown/remnant.ts";
import { assessValidity } from "../../physics/ringdown/ringdown-bound.ts";
import { failingDto, validityItemDto } from "../convert/build-result.ts";
import type { RingdownValidity } from "../../physics/ringdown/ringdown-mapping.ts";
import type { RingdownCatalogue } from "../ringdown/catalogue.ts";
import { resolveRemnant } from "../ringdown/remnant-input.ts";

/** (M_f, chi_f) covariance with M_f in the units of M, from a covariance of (ln M_f, chi_f). */
function fromLog(c: Matrix2, M: number): Matrix2 {
  return [
    [M * M * c[0][0], M * c[0][1]],
    [M * c[1][0], c[1][1]],
  ];
}

function describe(c: Matrix2, from: "given" | "forecast") {
  const sM = Math.sqrt(c[0][0]);
  const sC = Math.sqrt(c[1][1]);
  return { from, sigma_M_f: sM, sigma_chi_f: sC, rho: c[0][1] / (sM * sC) };
}

/** Computes the inspiral widths of a forecast test: in the forecast worker thread when served (a Fisher matrix is not event-loop work). */
export type InspiralWidthsRunner = (input: InspiralForecastInput) => Promise<InspiralWidths>;

/** Where the bias's detector was named (the request's fields, or the default curve). */
type CurveFrom = "test.forecast" | "test.inspiral_bias" | "default";

/** Runs the inspiral Fisher matrix (widths and, for bias_b, the bias) with the engine's field names turned into the request's. */
async function runInspiral(run: InspiralWidthsRunner, input: InspiralForecastInput, detectorPrefix: string): Promise<InspiralWidths> {
  try {
    return await run(input);
  } catch (err) {
    if (err instanceof PhysicsInputError) {
      const field = err.field.startsWith("source.") ? `binary.${err.field.slice(7)}` : `${detectorPrefix}.${err.field.replace(/^detectors\.0\./, "")}`;
      throw new PhysicsInputError(field, err.message);
    }
    throw err;
  }
}

/**
 * The widths of the two estimates: as given, or forecast for a detector (inspiral: Fisher forecast on
 * f_low .. split frequency; merger-ringdown: one (2,2,0) damped sinusoid at ringdown_snr). When biasB
 * lists ppE exponents, the inspiral bias per unit beta comes from the same Fisher matrix as forecast
 * widths, or from one for the bias's own detector when the widths are given.
 */
async function testWidths(request: CouplingExclusionRequest, M: number, chi: number, inspiralWidths: InspiralWidthsRunner, biasB: number[]) {
  const { test, binary: b } = request;
  const cautions: string[] = [];
  let covI: Matrix2;
  let covR: Matrix2;
  let forecast: CouplingExclusionResponse["widths"]["forecast"];
  let bias: { vectors: InspiralBiasVector[]; run: InspiralWidths; curve: string; from: CurveFrom } | null = null;
  const z = b.z;
  const scale = b.frame === "detector" && z !== undefined ? 1 / (1 + z) : 1;
  const source = { m1: b.m1 * scale, m2: b.m2 * scale, chi1: b.chi1, chi2: b.chi2, z: z ?? 0 };
  if (test.inspiral) {
    covI = summaryCovariance({ M_f: 1, chi_f: 0, ...test.inspiral });
  } else {
    const f = test.forecast!;
    const w = await runInspiral(
      inspiralWidths,
      {
        ...source,
        ...(f.distance_mpc === undefined ? {} : { distance_mpc: f.distance_mpc }),
        detector: {
          curve: f.curve,
          orientation: f.orientation,
          ...(f.f_low === undefined ? {} : { f_low: f.f_low }),
          ...(f.years_observed === undefined ? {} : { years_observed: f.years_observed }),
          ...(f.years_before_merger === undefined ? {} : { years_before_merger: f.years_before_merger }),
        },
        ...(biasB.length > 0 ? { bias_b: biasB } : {}),
      },
      "test.forecast",
    );
    covI = fromLog(w.covariance, M);
    cautions.push(...w.cautions);
    forecast = { curve: f.curve, f_low: w.f_low, f_high: w.f_high, high_cut: w.high_cut, snr: w.snr, split_frequency_hz: w.split_frequency_hz, ringdown_snr: f.ringdown_snr ?? null };
    if (biasB.length > 0) bias = { vectors: w.bias, run: w, curve: f.curve, from: "test.forecast" };
  }
  if (biasB.length > 0 && !bias) {
    // Given inspiral widths: the bias needs a detector of its own (the Fisher matrix's noise curve and band).
    const o = test.inspiral_bias;
    const curve = o?.curve ?? test.forecast?.curve ?? DEFAULT_TEST_CURVE;
    const from: CurveFrom = o?.curve !== undefined ? "test.inspiral_bias" : test.forecast ? "test.forecast" : "default";
    const prefix = from === "test.forecast" ? "test.forecast" : "test.inspiral_bias";
    const fLow = o?.f_low ?? test.forecast?.f_low;
    const distance = o?.distance_mpc ?? test.forecast?.distance_mpc;
    // The years of a space detector's window follow test.forecast when it names the same curve (the engine's defaults otherwise).
    const years = test.forecast && test.forecast.curve === curve ? test.forecast : undefined;
    const detector: ForecastDetectorInput = {
      curve,
      orientation: o?.orientation ?? test.forecast?.orientation ?? "sky_averaged",
      ...(fLow === undefined ? {} : { f_low: fLow }),
      ...(years?.years_observed === undefined ? {} : { years_observed: years.years_observed }),
      ...(years?.years_before_merger === undefined ? {} : { years_before_merger: years.years_before_merger }),
    };
    const w = await runInspiral(inspiralWidths, { ...source, ...(distance === undefined ? {} : { distance_mpc: distance }), detector, bias_b: biasB }, prefix);
    bias = { vectors: w.bias, run: w, curve, from };
  }
  if (test.merger_ringdown) {
    covR = summaryCovariance({ M_f: 1, chi_f: 0, ...test.merger_ringdown });
  } else {
    const snr = test.forecast!.ringdown_snr!;
    covR = fromLog(ringdownRemnantWidths(request.mode, chi, snr), M);
    cautions.push(`Merger-ringdown widths from one (${request.mode.split("").join(",")}) damped sinusoid at SNR ${snr}: the merger is ignored, which makes them conservative.`);
    if (forecast) forecast.ringdown_snr = snr;
  }
  return {
    covI,
    covR,
    cautions,
    bias,
    summary: {
      inspiral: describe(covI, test.inspiral ? "given" : "forecast"),
      merger_ringdown: describe(covR, test.merger_ringdown ? "given" : "forecast"),
      ...(forecast ? { forecast } : {}),
    },
  };
}

/** The theory's ppE phase terms for this coupling that the bias can use, each bound to the binary, and why others are left out. */
function inspiralTerms(mappings: readonly CompiledMapping[], symbol: string, binary: CouplingExclusionRequest["binary"]) {
  const terms: { b: number; beta: (x: number) => number; mapping: CompiledMapping; env: Readonly<Record<string, number>> }[] = [];
  const skipped: string[] = [];
  const context = createConversionContext({ m1: binary.m1, m2: binary.m2, chi1: binary.chi1, chi2: binary.chi2, frame: binary.frame, ...(binary.z === undefined ? {} : { z: binary.z }) });
  for (const m of mappings) {
    if (m.coupling.symbol !== symbol) continue;
    if (!(Number.isFinite(m.b) && m.b >= -20 && m.b <= 10)) {
      skipped.push(`the term at b = ${m.b} lies outside the forecast's range [-20, 10]`);
      continue;
    }
    if (m.onlyFor && !m.onlyFor.bodies.includes("bh")) {
      skipped.push(`the term at b = ${m.b} holds only for ${m.onlyFor.bodies.join("/")} bodies, and the binary is taken as two black holes`);
      continue;
    }
    let env: Readonly<Record<string, number>>;
    try {
      env = context.envFor(m);
    } catch (err) {
      skipped.push(`the term at b = ${m.b} needs ${err instanceof PhysicsInputError ? err.field : "an input"} (give the binary's z)`);
      continue;
    }
    const missing = (m.requires ?? []).filter((s) => env[s] === undefined);
    if (missing.length > 0) {
      skipped.push(`the term at b = ${m.b} needs ${missing.join(", ")}, which the binary does not provide`);
      continue;
    }
    const bound = m.bind ? m.bind(env) : (x: number) => m.evaluate(x, env);
    terms.push({ b: m.b, beta: bound, mapping: m, env });
  }
  return { terms, skipped };
}

/** What coupling would the IMR consistency test exclude, for a theory's ringdown, remnant and inspiral shifts and a test's widths. */
export async function couplingExclusionFor(catalogue: RingdownCatalogue, request: CouplingExclusionRequest, inspiralWidths: InspiralWidthsRunner): Promise<CouplingExclusionResponse> {
  const theory = (await catalogue.load()).find((t) => t.slug === request.theory);
  if (!theory) throw new PhysicsInputError("theory", `unknown theory "${request.theory}"`);
  const forMode = theory.mappings.filter((m) => m.mode === request.mode);
  const coupling = forMode[0]?.coupling ?? theory.remnant[0]?.coupling;
  if (!coupling) throw new PhysicsInputError("theory", `"${request.theory}" has no ringdown mapping for mode ${request.mode} and no remnant mapping`);
  const same = <T extends { coupling: { symbol: string } }>(m: T) => m.coupling.symbol === coupling.symbol;
  const freq = forMode.find((m) => m.kind === "ringdown_frequency" && same(m));
  const damp = forMode.find((m) => m.kind === "ringdown_damping" && same(m));
  const rMass = theory.remnant.find((m) => m.kind === "remnant_mass" && same(m));
  const rSpin = theory.remnant.find((m) => m.kind === "remnant_spin" && same(m));

  const remnant = resolveRemnant({ binary: request.binary });
  const b = request.binary;
  // Husa's fit is scale-free: the remnant mass in the binary's own frame, to match the widths.
  const inFrame = remnantFromBinary({ m1: b.m1, m2: b.m2, chi1: b.chi1, chi2: b.chi2 }, "binary.");
  if (inFrame.chi_f <= 0) throw new PhysicsInputError("binary", `the remnant fit gives chi_f = ${inFrame.chi_f.toFixed(3)}: the QNM fits need a remnant spinning with the orbit`);
  // The inspiral side: the theory's ppE phase terms for this coupling, unless the request leaves them out.
  const includeBias = request.test.inspiral_bias?.include ?? true;
  const phase = includeBias ? inspiralTerms(theory.inspiral, coupling.symbol, b) : { terms: [], skipped: [] };
  if (phase.terms.length > 0 && b.z === undefined) {
    throw new PhysicsInputError("binary.z", "the inspiral bias needs the binary's redshift z (the detector-frame masses set the band of its Fisher matrix); give z, or set test.inspiral_bias.include to false");
  }
  const biasB = [...new Set(phase.terms.map((t) => t.b))];
  const widths = await testWidths(request, inFrame.M_f, inFrame.chi_f, inspiralWidths, biasB);
  const covI = widths.covI;
  const covR = widths.covR;
  const covariance = testCovarianceAtGr(inFrame.M_f, inFrame.chi_f, covI, covR);
  const env = remnant.env;
  const shifts = { df: (x: number) => (freq ? freq.evaluate(x, env) : 0), dtau: (x: number) => (damp ? damp.evaluate(x, env) : 0) };
  const sides: (1 | -1)[] = coupling.range === "any_sign" ? [-1, 1] : [1];
  const remnantShift = rMass || rSpin ? { dM: (x: number) => (rMass ? rMass.evaluate(x, env) : 0), dchi: (x: number) => (rSpin ? rSpin.evaluate(x, env) : 0) } : undefined;
  // The bias of the inspiral estimate: d ln M_f = sum_k beta_k(x) g_k,M and d chi_f = sum_k beta_k(x) g_k,chi (linear in beta,
  // Cutler & Vallisneri 2007). The mass shift is applied as exp(.) - 1: ln M_f is the Fisher variable's natural scale (ln Mc),
  // it keeps the mass positive and agrees with the linear form to first order; the spin shift is linear, as chi_f is.
  const bias = widths.bias;
  const gradient = (bb: number) => bias?.vectors.find((v) => v.b === bb)?.remnant ?? ([0, 0] as const);
  const lnShift = (x: number) => phase.terms.reduce((acc, t) => acc + t.beta(x) * gradient(t.b)[0], 0);
  const chiShift = (x: number) => phase.terms.reduce((acc, t) => acc + t.beta(x) * gradient(t.b)[1], 0);
  const inspiralShift: RemnantShiftFunctions | undefined = bias ? { dM: (x) => Math.expm1(lnShift(x)), dchi: (x) => chiShift(x) / inFrame.chi_f } : undefined;
  // One standard deviation of the inspiral estimate, fractional: the scale the linear bias is trusted on.
  const inspiralSigma: [number, number] = [Math.sqrt(covI[0][0]) / inFrame.M_f, Math.sqrt(covI[1][1]) / inFrame.chi_f];
  const common = {
    mode: request.mode,
    M: inFrame.M_f,
    chi: inFrame.chi_f,
    shifts,
    ...(remnantShift ? { remnant: remnantShift } : {}),
    ...(inspiralShift ? { inspiral: inspiralShift, inspiralSigma } : {}),
    covariance,
    credibility: request.credibility,
    sides,
  };
  const exact = couplingExclusion(common);
  const linear = couplingExclusion({ ...common, reading: "linear" });
  // The frequency and damping mappings often share a condition: assess each condition once.
  const used = [freq, damp, rMass, rSpin].filter((m) => m !== undefined);
  // The ppE terms' small-coupling conditions hold at the bound too (each evaluated in its own binary environment;
  // conditions tied to a body apply, as the binary is taken as two black holes, when they name black holes).
  const inspiralValidity: RingdownValidity[] = bias
    ? phase.terms.flatMap((t) =>
        (t.mapping.validity ?? [])
          .filter((c) => !c.appliesTo || c.appliesTo.includes("bh"))
          .map((c) => ({ label: c.label, condition: c.condition, max: c.max, kind: c.kind, uses: [], evaluate: (x: number) => c.evaluate(x, t.env) })),
      )
    : [];
  const validity = [...used.flatMap((m) => m.validity), ...inspiralValidity].filter((v, i, all) => all.findIndex((w) => w.condition === v.condition && w.label === v.label) === i);

  const terms = bias ? [...new Set(phase.terms.map((t) => t.b))].sort((x, y) => x - y) : [];
  const inspiralCaution = bias
    ? `The inspiral estimate carries the linear bias of a GR template fitted to the theory's ppE term${terms.length > 1 ? "s" : ""} at b = ${terms.join(", ")} (Cutler & Vallisneri 2007; applied to this test as Carson & Yagi 2020, our reconstruction), from the Fisher matrix of ${bias.run.label} on ${bias.run.f_low.toPrecision(3)}–${bias.run.f_high.toPrecision(4)} Hz with the same Gaussian priors as the widths: trustworthy only while the shift stays within about one standard deviation of the inspiral estimate (see "bias past 1σ" for where it does not). The inspiral alone barely measures the coalescence phase, so the bias leans on its prior (σ = π): for a GW150914-like binary at b = -7 it is about ten times larger without it.`
    : !includeBias
      ? "The inspiral bias was left out on request: the inspiral estimate is taken as the GR remnant of the binary."
      : phase.skipped.length > 0
        ? `The inspiral estimate is taken as the GR remnant of the binary: ${phase.skipped.join("; ")}.`
        : `The inspiral estimate is taken as the GR remnant of the binary: the entry has no inspiral-phase mapping for ${coupling.symbol}, so a GR template fits its inspiral without bias.`;
  const cautions = [
    inspiralCaution,
    ...(remnantShift ? [] : ["The entry has no remnant mapping: the true remnant is taken as unshifted."]),
    "The test's covariance is evaluated at the GR point and held fixed; a real analysis's widths change as the estimates move.",
    "The deviation at the bound is about two standard deviations of the test: a linear-bias picture of a template mismatch is only trustworthy to about one.",
  ];
  if (!freq) cautions.push(`The theory has no frequency mapping for mode ${request.mode}: its frequency shift is taken as 0.`);
  if (!damp) cautions.push(`The theory has no damping-time mapping for mode ${request.mode}: its damping-time shift is taken as 0.`);
  if (remnantShift && !rMass) cautions.push("The theory has a remnant-spin mapping but no remnant-mass mapping: the remnant's mass is taken as unshifted.");
  if (remnantShift && !rSpin) cautions.push("The theory has a remnant-mass mapping but no remnant-spin mapping: the remnant's spin is taken as unshifted.");
  if (bias && bias.from === "default") cautions.push(`The inspiral bias was computed for ${bias.run.label} (the default curve): name test.inspiral_bias.curve for the detector of the data.`);
  if (bias && theory.hasAmplitude) cautions.push("The theory's amplitude corrections are not part of the inspiral bias (phase only).");
  if (bias && phase.skipped.length > 0) cautions.push(`Left out of the inspiral bias: ${phase.skipped.join("; ")}.`);
  if (theory.inspiralBroken.length > 0 && includeBias) cautions.push(`Some of the entry's inspiral-phase mappings do not compile and are left out of the bias: ${theory.inspiralBroken.map((x) => `mapping ${x.index}: ${x.reason}`).join("; ")}.`);
  if (bias && phase.terms.some((t) => t.mapping.sourceStatus !== undefined && t.mapping.sourceStatus !== "confirmed")) cautions.push("Some of the theory's ppE terms are derived or recalled, not read in a paper: see the entry.");
  if (used.some((m) => m.sourceStatus !== "confirmed")) cautions.push("Some of the theory's ringdown or remnant mappings are derived or recalled, not read in a paper: see the entry.");
  cautions.push(...widths.cautions);
  if (inFrame.chi_f_fit_spread > 0.005) cautions.push(`The two final-spin fits differ by ${inFrame.chi_f_fit_spread.toFixed(3)} for this binary: a systematic of the remnant.`);

  return {
    theory: { slug: theory.slug, name: theory.name, revision: theory.revision },
    coupling: { symbol: coupling.symbol, latex: coupling.latex, unit: coupling.unit },
    remnant: { M_f: inFrame.M_f, chi_f: inFrame.chi_f, frame: b.frame, chi_f_alternative: inFrame.chi_f_alternative },
    credibility: request.credibility,
    model: { qnm_frequency: freq !== undefined, qnm_damping: damp !== undefined, remnant_mass: rMass !== undefined, remnant_spin: rSpin !== undefined, inspiral_bias: bias !== null },
    widths: widths.summary,
    inspiral_bias: bias
      ? {
          curve: bias.curve,
          label: bias.run.label,
          curve_from: bias.from,
          f_low: bias.run.f_low,
          f_high: bias.run.f_high,
          snr: bias.run.snr,
          terms: bias.vectors.map((v) => ({ b: v.b, d_ln_M_f_per_beta: v.remnant[0], d_chi_f_per_beta: v.remnant[1] })),
        }
      : null,
    inspiral_side: inspiralCaution,
    covariance,
    sides: exact.sides.map((s, i) => {
      const v = s.x === null ? null : assessValidity(validity, s.x, env);
      return {
        side: s.side === 1 ? ("positive" as const) : ("negative" as const),
        x: s.x,
        x_linear: linear.sides[i]?.x ?? null,
        ...(s.reason ? { reason: s.reason } : {}),
        linear_breaks_at: s.linear_breaks_at,
        bias_exceeds_sigma_at: s.bias_exceeds_sigma_at,
        bias_sigmas_at_bound: s.bias_sigmas_at_bound,
        verdict: v?.verdict ?? "not_assessed",
        failing: v?.failing ? failingDto(v.failing) : null,
        validity: (v?.validity ?? []).map(validityItemDto),
        unassessed: v?.unassessed ?? [],
      };
    }),
    track: exact.track,
    cautions,
  };
}
