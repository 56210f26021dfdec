import type { Caution } from "../../common/convert.ts";
import { DEFAULT_COSMOLOGY } from "../../common/convert.ts";
import type { SamplesJobResult, StackJobRequest, StackJobResult } from "../../common/jobs.ts";
import { selectTarget } from "../features/convert/samples-common.ts";
import type { CompiledCatalogue } from "../features/convert/compiled-catalogue.ts";
import { makeBinary } from "../physics/binary.ts";
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

interface EventCurve {
  label: string;
  kind: "samples" | "summary";
  /** Likelihood per bin (arbitrary scale), or null when the event is left out. */
  like: Float64Array;
  ownVerdict: "valid" | "outside_validity" | "not_assessed" | null;
  /** Fraction of the event's posterior outside validity at a coupling value x. */
  outsideAt: (x: number) => number | null;
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
  const [ra, rb] = request.prior.range ?? [0, Infinity];
  const priorAt = (x: number) => (x < ra || x > rb ? 0 : request.prior.kind === "log_uniform" ? (x > 0 ? 1 / x : 0) : 1);

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
      if (result.coupling.side === "interval") throw new SampleInputError(`events.${i}.job: stacking signed couplings is not supported yet; stack one-signed couplings.`);
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
  await input.onProgress(0.3);

  // Common grid in u = x^p (linear in beta / K), from 0 to the largest reach of any event.
  let umax = 0;
  for (const ev of loaded) {
    if (ev.kind === "samples") for (const x of ev.values.x) umax = Math.max(umax, Math.abs(x) ** p);
    else umax = Math.max(umax, Math.abs((Math.abs(ev.centre) + 6 * ev.width) / ev.K));
  }
  if (p < 0 || !(umax > 0)) throw new SampleInputError("Stacking supports couplings bounded from above (beta growing with the coupling).");
  const edges = new Float64Array(BINS + 1);
  for (let j = 0; j <= BINS; j++) edges[j] = ((umax * j) / BINS) ** (1 / p);
  const centres = new Float64Array(BINS);
  for (let j = 0; j < BINS; j++) centres[j] = (edges[j]! + edges[j + 1]!) / 2;

  const curves: EventCurve[] = loaded.map((ev) => {
    const like = new Float64Array(BINS);
    if (ev.kind === "samples") {
      const { x, lw, validLo, validHi } = ev.values;
      for (let t = 0; t < x.length; t++) {
        const u = Math.abs(x[t]!) ** p;
        const j = Math.min(BINS - 1, Math.floor((u / umax) * BINS));
        like[j]! += lw[t]!;
      }
      for (let j = 0; j < BINS; j++) like[j] = like[j]! / (edges[j + 1]! - edges[j]!);
      const hasConditions = ev.result.conditions.some((k) => k.kind === "hard");
      return {
        label: ev.label,
        kind: "samples",
        like: smooth(like),
        ownVerdict: ev.result.verdict,
        outsideAt: (bound: number) => {
          if (!hasConditions) return null;
          let out = 0;
          let all = 0;
          for (let t = 0; t < x.length; t++) {
            const w = lw[t]! * priorAt(Math.abs(x[t]!));
            all += w;
            if (bound < validLo[t]! || bound > validHi[t]!) out += w;
          }
          return all > 0 ? out / all : 0;
        },
      };
    }
    for (let j = 0; j < BINS; j++) {
      const beta = ev.K * centres[j]! ** ev.p;
      like[j] = Math.exp(-0.5 * ((beta - ev.centre) / ev.width) ** 2);
    }
    const hard = (mapping.validity ?? []).filter((v) => v.kind === "hard" && !(v.body && v.appliesTo && !v.appliesTo.includes(ev.binary.bodies[v.body - 1]!)));
    return {
      label: ev.label,
      kind: "summary",
      like,
      ownVerdict: null,
      outsideAt: (bound: number) => (hard.length === 0 ? null : hard.some((v) => !(v.evaluate(bound, ev.env) <= v.max)) ? 1 : 0),
    };
  });
  await input.onProgress(0.6);

  const prior = Float64Array.from(centres, (x) => priorAt(x));
  const eventBound = (like: Float64Array) => quantileOnGrid(edges, Float64Array.from(like, (l, j) => l * prior[j]! * (edges[j + 1]! - edges[j]!)), c);
  const rows: StackJobResult["events"] = [];
  const used: EventCurve[] = [];
  for (const ev of curves) {
    const own = eventBound(ev.like);
    let verdict = ev.ownVerdict;
    if (verdict === null) {
      const f = ev.outsideAt(own);
      verdict = f === null ? "not_assessed" : f <= 1 - c ? "valid" : "outside_validity";
    }
    const include = verdict !== "outside_validity" || request.include_outside_validity;
    if (include) used.push(ev);
    rows.push({ label: ev.label, kind: ev.kind, used: include, reason: include ? null : "its own bound is outside the validity of its mapping (left out; include_outside_validity keeps it)", verdict, bound: quotedValueOf(mapping.coupling.quoted.form, own) });
  }
  if (used.length === 0) throw new SampleInputError("Every event is outside validity; none can enter the combination (set include_outside_validity to keep them).");
  const combined = new Float64Array(BINS);
  // Products of likelihoods in logs, so many events do not underflow.
  for (let j = 0; j < BINS; j++) {
    let logL = Math.log(prior[j]! * (edges[j + 1]! - edges[j]!));
    for (const ev of used) logL += Math.log(ev.like[j]!);
    combined[j] = logL;
  }
  const peak = Math.max(...combined.filter(Number.isFinite));
  for (let j = 0; j < BINS; j++) combined[j] = Number.isFinite(combined[j]!) ? Math.exp(combined[j]! - peak) : 0;
  const bound = quantileOnGrid(edges, combined, c);
  let worst = 0;
  let assessed = false;
  for (const ev of used) {
    const f = ev.outsideAt(bound);
    if (f !== null) {
      assessed = true;
      worst = Math.max(worst, f);
    }
  }
  const verdict = !assessed ? "not_assessed" : worst <= 1 - c ? "valid" : "outside_validity";
  await input.onProgress(0.9);

  const quoted = mapping.coupling.quoted;
  const normalise = (a: Float64Array) => {
    const dens = Float64Array.from(a, (v, j) => v / (edges[j + 1]! - edges[j]!));
    const m = Math.max(...dens);
    return Array.from(dens, (v) => (m > 0 ? v / m : 0));
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
    coupling: { symbol: quoted.symbol, latex: quoted.latex, unit: quoted.unit, side: "upper", value: quotedValueOf(quoted.form, bound) },
    prior: { kind: request.prior.kind, range: request.prior.range ?? null },
    verdict,
    fraction_outside: worst,
    events: rows,
    grid: {
      x: Array.from(centres, (x) => quotedValueOf(quoted.form, x)),
      combined: normalise(combined),
      events: curves.map((ev) => normalise(Float64Array.from(ev.like, (l, j) => l * prior[j]! * (edges[j + 1]! - edges[j]!)))),
    },
    cautions,
  };
}
