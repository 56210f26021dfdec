import type { CouplingExclusionRequest, CouplingExclusionResponse } from "../../../common/consistency.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import { couplingExclusion, testCovarianceAtGr } from "../../physics/ringdown/coupling-exclusion.ts";
import { ringdownRemnantWidths, type InspiralForecastInput, type InspiralWidths } from "../../physics/ringdown/forecast-widths.ts";
import { summaryCovariance } from "../../physics/ringdown/gaussian-consistency.ts";
import type { Matrix2 } from "../../physics/ringdown/matrix2.ts";
import { remnantFromBinary } from "../../physics/ringdown/remnant.ts";
import { assessValidity } from "../../physics/ringdown/ringdown-bound.ts";
import { failingDto, validityItemDto } from "../convert/build-result.ts";
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

/**
 * The widths of the two estimates: as given, or forecast for a detector (inspiral: Fisher forecast on
 * f_low .. split frequency; merger-ringdown: one (2,2,0) damped sinusoid at ringdown_snr).
 */
/** Computes the inspiral widths of a forecast test: in the forecast worker thread when served (a Fisher matrix is not event-loop work). */
export type InspiralWidthsRunner = (input: InspiralForecastInput) => Promise<InspiralWidths>;

async function testWidths(request: CouplingExclusionRequest, M: number, chi: number, inspiralWidths: InspiralWidthsRunner) {
  const { test, binary: b } = request;
  const cautions: string[] = [];
  let covI: Matrix2;
  let covR: Matrix2;
  let forecast: CouplingExclusionResponse["widths"]["forecast"];
  if (test.inspiral) {
    covI = summaryCovariance({ M_f: 1, chi_f: 0, ...test.inspiral });
  } else {
    const f = test.forecast!;
    const z = b.z!;
    const scale = b.frame === "detector" ? 1 / (1 + z) : 1;
    let w;
    try {
      w = await inspiralWidths({
        m1: b.m1 * scale,
        m2: b.m2 * scale,
        chi1: b.chi1,
        chi2: b.chi2,
        z,
        ...(f.distance_mpc === undefined ? {} : { distance_mpc: f.distance_mpc }),
        detector: {
          curve: f.curve,
          orientation: f.orientation,
          ...(f.f_low === undefined ? {} : { f_low: f.f_low }),
          ...(f.years_observed === undefined ? {} : { years_observed: f.years_observed }),
          ...(f.years_before_merger === undefined ? {} : { years_before_merger: f.years_before_merger }),
        },
      });
    } catch (err) {
      if (err instanceof PhysicsInputError) {
        const field = err.field.startsWith("source.") ? `binary.${err.field.slice(7)}` : `test.forecast.${err.field.replace(/^detectors\.0\./, "")}`;
        throw new PhysicsInputError(field, err.message);
      }
      throw err;
    }
    covI = fromLog(w.covariance, M);
    cautions.push(...w.cautions);
    forecast = { curve: f.curve, f_low: w.f_low, f_high: w.f_high, high_cut: w.high_cut, snr: w.snr, split_frequency_hz: w.split_frequency_hz, ringdown_snr: f.ringdown_snr ?? null };
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
    summary: {
      inspiral: describe(covI, test.inspiral ? "given" : "forecast"),
      merger_ringdown: describe(covR, test.merger_ringdown ? "given" : "forecast"),
      ...(forecast ? { forecast } : {}),
    },
  };
}

/** What coupling would the IMR consistency test exclude, for a theory's ringdown shifts and a test's widths. */
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
  const widths = await testWidths(request, inFrame.M_f, inFrame.chi_f, inspiralWidths);
  const covI = widths.covI;
  const covR = widths.covR;
  const covariance = testCovarianceAtGr(inFrame.M_f, inFrame.chi_f, covI, covR);
  const env = remnant.env;
  const shifts = { df: (x: number) => (freq ? freq.evaluate(x, env) : 0), dtau: (x: number) => (damp ? damp.evaluate(x, env) : 0) };
  const sides: (1 | -1)[] = coupling.range === "any_sign" ? [-1, 1] : [1];
  const remnantShift = rMass || rSpin ? { dM: (x: number) => (rMass ? rMass.evaluate(x, env) : 0), dchi: (x: number) => (rSpin ? rSpin.evaluate(x, env) : 0) } : undefined;
  const common = { mode: request.mode, M: inFrame.M_f, chi: inFrame.chi_f, shifts, ...(remnantShift ? { remnant: remnantShift } : {}), covariance, credibility: request.credibility, sides };
  const exact = couplingExclusion(common);
  const linear = couplingExclusion({ ...common, reading: "linear" });
  // The frequency and damping mappings often share a condition: assess each condition once.
  const used = [freq, damp, rMass, rSpin].filter((m) => m !== undefined);
  const validity = used.flatMap((m) => m.validity).filter((v, i, all) => all.findIndex((w) => w.condition === v.condition && w.label === v.label) === i);

  const cautions = [
    remnantShift
      ? "The inspiral estimate is taken as the GR remnant of the binary: the inspiral bias from the theory's ppE term is not modelled here."
      : "Only the theory's ringdown shifts enter: the inspiral estimate is taken as the GR remnant (the inspiral bias from the theory's ppE term is not modelled here, and the entry has no remnant mapping, so the true remnant is taken as unshifted).",
    "The test's covariance is evaluated at the GR point and held fixed; a real analysis's widths change as the estimates move.",
    "The deviation at the bound is about two standard deviations of the test: a linear-bias picture of a template mismatch is only trustworthy to about one.",
  ];
  if (!freq) cautions.push(`The theory has no frequency mapping for mode ${request.mode}: its frequency shift is taken as 0.`);
  if (!damp) cautions.push(`The theory has no damping-time mapping for mode ${request.mode}: its damping-time shift is taken as 0.`);
  if (remnantShift && !rMass) cautions.push("The theory has a remnant-spin mapping but no remnant-mass mapping: the remnant's mass is taken as unshifted.");
  if (remnantShift && !rSpin) cautions.push("The theory has a remnant-mass mapping but no remnant-spin mapping: the remnant's spin is taken as unshifted.");
  if (used.some((m) => m.sourceStatus !== "confirmed")) cautions.push("Some of the theory's ringdown or remnant mappings are derived or recalled, not read in a paper: see the entry.");
  cautions.push(...widths.cautions);
  if (inFrame.chi_f_fit_spread > 0.005) cautions.push(`The two final-spin fits differ by ${inFrame.chi_f_fit_spread.toFixed(3)} for this binary: a systematic of the remnant.`);

  return {
    theory: { slug: theory.slug, name: theory.name, revision: theory.revision },
    coupling: { symbol: coupling.symbol, latex: coupling.latex, unit: coupling.unit },
    remnant: { M_f: inFrame.M_f, chi_f: inFrame.chi_f, frame: b.frame, chi_f_alternative: inFrame.chi_f_alternative },
    credibility: request.credibility,
    model: { qnm_frequency: freq !== undefined, qnm_damping: damp !== undefined, remnant_mass: rMass !== undefined, remnant_spin: rSpin !== undefined, inspiral_bias: false },
    widths: widths.summary,
    covariance,
    sides: exact.sides.map((s, i) => {
      const v = s.x === null ? null : assessValidity(validity, s.x, env);
      return {
        side: s.side === 1 ? ("positive" as const) : ("negative" as const),
        x: s.x,
        x_linear: linear.sides[i]?.x ?? null,
        ...(s.reason ? { reason: s.reason } : {}),
        linear_breaks_at: s.linear_breaks_at,
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
