import { intervalOf, type BibliographyEntry, type Caution } from "../../../common/convert.ts";
import type { RingdownConvertRequest, RingdownConvertResponse, RingdownResult, RingdownSideLimit } from "../../../common/ringdown.ts";
import { ValidationError } from "../../errors.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import { toLatex } from "../../physics/expr/index.ts";
import { qnm } from "../../physics/ringdown/qnm.ts";
import { translateRingdownBound, type ShiftBound, type SideLimit } from "../../physics/ringdown/ringdown-bound.ts";
import { failingDto, validityItemDto } from "../convert/build-result.ts";
import { validityCautions } from "../convert/cautions.ts";
import type { RingdownCatalogue } from "./catalogue.ts";
import { resolveRemnant } from "./remnant-input.ts";
import { ringdownCitations } from "./references.ts";

const KIND_OF = { qnm_dfreq: "ringdown_frequency", qnm_dtau: "ringdown_damping" } as const;

export interface RingdownService {
  /** A bound on a QNM shift, as POST /convert takes it (and /convert/ringdown, which delegates here). */
  convert(request: RingdownConvertRequest): Promise<RingdownConvertResponse>;
}

function sideDto(s: SideLimit | null): RingdownSideLimit | null {
  if (s === null) return null;
  return {
    value: s.value,
    shift: s.shift,
    verdict: s.verdict,
    failing: s.failing ? failingDto(s.failing) : null,
    validity: s.validity.map(validityItemDto),
    unassessed: s.unassessed.map((u) => ({ ...u })),
  };
}

/** The validity cautions of an inspiral row (stretched or failing conditions), said once when both sides agree. */
function sideCautions(lower: SideLimit | null, upper: SideLimit | null): Caution[] {
  const of = (s: SideLimit | null): Caution[] => {
    if (s === null) return [];
    const out = validityCautions(s);
    if (s.unassessed.length > 0) {
      out.push({ code: "validity", message: `Not assessed: ${s.unassessed.map((u) => `“${u.label}” (${u.reason}; give the binary rather than the remnant)`).join(", ")}.` });
    }
    return out;
  };
  const lo = of(lower);
  const hi = of(upper);
  const same = lo.length === hi.length && lo.every((c, i) => c.message === hi[i]?.message);
  if (same) return lower && upper ? lo.map((c) => ({ ...c, message: `At both limits: ${c.message}` })) : [...lo, ...hi];
  return [...lo.map((c) => ({ ...c, message: `At the negative-side limit: ${c.message}` })), ...hi.map((c) => ({ ...c, message: `At the positive-side limit: ${c.message}` }))];
}

/** Physics refusals (a remnant outside the fits, an unknown theory) are 400s naming the request field. */
async function asValidation<T>(fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (err) {
    if (err instanceof PhysicsInputError) throw new ValidationError(`Invalid request body: ${err.field}: ${err.message}`, { [err.field]: err.message });
    throw err;
  }
}

export function ringdownService(catalogue: RingdownCatalogue): RingdownService {
  return {
    convert: (request) => asValidation(() => convert(catalogue, request)),
  };
}

