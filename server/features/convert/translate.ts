import {
  DEFAULT_COSMOLOGY,
  DEFAULT_F_LOW_HZ,
  channelOf,
  intervalOf,
  type BinaryRequest,
  type Channel,
  type ConvertBoundRequest,
  type Caution,
  type ConvertRequest,
  type ConvertResponse,
  type ConvertResult,
  type CosmologyRequest,
  type NotApplicable,
} from "../../../common/convert.ts";
import { symbolText } from "../../../common/symbol-text.ts";
import { ValidationError } from "../../errors.ts";
import { makeBinary, type Binary } from "../../physics/binary.ts";
import { convertInContext, createConversionContext, type BoundInput, type ConversionContext } from "../../physics/convert.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import { degeneracyOfB, gimrFactor, type GimrIndex } from "../../physics/taylorf2.ts";
import { distanceAlphaMpc } from "../../physics/cosmology.ts";
import { amplitudeBoundCautions, engineCautions, gimrSpinCaution, logTermCaution, signConventionCaution } from "./cautions.ts";
import type { CompiledCatalogue, CompiledTheory, ReadyMapping } from "./compiled-catalogue.ts";
import { buildResult } from "./build-result.ts";

/**
 * One bound, one binary, every applicable theory. Synchronous and free of I/O: the service hands it
 * a compiled catalogue, the benchmark calls it directly.
 */

export interface Prepared {
  binary: Binary;
  cosmology: CosmologyRequest;
  /** Lowest frequency of the analysis band, Hz. */
  fLowHz: number;
  context: ConversionContext;
  /** Cautions about the binary itself (frame conversion). */
  cautions: Caution[];
}

/** Physics refusals become 400s naming the request field (binary.m1, cosmology.H0, ...). */
function asValidation(err: unknown, prefix: string): never {
  if (err instanceof PhysicsInputError) {
    const field = err.field.startsWith("cosmology.") ? err.field : `${prefix}${err.field}`;
    throw new ValidationError(`Invalid ${field}: ${err.message}`, { [field]: err.message });
  }
  throw err;
}

/** The binary, the cosmology and the band's lowest frequency f_low (Hz; default 20 Hz, common practice). */
export function prepareBinary(input: BinaryRequest, cosmology: CosmologyRequest | undefined, fLowHz: number = DEFAULT_F_LOW_HZ): Prepared {
  const cosmo = cosmology ?? { ...DEFAULT_COSMOLOGY };
  try {
    const sens = input.scalar_sensitivities;
    const binary = makeBinary({
      m1: input.m1,
      m2: input.m2,
      chi1: input.chi1,
      chi2: input.chi2,
      bodies: input.bodies,
      frame: input.frame,
      ...(input.z === undefined ? {} : { z: input.z }),
      ...(sens ? { scalar_sensitivities: [sens[0] ?? undefined, sens[1] ?? undefined] as const } : {}),
    });
    const context = createConversionContext(binary, { cosmology: cosmo, fLowHz });
    const cautions: Caution[] = [];
    if (input.frame === "detector" && input.z !== undefined) {
      cautions.push({
        code: "frame",
        message: `Detector-frame masses were divided by 1 + z = ${Number((1 + input.z).toPrecision(6))}: source-frame m₁ = ${binary.m1.toPrecision(4)} M☉, m₂ = ${binary.m2.toPrecision(4)} M☉ set the length scale of generation effects.`,
      });
    }
    return { binary, cosmology: cosmo, fLowHz, context, cautions };
  } catch (err) {
    return asValidation(err, "binary.");
  }
}

