import { symbolText } from "../../common/symbol-text.ts";
import type { Caution } from "../../common/convert.ts";
import { DEFAULT_COSMOLOGY } from "../../common/convert.ts";
import type { SamplesJobResult, StackJobRequest, StackJobResult } from "../../common/jobs.ts";
import { selectTarget } from "../features/convert/samples-common.ts";
import type { CompiledCatalogue } from "../features/convert/compiled-catalogue.ts";
import { makeBinary } from "../physics/binary.ts";
import type { CatalogueTheory } from "../physics/catalogue-mapping.ts";
import { createConversionContext } from "../physics/convert.ts";
import { detectPowerLaw } from "../physics/invert.ts";
import { quotedValueOf } from "../physics/quoted-forms.ts";
import { gimrFactor, type GimrIndex } from "../physics/taylorf2.ts";
import { SampleInputError } from "../physics/samples/sample-input-error.ts";
import { inverseNormalCdf } from "../physics/samples/normal.ts";
import type { readStackValues } from "./samples-job.ts";

/**
 * Several events, one coupling (docs/samples-jobs.md, "Several events"): on a common grid,
 * p(x | all) ∝ π(x) Π_i L_i(x), with L_i = p_i / π_i estimated from event i's samples weighted by
 * 1 / (π_dev |d dev/dx|) (the likelihood weights), or N(F_i(x); centre, width) for a summary.
 */

const BINS = 400;

type Side = "upper" | "lower" | "interval";

interface EventCurve {
  label: string;
  kind: "samples" | "summary";
  /** Likelihood per bin (arbitrary scale), or null when the event is left out. */
  like: Float64Array;
  ownVerdict: "valid" | "outside_validity" | "not_assessed" | null;
  /** Fraction of the event's posterior outside validity at the bound(s) (one value, or an interval's two ends). */
  outsideAt: (bounds: number[]) => number | null;
}

function smooth(m: Float64Array): Float64Array {
  const out = new Float64Array(m.length);
  for (let i = 0; i < m.length; i++) out[i] = (2 * m[i]! + (m[i - 1] ?? m[i]!) + (m[i + 1] ?? m[i]!)) / 4;
  return out;
}

function quantileOnGrid(edges: Float64Array, mass: Float64Array, q: number): number {
  let total = 0;
  for (const m of mass) total += m;
  let c = 0;
  for (let i = 0; i < mass.length; i++) {
    const next = c + mass[i]! / total;
    if (next >= q) {
      const f = mass[i]! > 0 ? (q - c) / (mass[i]! / total) : 0;
      return edges[i]! + f * (edges[i + 1]! - edges[i]!);
    }
    c = next;
  }
  return edges[edges.length - 1]!;
}

/** A finished samples job's result and the per-sample values stacking reads, or null when gone. */
export type LoadSamplesEvent = (jobId: string) => Promise<{ result: SamplesJobResult; values: ReturnType<typeof readStackValues> } | null>;

