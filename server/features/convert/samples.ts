import { symbolText } from "../../../common/symbol-text.ts";
import { HISTOGRAM_BINS, type SampleColumn, type SamplesRequest, type SamplesResponse } from "../../../common/convert-samples.ts";
import { DEFAULT_COSMOLOGY, type Caution } from "../../../common/convert.ts";
import { ValidationError } from "../../errors.ts";
import type { PackedSamplesRequest } from "../../http/body-kinds.ts";
import { makeBinary } from "../../physics/binary.ts";
import { createConversionContext } from "../../physics/convert.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import { detectPowerLaw } from "../../physics/invert.ts";
import { quotedValueOf } from "../../physics/quoted-forms.ts";
import type { CompiledCatalogue } from "./compiled-catalogue.ts";
import { betaPerUnit, mappingCautions, selectTarget, targetReferences } from "./samples-common.ts";

/**
 * A posterior, sample by sample (docs/translate.md, "Posterior samples"): each sample's |beta| is
 * translated at that sample's own binary, x_i = (|beta_i| / |F(1; binary_i)|)^(1/p), and the credible
 * bound is the quantile of the x_i. This is the posterior on the coupling under the reparametrisation
 * beta -> x, NOT reweighted for the prior: a flat prior on beta is not flat in x.
 */

export const SAMPLES_MEANING =
  "Each sample's |beta| is translated at that sample's own binary; the bound is the credible quantile of the translated samples. " +
  "This is the posterior on the coupling under the change of variables, not reweighted for the prior (a flat prior on beta is not flat in the coupling).";

/** Empirical quantile with linear interpolation between order statistics (type 7, common practice). */
export function quantile(sorted: Float64Array, q: number): number {
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}

/** Log-spaced bins over the positive finite values; a degenerate range gets one decade around it. */
export function logHistogram(values: Float64Array, bins = HISTOGRAM_BINS): { edges: number[]; counts: number[] } {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v > 0 && Number.isFinite(v)) {
      if (v < min) min = v;
      if (v > max) max = v;
    }
  }
  if (!Number.isFinite(min)) return { edges: [], counts: [] };
  let a = Math.log10(min);
  let b = Math.log10(max);
  if (b - a < 1e-9) {
    a -= 0.5;
    b += 0.5;
  }
  const edges = Array.from({ length: bins + 1 }, (_, i) => 10 ** (a + ((b - a) * i) / bins));
  const counts = new Array<number>(bins).fill(0);
  for (const v of values) {
    if (!(v > 0 && Number.isFinite(v))) continue;
    const i = Math.min(bins - 1, Math.max(0, Math.floor(((Math.log10(v) - a) / (b - a)) * bins)));
    counts[i]! += 1;
  }
  return { edges, counts };
}

function columnField(field: string): SampleColumn | null {
  if (field === "m1" || field === "m2" || field === "chi1" || field === "chi2" || field === "z") return field;
  return null;
}

/**
 * The conversion yields to the event loop whenever it has run YIELD_AFTER_MS since the last yield
 * (looked at every YIELD_CHECK samples): a 20 000-row request takes about a tenth of a second of CPU,
 * more on a busy machine, and health checks and other requests must still be answered meanwhile.
 */
const YIELD_AFTER_MS = 4;
const YIELD_CHECK = 64;

/** A validated request, its columns as arrays (CSV upload) or typed arrays (JSON read in the body worker). */
export type SamplesInput = SamplesRequest | PackedSamplesRequest;