/** Unknown slugs and conventions are the caller's mistake: 400 naming theories.<i> or conventions.<slug>. */
export function checkSelection(catalogue: CompiledCatalogue, theories: readonly string[] | undefined, conventions: Readonly<Record<string, string>> | undefined): void {
  const fields: Record<string, string> = {};
  const known = [...catalogue.bySlug.keys()].sort();
  theories?.forEach((slug, i) => {
    if (!catalogue.bySlug.has(slug)) fields[`theories.${i}`] = `unknown theory "${slug}"; accepted theories are ${known.join(", ")}`;
  });
  for (const [slug, name] of Object.entries(conventions ?? {})) {
    const t = catalogue.bySlug.get(slug);
    if (!t) {
      fields[`conventions.${slug}`] = `unknown theory "${slug}"`;
      continue;
    }
    const names = new Set(t.mappings.flatMap((m) => [m.compiled.coupling.convention ?? "", ...(m.compiled.coupling.conventions ?? []).map((c) => c.name)]));
    names.delete("");
    if (!names.has(name)) fields[`conventions.${slug}`] = `unknown convention "${name}" for ${slug}; stored conventions are ${[...names].join(", ") || "none"}`;
  }
  const first = Object.entries(fields)[0];
  if (first) throw new ValidationError(`Invalid ${first[0]}: ${first[1]}`, fields);
}

/**
 * A distance ratio r = d_L^GW / d_L^EM is the amplitude correction at a = 0: the wave's amplitude is
 * GR's at the electromagnetic distance times d_EM / d_GW, so alpha = 1/r - 1 (derived). The interval
 * [lo, hi] on r (containing 1) becomes [1/hi - 1, 1/lo - 1] on alpha (containing 0); an open end stays open
 * (r unbounded above is alpha down to -1, which no finite coupling reaches: the same as unbounded).
 */
export function alphaIntervalOfRatio([lo, hi]: readonly [number | null, number | null]): [number | null, number | null] {
  return [hi === null ? null : 1 / hi - 1, lo === null ? null : 1 / lo - 1];
}

/** The engine's form of a bound request: { upper } becomes beta_max / dphi_max / alpha_max, { interval } stays an interval. */
export function boundInputOf(bound: ConvertBoundRequest): BoundInput {
  if (bound.parameter === "distance_ratio") {
    return { kind: "amplitude", a: 0, interval: alphaIntervalOfRatio(bound.interval), credibility: bound.credibility };
  }
  const value = bound.interval !== undefined ? { interval: bound.interval } : undefined;
  if (bound.parameter === "ppe_alpha") return { kind: "amplitude", a: bound.a, ...(value ?? { alpha_max: bound.upper! }), credibility: bound.credibility };
  return bound.parameter === "ppe_beta"
    ? { kind: "ppe", b: bound.b, ...(value ?? { beta_max: bound.upper! }), convention: bound.sign_convention, credibility: bound.credibility }
    : // The schema admits only the indices of GIMR_KS, which are the engine's GimrIndex values.
      { kind: "gimr", k: bound.k as GimrIndex, ...(value ?? { dphi_max: bound.upper! }), includes_spin: bound.includes_spin, credibility: bound.credibility };
}

interface BoundSummary {
  channel: Channel;
  /** Amplitude channels: the exponent a (0 for a distance ratio) and the bound on alpha. */
  a: number | null;
  alphaInterval: [number | null, number | null] | null;
  b: number | null;
  /** The largest |beta| the bound allows (null when a side is unbounded or no b exists). */
  betaMax: number | null;
  /** The bound on beta at b in the +Psi convention (null end = unbounded). */
  betaInterval: [number | null, number | null];
  cautions: Caution[];
  /** Set when no theory can be translated from this bound, with the reason for each. */
  unusable?: { code: NotApplicable["code"]; reason: string };
}

/** [lo, hi] times a factor, ends kept in order (a negative factor swaps them); null stays unbounded. */
function scaled([lo, hi]: readonly [number | null, number | null], factor: number): [number | null, number | null] {
  const t = (x: number | null) => (x === null ? null : x === 0 ? 0 : x * factor);
  return factor >= 0 ? [t(lo), t(hi)] : [t(hi), t(lo)];
}

function magnitude([lo, hi]: readonly [number | null, number | null]): number | null {
  return lo === null || hi === null ? null : Math.max(-lo, hi);
}