export async function runStackJob(input: { request: StackJobRequest; catalogue: CompiledCatalogue; load: LoadSamplesEvent; onProgress: (f: number) => Promise<void> }): Promise<StackJobResult> {
  const { request } = input;
  const target = selectTarget(input.catalogue, request);
  const mapping = target.ready.compiled;
  const cosmology = request.cosmology ?? { ...DEFAULT_COSMOLOGY };
  const c = request.credibility;
  if (request.prior.kind === "as_translated") throw new SampleInputError("prior.kind: several events have no common analysis prior; choose uniform or log_uniform.");

  // Load the events' samples (x, likelihood weights) or prepare the summaries' binaries.
  type Loaded =
    | { label: string; kind: "samples"; values: ReturnType<typeof readStackValues>; result: SamplesJobResult }
    | { label: string; kind: "summary"; centre: number; width: number; K: number; p: number; env: Record<string, number>; binary: ReturnType<typeof makeBinary> };
  const loaded: Loaded[] = [];
  let power: number | null = null;
  for (const [i, e] of request.events.entries()) {
    if ("job" in e) {
      const got = await input.load(e.job);
      if (!got) throw new SampleInputError(`events.${i}.job: job ${e.job} is no longer available.`);
      const result = got.result;
      if (result.coupling.symbol !== mapping.coupling.quoted.symbol) throw new SampleInputError(`events.${i}.job: that job translated ${symbolText(result.coupling.symbol, result.coupling.latex)}, this stack ${symbolText(mapping.coupling.quoted.symbol, mapping.coupling.quoted.latex)}.`);
      if (result.power === null) throw new SampleInputError(`events.${i}.job: that job's mapping is not a power law in the coupling (its samples were inverted one by one); stacking needs a power law.`);
      power = result.power;
      loaded.push({ label: e.label, kind: "samples", values: got.values, result });
    } else {
      const binary = makeBinary({ m1: e.binary.m1, m2: e.binary.m2, chi1: e.binary.chi1, chi2: e.binary.chi2, bodies: request.bodies, frame: "source", ...(e.binary.z === undefined ? {} : { z: e.binary.z }) });
      const env = createConversionContext(binary, { cosmology, fLowHz: request.f_low }).envFor(mapping);
      const F = mapping.bind ? mapping.bind(env) : (x: number) => mapping.evaluate(x, env);
      const law = detectPowerLaw(F);
      if (!law) throw new SampleInputError(`events.${i}: the mapping is not a power law in the coupling for this binary.`);
      let centre: number;
      let width: number;
      if ("centre" in e.summary) {
        centre = e.summary.centre;
        width = e.summary.width;
      } else {
        const [lo, hi] = e.summary.interval;
        centre = (lo + hi) / 2;
        width = (hi - lo) / (2 * inverseNormalCdf((1 + c) / 2));
      }
      let factor = 1;
      if (request.parameter === "gimr_dphi") {
        const g = gimrFactor(request.k as GimrIndex, binary.eta, {});
        if (g.status !== "ok") throw new SampleInputError(`events.${i}: ${g.reason}.`);
        factor = g.factor;
      }
      power = law.power;
      loaded.push({ label: e.label, kind: "summary", centre: centre * factor, width: Math.abs(width * factor), K: F(1), p: law.power, env, binary });
    }
  }
  const p = power!;
  const entryCoupling = (target.theory.theory.entry as CatalogueTheory).couplings.find((k) => k.symbol === mapping.coupling.symbol) as { range?: string } | undefined;
  const signed = (entryCoupling?.range ?? "non_negative") === "any_sign" && Number.isInteger(p) && Math.abs(p) % 2 === 1;
  const side: Side = signed ? "interval" : p > 0 ? "upper" : "lower";
  for (const [i, ev] of loaded.entries()) {
    if (ev.kind === "samples" && ev.result.coupling.side !== side) {
      throw new SampleInputError(`events.${i}.job: that job's bound is ${ev.result.coupling.side === "interval" ? "a signed interval" : `an ${ev.result.coupling.side} bound`}, this stack's is ${side === "interval" ? "a signed interval" : `an ${side} bound`} (a different b or catalogue revision?).`);
    }
  }
  if (signed && p < 0) throw new SampleInputError(`${mapping.coupling.symbol} takes either sign and enters beta with the power ${p}: its posterior is pushed away from zero on both sides, which a signed interval cannot describe; it is not stacked.`);
  if (signed && request.prior.kind === "log_uniform") throw new SampleInputError(`prior.kind: ${mapping.coupling.symbol} takes either sign; a log-uniform prior needs a positive coupling. Choose uniform.`);
  const [ra, rb] = request.prior.range ?? [signed ? -Infinity : 0, Infinity];
  if (side === "lower" && !Number.isFinite(rb)) {
    throw new SampleInputError(`prior.range: ${mapping.coupling.symbol} is bounded from below (beta falls as it grows), so every likelihood tends to a constant as it grows and a prior without an upper end gives an improper posterior; give prior.range with a finite upper end.`);
  }
  const priorAt = (x: number) => (x < ra || x > rb ? 0 : request.prior.kind === "log_uniform" ? (x > 0 ? 1 / x : 0) : 1);
  await input.onProgress(0.3);

  // Common grid, ascending in x. Upper bound / signed interval: uniform in u = sign(x)|x|^p = beta / K
  // (a summary's likelihood is Gaussian in u), over [0, umax] or [-umax, umax], cut to the prior's range.
  // Lower bound (p < 0): the likelihood flattens as x grows and the prior's upper end rb decides the tail,
  // so the grid is uniform in log x from where the likelihood dies out (x = umax^(1/p)) to rb.
  const toU = (x: number) => Math.sign(x) * Math.abs(x) ** p;
  const toX = (u: number) => Math.sign(u) * Math.abs(u) ** (1 / p);
  let umax = 0;
  for (const ev of loaded) {
    if (ev.kind === "samples") for (const x of ev.values.x) umax = Math.max(umax, Math.abs(toU(x)));
    else umax = Math.max(umax, Math.abs((Math.abs(ev.centre) + 6 * ev.width) / ev.K));
  }
  const xEdges = new Float64Array(BINS + 1);
  const centres = new Float64Array(BINS);
  // The samples' likelihoods are estimated on a grid uniform in u, where the samples are dense (u is beta / K).
  let uLo: number;
  let uHi: number;
  if (side === "lower") {
    const xlo = Math.max(umax ** (1 / p), ra);
    const xhi = rb;
    if (!(xhi > xlo) || !(xlo > 0)) throw new SampleInputError(`prior.range: the events' likelihoods die out below ${mapping.coupling.symbol} = ${xlo.toPrecision(3)}; the prior's upper end ${rb} must lie above it.`);
    const span = Math.log(xhi / xlo);
    for (let j = 0; j <= BINS; j++) xEdges[j] = xlo * Math.exp((span * j) / BINS);
    for (let j = 0; j < BINS; j++) centres[j] = Math.sqrt(xEdges[j]! * xEdges[j + 1]!);
    uLo = 0;
    uHi = toU(xlo);
  } else {
    if (side === "upper" && Number.isFinite(rb)) umax = Math.min(umax, rb ** p);
    if (side === "interval") umax = Math.min(umax, Math.max(Math.abs(ra), Math.abs(rb)) ** p);
    const ulo = side === "upper" ? 0 : -umax;
    if (!(umax > 0)) throw new SampleInputError(`prior.range: no event's likelihood reaches inside [${ra}, ${rb}].`);
    for (let j = 0; j <= BINS; j++) xEdges[j] = toX(ulo + ((umax - ulo) * j) / BINS);
    for (let j = 0; j < BINS; j++) centres[j] = toX(ulo + ((umax - ulo) * (j + 0.5)) / BINS);
    uLo = ulo;
    uHi = umax;
  }
  const width = Float64Array.from({ length: BINS }, (_, j) => xEdges[j + 1]! - xEdges[j]!);

  const curves: EventCurve[] = loaded.map((ev) => {
    const like = new Float64Array(BINS);
    if (ev.kind === "samples") {
      const { x, lw, validLo, validHi } = ev.values;
      // Weighted by lw the samples' density in x is proportional to the likelihood (docs/samples-jobs.md);
      // by lw |du/dx| = lw |p| |x|^(p-1), their density in u is.
      const inU = new Float64Array(BINS);
      const du = (uHi - uLo) / BINS;
      for (let t = 0; t < x.length; t++) {
        const u = toU(x[t]!);
        let k = Math.floor((u - uLo) / du);
        if (k === BINS && u === uHi) k = BINS - 1;
        if (k >= 0 && k < BINS) inU[k]! += lw[t]! * Math.abs(p) * Math.abs(x[t]!) ** (p - 1);
      }
      const smoothU = smooth(inU);
      // Read at each x bin's centre, linearly between the u bins' centres (0 outside the u grid).
      for (let j = 0; j < BINS; j++) {
        const pos = (toU(centres[j]!) - uLo) / du - 0.5;
        if (pos < -0.5 || pos > BINS - 0.5) continue;
        const k = Math.min(BINS - 2, Math.max(0, Math.floor(pos)));
        const f = Math.min(1, Math.max(0, pos - k));
        like[j] = ((1 - f) * smoothU[k]! + f * smoothU[k + 1]!) / du;
      }
      const hasConditions = ev.result.conditions.some((k) => k.kind === "hard");
      return {
        label: ev.label,
        kind: "samples",
        like,
        ownVerdict: ev.result.verdict,
        outsideAt: (bounds: number[]) => {
          if (!hasConditions) return null;
          let out = 0;
          let all = 0;
          for (let t = 0; t < x.length; t++) {
            const w = lw[t]! * priorAt(x[t]!);
            all += w;
            if (bounds.some((b) => Math.abs(b) < validLo[t]! || Math.abs(b) > validHi[t]!)) out += w;
          }
          return all > 0 ? out / all : 0;
        },
      };
    }
    for (let j = 0; j < BINS; j++) {
      const beta = ev.K * toU(centres[j]!);
      like[j] = Math.exp(-0.5 * ((beta - ev.centre) / ev.width) ** 2);
    }
    const hard = (mapping.validity ?? []).filter((v) => v.kind === "hard" && !(v.body && v.appliesTo && !v.appliesTo.includes(ev.binary.bodies[v.body - 1]!)));
    return {
      label: ev.label,
      kind: "summary",
      like,
      ownVerdict: null,
      outsideAt: (bounds: number[]) => (hard.length === 0 ? null : bounds.some((b) => hard.some((v) => !(v.evaluate(b, ev.env) <= v.max))) ? 1 : 0),
    };
  });
  await input.onProgress(0.6);

  const prior = Float64Array.from(centres, (x) => priorAt(x));
  const massOf = (like: Float64Array) => Float64Array.from(like, (l, j) => l * prior[j]! * width[j]!);
  // The bound(s): quantiles of x at c (upper), 1 - c (lower), (1 -+ c)/2 (signed interval).
  const boundsOf = (mass: Float64Array): number[] =>
    side === "interval" ? [quantileOnGrid(xEdges, mass, (1 - c) / 2), quantileOnGrid(xEdges, mass, (1 + c) / 2)] : [quantileOnGrid(xEdges, mass, side === "upper" ? c : 1 - c)];
  const rows: StackJobResult["events"] = [];
  const used: EventCurve[] = [];
  const form = mapping.coupling.quoted.form;
  for (const ev of curves) {
    const own = boundsOf(massOf(ev.like));
    let verdict = ev.ownVerdict;
    if (verdict === null) {
      const f = ev.outsideAt(own);
      verdict = f === null ? "not_assessed" : f <= 1 - c ? "valid" : "outside_validity";
    }
    const include = verdict !== "outside_validity" || request.include_outside_validity;
    if (include) used.push(ev);
    rows.push({
      label: ev.label,
      kind: ev.kind,
      used: include,
      reason: include ? null : "its own bound is outside the validity of its mapping (left out; include_outside_validity keeps it)",
      verdict,
      bound: side === "interval" ? null : quotedValueOf(form, own[0]!),
      ...(side === "interval" ? { interval: [quotedValueOf(form, own[0]!), quotedValueOf(form, own[1]!)] as [number, number] } : {}),
    });
  }
  if (used.length === 0) throw new SampleInputError("Every event is outside validity; none can enter the combination (set include_outside_validity to keep them).");
  // p(x | all) ∝ π(x) Π_i L_i(x): products of likelihoods in logs, so many events do not underflow.
  const combined = new Float64Array(BINS);
  for (let j = 0; j < BINS; j++) {
    let logL = Math.log(prior[j]! * width[j]!);
    for (const ev of used) logL += Math.log(ev.like[j]!);
    combined[j] = logL;
  }
  const peak = Math.max(...combined.filter(Number.isFinite));
  if (!Number.isFinite(peak)) throw new SampleInputError("The events' likelihoods do not overlap anywhere on the common grid: they disagree, and their product is zero.");
  for (let j = 0; j < BINS; j++) combined[j] = Number.isFinite(combined[j]!) ? Math.exp(combined[j]! - peak) : 0;
  const bounds = boundsOf(combined);
  let worst = 0;
  let assessed = false;
  for (const ev of used) {
    const f = ev.outsideAt(bounds);
    if (f !== null) {
      assessed = true;
      worst = Math.max(worst, f);
    }
  }
  const verdict = !assessed ? "not_assessed" : worst <= 1 - c ? "valid" : "outside_validity";
  await input.onProgress(0.9);

  const quoted = mapping.coupling.quoted;
  // Densities in x on the grid (x ascending).
  const normalise = (mass: Float64Array) => {
    const dens = Array.from(mass, (m, j) => (width[j]! > 0 ? m / width[j]! : 0));
    const m = Math.max(...dens);
    return dens.map((v) => (m > 0 ? v / m : 0));
  };
  const cautions: Caution[] = [
    { code: "prior", message: `Combined under a ${request.prior.kind === "uniform" ? "uniform" : "log-uniform"} prior in the coupling${request.prior.range ? ` over [${request.prior.range.join(", ")}]` : ""}, each event's own prior divided out.` },
  ];
  if (loaded.some((e) => e.kind === "summary")) cautions.push({ code: "prior", message: "Quick estimate: summary events are read as Gaussians in the deviation at one binary; translate their samples for a proper combination." });
  const left = rows.filter((r) => !r.used);
  if (left.length > 0) cautions.push({ code: "validity", message: `Left out as outside validity: ${left.map((r) => r.label).join(", ")}.` });
  return {
    theory: target.theory.theory.slug,
    theory_name: target.theory.theory.name,
    credibility: c,
    coupling: {
      symbol: quoted.symbol,
      latex: quoted.latex,
      unit: quoted.unit,
      side,
      ...(side === "interval" ? { signed_interval: [quotedValueOf(quoted.form, bounds[0]!), quotedValueOf(quoted.form, bounds[1]!)] as [number, number] } : { value: quotedValueOf(quoted.form, bounds[0]!) }),
    },
    prior: { kind: request.prior.kind, range: request.prior.range ?? null },
    verdict,
    fraction_outside: worst,
    events: rows,
    grid: {
      x: Array.from(centres, (x) => quotedValueOf(quoted.form, x)),
      combined: normalise(combined),
      events: curves.map((ev) => normalise(massOf(ev.like))),
    },
    cautions,
  };
}