async function convert(catalogue: RingdownCatalogue, request: RingdownConvertRequest): Promise<RingdownConvertResponse> {
  const remnant = resolveRemnant(request);
  const { bound } = request;
  if (remnant.chi_f < 0) {
    throw new PhysicsInputError("binary", `the remnant fit gives chi_f = ${remnant.chi_f.toFixed(3)} < 0: the QNM fits cover remnants spinning with the orbit only`);
  }
  const massForMode = remnant.z === undefined ? remnant.M_f_source : remnant.M_f_source * (1 + remnant.z);
  const mode = qnm(bound.mode, massForMode, remnant.chi_f);
  const shift: ShiftBound = bound.upper !== undefined ? { upper: bound.upper } : { interval: bound.interval! };
  const kind = KIND_OF[bound.parameter];
  const { revision, theories } = await catalogue.loadVersioned();
  const bibliography = new Map<string, BibliographyEntry>();
  const wanted = request.theories ? new Set(request.theories) : undefined;
  if (wanted) {
    const known = new Set(theories.map((t) => t.slug));
    const unknown = [...wanted].filter((s) => !known.has(s));
    if (unknown.length > 0) throw new PhysicsInputError("theories", `unknown theory ${unknown.map((s) => `"${s}"`).join(", ")}`);
  }
  const results: RingdownResult[] = [];
  for (const t of theories) {
    if (wanted && !wanted.has(t.slug)) continue;
    const matching = t.mappings.filter((m) => m.kind === kind && m.mode === bound.mode);
    const base = { slug: t.slug, name: t.name, revision: t.revision, lower: null, upper: null, unconstrained: [], verdict: "not_assessed" as const, limit: null, reference_bounds: [], references: [], cautions: [] };
    if (matching.length === 0) {
      if (!wanted) continue;
      const other = t.mappings.length > 0 ? `its ringdown mappings are for ${[...new Set(t.mappings.map((m) => `${m.kind} (${m.mode})`))].join(", ")}` : "it has no ringdown mapping";
      results.push({ ...base, status: "not_applicable", reason: `${other}; this bound is on ${kind} of mode ${bound.mode}` });
      continue;
    }
    for (const m of matching) {
      const cautions: Caution[] = [];
      if (m.sourceStatus === "memory") cautions.push({ code: "source_status", message: "The mapping's formula is recalled from memory: source to be confirmed by an editor." });
      if (m.sourceStatus === "derived") cautions.push({ code: "source_status", message: "The mapping is a derivation of the project's (see its notes), not a published formula." });
      if (/eikonal|light ring/i.test(`${m.notes ?? ""}`)) cautions.push({ code: "engine", message: "Eikonal (light-ring) estimate: only a rough guide at l = 2." });
      const described = {
        coupling: { symbol: m.coupling.symbol, latex: m.coupling.latex, unit: m.coupling.unit },
        mapping: { kind: m.kind, mode: m.mode, expression: m.expression, ...mappingLatex(m.latex, m.expression), source_status: m.sourceStatus },
      };
      try {
        const tr = translateRingdownBound(m, shift, remnant.env);
        if (tr.lower === null && tr.upper === null) {
          const cited = ringdownCitations(t.entry, m, { status: "no_constraint", lower: null, upper: null, verdict: "not_assessed" });
          for (const b of cited.bibliography) if (!bibliography.has(b.key)) bibliography.set(b.key, b);
          const reason = tr.unconstrained.map((u) => `${u.side} side: ${u.reason}`).join("; ");
          results.push({ ...base, ...described, status: "no_constraint", reason, unconstrained: tr.unconstrained, reference_bounds: cited.reference_bounds, references: cited.references, cautions });
          continue;
        }
        if (m.coupling.range !== "any_sign") cautions.push({ code: "one_signed", message: `The coupling is ${m.coupling.range === "positive" ? "positive" : "non-negative"}: only x > 0 is searched.` });
        cautions.unshift(...sideCautions(tr.lower, tr.upper));
        const lower = sideDto(tr.lower);
        const upper = sideDto(tr.upper);
        const cited = ringdownCitations(t.entry, m, { status: "bounded", lower, upper, verdict: tr.verdict });
        for (const b of cited.bibliography) if (!bibliography.has(b.key)) bibliography.set(b.key, b);
        results.push({
          ...base,
          ...described,
          status: "bounded",
          lower,
          upper,
          unconstrained: tr.unconstrained,
          verdict: tr.verdict,
          limit: cited.limit,
          reference_bounds: cited.reference_bounds,
          references: cited.references,
          cautions,
        });
      } catch (err) {
        if (!(err instanceof PhysicsInputError)) throw err;
        results.push({ ...base, ...described, status: "not_applicable", reason: `${err.message}`, cautions });
      }
    }
    for (const b of t.broken) results.push({ ...base, status: "not_applicable", reason: `mapping ${b.index} does not compile: ${b.reason}` });
  }
  const cautions: Caution[] = [
    {
      code: "remnant",
      message: "A ringdown shift is defined at the true remnant: the remnant used here is the one given (or from the fits), not re-inferred with the shifted mode.",
    },
  ];
  if (remnant.from === "fit") {
    cautions.push({
      code: "remnant",
      message: `Remnant from the Husa et al. 2016 fits; Barausse & Rezzolla 2009 gives chi_f = ${remnant.chi_f_alternative?.toFixed(4)} (spread ${remnant.chi_f_fit_spread?.toExponential(1)}), a systematic of the remnant.`,
    });
  }
  if (remnant.z === undefined) cautions.push({ code: "frame", message: "No redshift: the mode's frequency and damping time are given in the source frame." });
  return {
    kind: "ringdown",
    bound: { parameter: bound.parameter, mode: bound.mode, interval: [...intervalOf(bound)], credibility: bound.credibility },
    remnant: {
      M_f_source: remnant.M_f_source,
      chi_f: remnant.chi_f,
      from: remnant.from,
      ...(remnant.z === undefined ? {} : { z: remnant.z }),
      ...(remnant.chi_f_alternative === undefined ? {} : { chi_f_alternative: remnant.chi_f_alternative, chi_f_fit_spread: remnant.chi_f_fit_spread! }),
    },
    catalogue_revision: revision,
    qnm: { mode: bound.mode, frequency_hz: mode.frequency_hz, damping_time_s: mode.damping_time_s, frame: remnant.z === undefined ? "source" : "detector" },
    results,
    cautions,
    bibliography: [...bibliography.values()],
  };
}

/** The mapping's LaTeX as stored, else typeset from its expression (which passed the engine's checks), so the page shows a formula, not code. */
function mappingLatex(stored: string | undefined, expression: string): { latex?: string } {
  if (stored) return { latex: stored };
  try {
    return { latex: toLatex(expression) };
  } catch {
    return {};
  }
}