function summarise(bound: ConvertBoundRequest, binary: Binary): BoundSummary {
  const cautions: Caution[] = [];
  const phase = { channel: "phase" as const, a: null, alphaInterval: null };
  if (bound.parameter === "ppe_alpha" || bound.parameter === "distance_ratio") {
    const alphaInterval = bound.parameter === "ppe_alpha" ? intervalOf(bound) : alphaIntervalOfRatio(bound.interval);
    cautions.push(...amplitudeBoundCautions(bound));
    return { channel: channelOf(bound), a: bound.parameter === "ppe_alpha" ? bound.a : 0, alphaInterval, b: null, betaMax: null, betaInterval: [null, null], cautions };
  }
  const stated = intervalOf(bound);
  if (bound.parameter === "ppe_beta") {
    if (bound.sign_convention === "minus") cautions.push(signConventionCaution(false, bound.interval !== undefined));
    const degenerate = degeneracyOfB(bound.b);
    if (degenerate) cautions.push({ code: "engine", message: `${degenerate.charAt(0).toUpperCase()}${degenerate.slice(1)}.` });
    const betaInterval = scaled(stated, bound.sign_convention === "minus" ? -1 : 1);
    return { ...phase, b: bound.b, betaMax: magnitude(betaInterval), betaInterval, cautions, ...(degenerate ? { unusable: { code: "degenerate_b", reason: degenerate } } : {}) };
  }
  const k = bound.k;
  if (k === "5l" || k === "6l") {
    cautions.push(logTermCaution(k));
    return { ...phase, b: null, betaMax: null, betaInterval: [null, null], cautions, unusable: { code: "no_ppe_equivalent", reason: `δφ_${k} multiplies a log term: it has no single-b ppE equivalent` } };
  }
  const f = gimrFactor(k as GimrIndex, binary.eta, {
    includesSpin: bound.includes_spin,
    spins: { eta: binary.eta, dm: binary.dm, chi_s: binary.chi_s, chi_a: binary.chi_a, bodies: binary.bodies },
  });
  if (f.status !== "ok") {
    cautions.push({ code: "engine", message: `${f.reason.charAt(0).toUpperCase()}${f.reason.slice(1)}.` });
    return { ...phase, b: f.b, betaMax: null, betaInterval: [null, null], cautions, unusable: { code: "degenerate_b", reason: f.reason } };
  }
  const spinning = binary.chi_s !== 0 || binary.chi_a !== 0;
  const spin = spinning ? gimrSpinCaution(k, bound.includes_spin, f.spinModelled) : undefined;
  if (spin) cautions.push(spin);
  cautions.push(...engineCautions({ warnings: [], cautions: f.cautions }));
  const betaInterval = scaled(stated, f.factor);
  return { ...phase, b: f.b, betaMax: magnitude(betaInterval), betaInterval, cautions };
}

function notApplicable(t: CompiledTheory, code: NotApplicable["code"], reason: string): NotApplicable {
  return { theory: t.theory.slug, theory_name: t.theory.name, code, reason, b: t.bs };
}

function sameB(a: number, b: number): boolean {
  return Math.abs(a - b) < 1e-9;
}

function fmtB(b: number): string {
  return Number(b.toPrecision(6)).toString();
}

/**
 * Every mapping of the theory at the bound's b, one result row each: an entry with several couplings
 * at one b (Johannsen's eps3 and alpha13, the RS-II Mdot and ell) is translated once per coupling
 * with the others at their GR value; mappings of the same coupling at other b are left out.
 */