export async function convertSamples(catalogue: CompiledCatalogue, request: SamplesInput): Promise<SamplesResponse> {
  const target = selectTarget(catalogue, request);
  const mapping = target.ready.compiled;
  const cols = request.columns as Record<SampleColumn, ArrayLike<number> | undefined>;
  const n = cols.beta!.length;
  const cosmology = request.cosmology ?? { ...DEFAULT_COSMOLOGY };
  const validity = mapping.validity ?? [];
  const passed = new Array<number>(validity.length).fill(0);
  const evaluated = new Array<number>(validity.length).fill(0);
  const x = new Float64Array(n);
  let used = 0;
  const dropped = new Map<string, number>();
  const drop = (reason: string) => dropped.set(reason, (dropped.get(reason) ?? 0) + 1);
  let power: number | null = null;

  let ranSince = performance.now();
  for (let i = 0; i < n; i++) {
    if (i % YIELD_CHECK === YIELD_CHECK - 1 && performance.now() - ranSince > YIELD_AFTER_MS) {
      await new Promise<void>((resolve) => setImmediate(resolve));
      ranSince = performance.now();
    }
    let F: (x: number) => number;
    let binary;
    let env;
    try {
      const zi = cols.z?.[i];
      binary = makeBinary({
        m1: cols.m1![i]!,
        m2: cols.m2![i]!,
        chi1: cols.chi1?.[i] ?? 0,
        chi2: cols.chi2?.[i] ?? 0,
        bodies: request.bodies,
        frame: request.frame,
        ...(zi === undefined ? {} : { z: zi }),
      });
      env = createConversionContext(binary, { cosmology, fLowHz: request.f_low }).envFor(mapping);
      F = mapping.bind ? mapping.bind(env) : (c: number) => mapping.evaluate(c, env!);
    } catch (err) {
      if (err instanceof PhysicsInputError) {
        if (err.field === "z" && !cols.z) {
          throw new ValidationError(`Invalid columns.z: ${err.message}`, { "columns.z": `${err.message}: add a z column` });
        }
        const col = columnField(err.field);
        // Per-sample inputs name their column and row; anything else (cosmology.H0 ...) keeps its own path.
        const field = col ? `columns.${col}.${i}` : err.field;
        throw new ValidationError(`Invalid ${field}: row ${i}: ${err.message}`, { [field]: `row ${i}: ${err.message}` });
      }
      throw err;
    }
    // The power is a property of the expression; it is found on the first sample that does not vanish.
    if (power === null) {
      const law = detectPowerLaw(F);
      if (law === null) {
        if ([1e-6, 1, 1e6].every((c) => F(c) === 0)) {
          drop("the mapping vanishes for this sample's binary (e.g. equal masses and spins emit no scalar dipole)");
          continue;
        }
        throw new ValidationError(`Invalid theory: ${target.theory.theory.name}'s mapping at b = ${target.b} is not a power law in its coupling; sample-by-sample translation needs one`, {
          theory: "its mapping is not a power law in the coupling: sample-by-sample translation supports power laws only",
        });
      }
      power = law.power;
    }
    const k = Math.abs(F(1));
    if (!(k > 0) || !Number.isFinite(k)) {
      drop("the mapping vanishes for this sample's binary (e.g. equal masses and spins emit no scalar dipole)");
      continue;
    }
    const beta = Math.abs(cols.beta![i]!) * betaPerUnit(request, binary);
    const xi = (beta / k) ** (1 / power);
    if (!Number.isFinite(xi)) {
      drop("beta = 0 gives no finite coupling for a negative power");
      continue;
    }
    x[used++] = xi;
    validity.forEach((c, j) => {
      if (c.body && c.appliesTo && !c.appliesTo.includes(binary.bodies[c.body - 1]!)) return;
      evaluated[j]! += 1;
      const v = c.evaluate(xi, env);
      if (Number.isFinite(v) && v <= c.max) passed[j]! += 1;
    });
  }

  if (used === 0 || power === null) {
    throw new ValidationError("Invalid columns: no sample gives a finite coupling (the mapping vanishes for every binary)", {
      columns: "no sample gives a finite coupling for this theory",
    });
  }
  const kept = x.subarray(0, used).sort();
  const side = power > 0 ? "upper" : "lower";
  // An upper limit is the credibility quantile; a lower one (beta falls as lambda_g grows) the 1 - credibility quantile.
  const canonical = quantile(kept, side === "upper" ? request.credibility : 1 - request.credibility);
  const quoted = mapping.coupling.quoted;
  const inQuoted = kept.map((v) => quotedValueOf(quoted.form, v));

  const fractions = validity.map((c, j) => ({
    label: c.label,
    condition: c.condition,
    kind: c.kind,
    fraction_ok: evaluated[j]! === 0 ? 1 : passed[j]! / evaluated[j]!,
    evaluated: evaluated[j]!,
  }));
  const cautions: Caution[] = [
    { code: "prior", message: `A flat prior on β is not flat in ${symbolText(quoted.symbol, quoted.latex)}: these samples are not reweighted for the prior.` },
  ];
  for (const f of fractions) {
    if (f.fraction_ok < 1) {
      cautions.push({ code: "validity", message: `${((1 - f.fraction_ok) * 100).toPrecision(3)}% of the samples fail “${f.label}” (${f.kind === "hard" ? "hard condition" : "rule of thumb"}).` });
    }
  }
  const droppedCount = n - used;
  if (droppedCount > 0) cautions.push({ code: "engine", message: `${droppedCount} of ${n} samples were dropped: ${[...dropped.keys()].join("; ")}.` });
  cautions.push(...mappingCautions(target));

  return {
    theory: target.theory.theory.slug,
    theory_name: target.theory.theory.name,
    b: target.b,
    credibility: request.credibility,
    meaning: SAMPLES_MEANING,
    coupling: { symbol: quoted.symbol, latex: quoted.latex, unit: quoted.unit, value: quotedValueOf(quoted.form, canonical), side },
    power,
    samples: { total: n, used, dropped: droppedCount, dropped_reasons: [...dropped].map(([reason, count]) => ({ reason, count })) },
    validity: fractions,
    histogram: logHistogram(inQuoted),
    cautions,
    references: targetReferences(target),
  };
}