/** The mappings of the theory a bound of this channel can use, with the words its answers need. */
function channelMappings(t: CompiledTheory, summary: BoundSummary): { ready: ReadyMapping[] } | NotApplicable {
  if (summary.channel === "phase") {
    if (t.noPhaseMapping) return notApplicable(t, "different_b", "its catalogued mappings are not inspiral-phase terms (ringdown or amplitude only)");
    if (summary.unusable) return notApplicable(t, summary.unusable.code, summary.unusable.reason);
    const b = summary.b!;
    const ready = t.mappings.filter((m) => sameB(m.compiled.b, b));
    if (ready.length > 0) return { ready };
    const broken = t.broken.find((x) => x.b !== null && sameB(x.b, b));
    if (broken) return notApplicable(t, "evaluation_failed", `its mapping at b = ${b} could not be compiled: ${broken.reason}`);
    return notApplicable(t, "different_b", `its mapping enters at b = ${t.bs.join(", ") || "none"}, not at b = ${b}`);
  }
  const a = summary.a!;
  const what = summary.channel === "distance_ratio" ? "a distance ratio (the amplitude term at a = 0)" : `an amplitude bound at a = ${fmtB(a)}`;
  if (t.amplitude.length === 0 && t.amplitudeBroken.length === 0) {
    return notApplicable(t, "different_channel", `its catalogued mappings are not amplitude terms (phase or ringdown only), so ${what} says nothing about it`);
  }
  const ready = t.amplitude.filter((m) => sameB(m.compiled.b, a));
  if (ready.length > 0) return { ready };
  const broken = t.amplitudeBroken.find((x) => x.a !== null && sameB(x.a, a));
  if (broken) return notApplicable(t, "evaluation_failed", `its amplitude mapping at a = ${fmtB(a)} could not be compiled: ${broken.reason}`);
  return notApplicable(t, "different_a", `its amplitude mapping enters at a = ${t.as.map(fmtB).join(", ") || "none"}, not at a = ${fmtB(a)}${summary.channel === "distance_ratio" ? " (a distance ratio is the term at a = 0)" : ""}`);
}

function translateTheory(t: CompiledTheory, summary: BoundSummary, boundInput: BoundInput, bound: ConvertBoundRequest, prepared: Prepared, conventions: Readonly<Record<string, string>> | undefined): (ConvertResult | NotApplicable)[] {
  const found = channelMappings(t, summary);
  if ("code" in found) return [found];
  const { ready } = found;
  const amplitude = summary.channel !== "phase";
  const b = amplitude ? summary.a! : summary.b!;
  const letter = amplitude ? "a" : "b";
  const pool = amplitude ? t.amplitude : t.mappings;
  const couplingsHere = [...new Set(ready.map((m) => m.compiled.coupling.symbol))];
  return ready.map((m) => {
    const symbol = m.compiled.coupling.symbol;
    // People read the symbol (√α, ω_BD); the identifier stays for lookups.
    const shown = (id: string) => symbolText(id, pool.find((o) => o.compiled.coupling.symbol === id)?.compiled.coupling.latex);
    const extra: Caution[] = [];
    if (couplingsHere.length > 1) {
      const others = couplingsHere.filter((c) => c !== symbol);
      const held = m.compiled.heldFixed && Object.keys(m.compiled.heldFixed).length > 0
        ? ` (held at ${Object.entries(m.compiled.heldFixed).map(([k, v]) => `${shown(k)} = ${v}`).join(", ")})`
        : "";
      extra.push({
        code: "couplings",
        message: `${t.theory.name} has ${couplingsHere.length} couplings entering at ${letter} = ${fmtB(b)}; each is translated on its own with the others at their GR value${held}. This row bounds ${shown(symbol)}; ${others.map(shown).join(", ")} ${others.length === 1 ? "has its own row" : "have their own rows"}.`,
      });
    }
    const otherOrders = pool.filter((o) => o.compiled.coupling.symbol === symbol && !sameB(o.compiled.b, b)).map((o) => fmtB(o.compiled.b));
    if (otherOrders.length > 0) {
      extra.push({
        code: "orders",
        message: `This entry also maps ${shown(symbol)} at ${letter} = ${[...new Set(otherOrders)].join(", ")}; a bound at ${letter} = ${fmtB(b)} constrains only the term at that ${letter}, so those orders are left out.`,
      });
    }
    let result;
    try {
      result = convertInContext(boundInput, prepared.context, m.compiled);
    } catch (err) {
      if (err instanceof PhysicsInputError && err.field === "z") {
        return notApplicable(t, "needs_distance", "it is a propagation effect: the bound needs the source's distance, and no redshift z was given");
      }
      if (err instanceof PhysicsInputError) return notApplicable(t, "needs_input", `${err.message} (field ${err.field})`);
      return notApplicable(t, "evaluation_failed", `the mapping could not be evaluated for this binary: ${err instanceof Error ? err.message : String(err)}`);
    }
    if (result.status === "no_constraint") {
      const reason = couplingsHere.length > 1 ? `${shown(symbol)}: ${result.reason}` : result.reason;
      return notApplicable(t, result.code, reason);
    }
    const distance = m.compiled.distance;
    const propagation =
      distance && prepared.binary.z !== undefined
        ? { z: prepared.binary.z, alphaMd: distance.alphaMd, mpc: distanceAlphaMpc(prepared.binary.z, distance.alphaMd, prepared.cosmology) }
        : undefined;
    const built = buildResult({ theory: t.theory, ready: m, result, bound, requestedConvention: conventions?.[t.theory.slug], propagation, channel: summary.channel });
    return { ...built, cautions: [...extra, ...built.cautions] };
  });
}

export function translateBound(catalogue: CompiledCatalogue, prepared: Prepared, bound: ConvertBoundRequest, selection: Pick<ConvertRequest, "theories" | "conventions">): ConvertResponse {
  const summary = summarise(bound, prepared.binary);
  const boundInput = boundInputOf(bound);
  const scope = selection.theories ? selection.theories.flatMap((s) => catalogue.bySlug.get(s) ?? []) : catalogue.theories;
  const results: ConvertResult[] = [];
  const notApplicableList: NotApplicable[] = [];
  for (const t of scope) {
    for (const out of translateTheory(t, summary, boundInput, bound, prepared, selection.conventions)) {
      if ("code" in out) notApplicableList.push(out);
      else results.push(out);
    }
  }
  const keys = new Set(results.flatMap((r) => [...r.references.map((c) => c.key), ...r.reference_bounds.map((c) => c.reference.key)]));
  const bibliography = new Map<string, ConvertResponse["bibliography"][number]>();
  for (const t of scope) for (const ref of t.theory.references) if (keys.has(ref.key) && !bibliography.has(ref.key)) bibliography.set(ref.key, ref);
  return {
    bound: {
      channel: summary.channel,
      b: summary.b,
      beta_max: summary.betaMax,
      beta_interval: summary.betaInterval,
      credibility: bound.credibility,
      f_low: bound.f_low,
      a: summary.a,
      deviation_interval: summary.alphaInterval,
      z: bound.parameter === "distance_ratio" ? bound.z : null,
    },
    cosmology: { H0: prepared.cosmology.H0, Omega_m: prepared.cosmology.Omega_m },
    catalogue_revision: catalogue.revision,
    results,
    not_applicable: notApplicableList,
    cautions: [...summary.cautions, ...prepared.cautions],
    bibliography: [...bibliography.values()],
  };
}

/** The whole request: selection checks, the binary, the bound. */
export function translate(catalogue: CompiledCatalogue, request: ConvertRequest): ConvertResponse {
  checkSelection(catalogue, request.theories, request.conventions);
  const bound = request.bound;
  let binary = request.binary;
  if (bound.parameter === "distance_ratio") {
    // The ratio was measured at the source's redshift: the binary takes it (two different ones are a mistake).
    if (binary.z !== undefined && Math.abs(binary.z - bound.z) > 1e-9 * Math.max(1, bound.z)) {
      const message = `the distance ratio is at z = ${bound.z} but binary.z is ${binary.z}: give one redshift (or leave binary.z out)`;
      throw new ValidationError(`Invalid bound.z: ${message}`, { "bound.z": message });
    }
    binary = { ...binary, z: bound.z };
  }
  const prepared = prepareBinary(binary, request.cosmology, bound.f_low);
  return translateBound(catalogue, prepared, bound, request);
}
