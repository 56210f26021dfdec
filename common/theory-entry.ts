import { z } from "zod";

/**
 * The shape of a theory entry: what a contributor submits and what an accepted revision stores, plus
 * the vocabulary it uses and the engine-check report stored beside it. The client's submission form
 * validates with these same schemas, so a field error means the same thing on both sides.
 */

// ---------------------------------------------------------------------------------------------
// Vocabulary

export const THEORY_FAMILIES = [
  "scalar-tensor",
  "quadratic-gravity",
  "lorentz-violating",
  "massive-gravity",
  "extra-dimensions",
  "varying-constants",
  "parameterized-black-hole",
  "noncommutative-geometry",
  "other",
] as const;
export type TheoryFamily = (typeof THEORY_FAMILIES)[number];

export const FAMILY_LABELS: Record<TheoryFamily, string> = {
  "scalar-tensor": "Scalar-tensor",
  "quadratic-gravity": "Quadratic gravity",
  "lorentz-violating": "Lorentz-violating",
  "massive-gravity": "Massive gravity",
  "extra-dimensions": "Extra dimensions",
  "varying-constants": "Varying constants",
  "parameterized-black-hole": "Parameterized black hole",
  "noncommutative-geometry": "Noncommutative geometry",
  other: "Other",
};

/** A theory with an action, or a parameterized spacetime given by its metric. */
export const ENTRY_KINDS = ["theory", "parameterized_spacetime"] as const;

/**
 * remnant_mass / remnant_spin: the fractional shift of the remnant black hole's mass or spin,
 * dM_f/M_f or dchi_f/chi_f, that the theory causes for a given binary (used by the IMR consistency
 * forecast together with the ringdown shifts).
 */
export const MAPPING_KINDS = ["inspiral_phase", "inspiral_amplitude", "ringdown_frequency", "ringdown_damping", "remnant_mass", "remnant_spin"] as const;
export type MappingKind = (typeof MAPPING_KINDS)[number];

/** How the quoted quantity is formed from the canonical coupling (sqrt(alpha) for a length^2 coupling). */
export const QUOTED_FORMS = [
  "identity",
  "sqrt",
  "per_year",
  "micrometre",
  "solar_mass_per_year",
  "graviton_wavelength",
  "dispersion_length",
] as const;

/** Where a formula comes from: read in a paper, re-derived here, or recalled and awaiting an editor. */
export const SOURCE_STATUSES = ["confirmed", "derived", "memory"] as const;
export type SourceStatus = (typeof SOURCE_STATUSES)[number];

export const VALIDITY_KINDS = ["hard", "rule_of_thumb"] as const;
export const DERIVATION_KINDS = ["energy_flux", "frequency_drift", "propagation"] as const;
/** charge: which bodies carry the charge; derived_for: a caution for other bodies; only_for: other bodies are not covered at all. */
export const BODY_RULE_KINDS = ["charge", "derived_for", "only_for"] as const;
export const BODY_TYPES = ["bh", "ns"] as const;
export const BOUND_SIDES = ["upper", "lower"] as const;
/** Where a coupling may lie physically: x > 0, x >= 0, or either sign. */
export const COUPLING_RANGES = ["positive", "non_negative", "any_sign"] as const;
export type CouplingRange = (typeof COUPLING_RANGES)[number];
/** The coupling's value in general relativity: the limit in which every deviation vanishes. */
export const GR_VALUES = ["zero", "infinity"] as const;
export type GrValue = (typeof GR_VALUES)[number];

export const SUBMISSION_STATUSES = ["draft", "submitted", "in_review", "accepted", "returned", "resubmitted", "withdrawn"] as const;
export type SubmissionStatus = (typeof SUBMISSION_STATUSES)[number];

/** Statuses an editor's queue shows. */
export const REVIEW_QUEUE_STATUSES: readonly SubmissionStatus[] = ["submitted", "resubmitted", "in_review"];

// ---------------------------------------------------------------------------------------------
// Identifier formats

/** New-style arXiv ids (2104.11189, optionally v2) and old-style ones (gr-qc/0512160, math.DG/0211159). */
export const ARXIV_PATTERN = /^(?:\d{4}\.\d{4,5}|[a-z]+(?:-[a-z]+)*(?:\.[A-Z]{2})?\/\d{7})(?:v\d+)?$/;
/** DOI: 10.<registrant>/<suffix>, no whitespace. */
export const DOI_PATTERN = /^10\.\d{4,9}\/\S+$/;
export const SLUG_PATTERN = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;
/** Symbols are identifiers the expression engine can read. */
export const SYMBOL_PATTERN = /^[A-Za-z][A-Za-z0-9_]*$/;
export const REFERENCE_KEY_PATTERN = /^[A-Za-z0-9][A-Za-z0-9_:.-]*$/;

export const arxivIdSchema = z
  .string()
  .trim()
  .regex(ARXIV_PATTERN, "must be an arXiv id like 2104.11189 or gr-qc/0512160 (no 'arXiv:' prefix)");
export const doiSchema = z.string().trim().regex(DOI_PATTERN, "must be a DOI like 10.1103/PhysRevD.80.122003 (no URL prefix)");

const text = (max: number) => z.string().trim().min(1, "must not be empty").max(max, `must be at most ${max} characters`);
/** Optional text; a blank form field ("") counts as absent. */
const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `must be at most ${max} characters`)
    .transform((v) => (v === "" ? undefined : v))
    .optional();
/** An optional identifier that must be well formed when given; blank counts as absent. */
const optionalId = (schema: z.ZodType<string, string>) =>
  z
    .string()
    .trim()
    .transform((v) => (v === "" ? undefined : v))
    .pipe(schema.optional())
    .optional();
const symbol = z.string().regex(SYMBOL_PATTERN, "must be an identifier: a letter, then letters, digits or _").max(40);
const expression = text(4000);
const referenceKey = z.string().regex(REFERENCE_KEY_PATTERN, "must be a citation key (letters, digits, _ : . -)").max(80);

// ---------------------------------------------------------------------------------------------
// References

const NAME_SUFFIX = /^(?:jr\.?|sr\.?|ii|iii|iv)$/i;

/**
 * True when one author field holds several people separated by commas ("K. Yagi, L. C. Stein"), which
 * would otherwise be stored as one author. "Yagi, Kent" (last, first) and "Yagi, Jr., Kent" are one person.
 */
export function looksLikeSeveralAuthors(name: string): boolean {
  const parts = name.split(",").map((p) => p.trim()).filter(Boolean);
  const significant = parts.filter((p) => !NAME_SUFFIX.test(p));
  if (significant.length >= 3) return true;
  if (significant.length < 2) return false;
  // "Last, First": the part before the comma is a surname, perhaps with lower-case particles (van der Berg).
  // "First Last, First Last": the part before the comma is itself a full name.
  const before = (significant[0] as string).split(/\s+/).filter((w) => !/^\p{Ll}/u.test(w));
  const after = (significant[1] as string).split(/\s+/);
  const startsWithInitial = /^\p{Lu}\.(?:\p{Lu}\.)*$/u.test(before[0] ?? "");
  return before.length >= 2 && (startsWithInitial || after.length >= 2);
}

/** Authors as a list; a BibTeX-style "A and B" string is accepted and split; comma-separated lists are refused. */
const authorsSchema = z
  .union([z.array(text(200)).min(1, "needs at least one author"), text(4000)])
  .transform((v) => (Array.isArray(v) ? v : v.split(/\s+and\s+/).map((s) => s.trim()).filter(Boolean)))
  .superRefine((names, ctx) => {
    names.forEach((name) => {
      if (looksLikeSeveralAuthors(name)) {
        // Reported on the authors field itself, where the form shows it.
        ctx.addIssue({
          code: "custom",
          message: `"${name}" looks like several authors separated by commas: give one author per line, or separate them with " and "`,
        });
      }
    });
  });

export const referenceInputSchema = z.strictObject({
  /** Key other parts of the entry cite this reference by (mappings, conventions, bounds). */
  key: referenceKey.optional(),
  arxiv: optionalId(arxivIdSchema),
  doi: optionalId(doiSchema),
  authors: authorsSchema,
  title: text(500),
  year: z.number().int().min(1600).max(2100),
  journal: optionalText(200),
  volume: optionalText(40),
  pages: optionalText(40),
  /** Equation, table or section the entry relies on. */
  locator: optionalText(200),
  note: optionalText(1000),
  /** Bibliographic details written from memory: an editor checks them against the paper. */
  details_from_memory: z.boolean().optional(),
});
export type ReferenceInput = z.input<typeof referenceInputSchema>;
export type Reference = z.output<typeof referenceInputSchema>;

// ---------------------------------------------------------------------------------------------
// Theory entry (the submission shape)

/** A power of length, as a number or written "L^2", "L", "L^-1", "1". */
const dimensionSchema = z.union([
  z.number().finite(),
  z
    .string()
    .regex(/^(?:1|L|L\^\(?-?\d+(?:\.\d+)?\)?)$/, 'must be a power of length: a number, or "L^2", "L", "L^-1", "1"')
    .transform((v) => (v === "1" ? 0 : v === "L" ? 1 : Number(v.slice(2).replace(/[()]/g, "")))),
]);

export const conventionSchema = z.strictObject({
  name: text(80),
  action_latex: optionalText(4000),
  /** coupling in the entry's canonical convention = factor x coupling in this convention. */
  factor: z.number().positive("must be a positive number").finite(),
  /** The same factor as an expression, for display, e.g. 1/sqrt(8*pi). */
  factor_expression: optionalText(200),
  reference: referenceKey.optional(),
  source_status: z.enum(SOURCE_STATUSES).optional(),
  note: optionalText(1000),
});

export const quotedFormSchema = z.strictObject({
  form: z.enum(QUOTED_FORMS),
  symbol: symbol,
  latex: text(200),
  /** Unit the literature quotes this quantity in: km, 1/yr, eV, um ... */
  unit: text(32),
  /** Exponent of the modified dispersion, needed by "dispersion_length". */
  alpha_md: z.number().finite().optional(),
});

/**
 * An editor's retirement of an entry, a coupling or a mapping: it leaves translations and forecasts but
 * stays readable with its history. Set only through the retire and restore actions (a submission's own
 * value is replaced by the catalogue's when it is published).
 */
export const retirementSchema = z.strictObject({
  reason: text(1000),
  /** ISO 8601 time of the retirement. */
  at: z.string().max(40),
  /** Login of the editor who retired it. */
  by: z.string().max(80).optional(),
});
export type Retirement = z.infer<typeof retirementSchema>;

export const couplingSchema = z.strictObject({
  symbol: symbol,
  latex: text(200),
  /** Power of length in geometric units (G = c = 1): 2 for a length^2 coupling, 0 if dimensionless ("L^2" and "1" are read too). */
  dimension: dimensionSchema,
  /** Unit of the coupling as the mappings take it: km^2, km, 1/km, 1 (dimensionless). */
  unit: text(32),
  /** How limits are quoted, when not the coupling itself (sqrt(alpha) in km for alpha in km^2). */
  quoted: quotedFormSchema.optional(),
  description: optionalText(1000),
  /** Name of the convention the mappings use (one of `conventions`, or the canonical one). */
  convention: optionalText(80),
  conventions: z.array(conventionSchema).max(20).default([]),
  /** Physical range of the coupling: decides, per binary, whether a mapping has one sign. */
  range: z.enum(COUPLING_RANGES).optional(),
  /** Value of the coupling in general relativity (zero for most; infinity for omega_BD, lambda_g). */
  gr_value: z.enum(GR_VALUES).optional(),
  retired: retirementSchema.optional(),
});

export const definitionSchema = z.strictObject({
  symbol: symbol,
  expression: expression,
  latex: optionalText(4000),
  description: optionalText(1000),
});

export const validityConditionSchema = z.strictObject({
  /** A dimensionless quantity that must stay below `max` for the mapping to hold. */
  expression: expression,
  max: z.number().finite(),
  label: text(200),
  /** A hard limit of the theory, or a rule of thumb for the small-coupling expansion. */
  kind: z.enum(VALIDITY_KINDS).default("rule_of_thumb"),
  /** The key of a reference of this entry, or a short note of where the threshold comes from. */
  reference: optionalText(500),
  source_status: z.enum(SOURCE_STATUSES).optional(),
  /** Only for body 1 or 2 ... */
  body: z.union([z.literal(1), z.literal(2)]).optional(),
  /** ... and only when that body is of these types. */
  applies_to: z.array(z.enum(BODY_TYPES)).max(2).optional(),
  latex: optionalText(4000),
});

/**
 * How beta follows from the theory's change of the binding energy and flux (E = E_GR [1 + A v^(2 order)],
 * F = F_GR [1 + B v^(2 order)]), of the frequency drift (df/dt = GR [1 + gamma u^(b+5)]), or from
 * propagation; the engine re-derives beta from it and compares.
 */
export const derivationSchema = z.strictObject({
  kind: z.enum(DERIVATION_KINDS),
  order: z.number().finite(),
  A: expression.optional(),
  B: expression.optional(),
  gamma: expression.optional(),
  note: optionalText(1000),
});

export const bodyRuleSchema = z.strictObject({
  /** "charge": which bodies carry the charge; "derived_for": which bodies the formula was derived for (others get a caution); "only_for": the mapping does not apply to other bodies. */
  kind: z.enum(BODY_RULE_KINDS),
  description: text(1000),
  bodies: z.array(z.enum(BODY_TYPES)).max(2).optional(),
  reference: referenceKey.optional(),
});

export const qnmModeSchema = z.strictObject({
  l: z.number().int().min(2),
  m: z.number().int(),
  n: z.number().int().min(0),
});

export const mappingObject = z.strictObject({
    kind: z.enum(MAPPING_KINDS),
    /** Relative PN order n of the correction (b = 2n - 5 for the phase). */
    pn_order: z.number().finite().optional(),
    /** ppE phase exponent. */
    b: z.number().finite().optional(),
    /** ppE amplitude exponent. */
    a: z.number().finite().optional(),
    /** Ringdown mappings: the quasinormal mode. */
    mode: qnmModeSchema.optional(),
    /** beta (phase), alpha (amplitude) or the fractional QNM shift, in couplings, definitions and binary variables. */
    expression: expression,
    latex: optionalText(4000),
    /** The coupling this mapping constrains (default: the entry's first coupling). */
    coupling: symbol.optional(),
    /** Other couplings of the expression, held at these values. */
    held_fixed: z.record(symbol, z.number().finite()).optional(),
    /** Propagation effects: the dispersion exponent whose distance measure D_alpha enters. */
    alpha_md: z.number().finite().optional(),
    frame_note: optionalText(1000),
    derivation: derivationSchema.optional(),
    /** The same correction as a gIMR deviation dphi_k, when it has one. */
    gimr_equivalent: z.strictObject({ k: z.number().finite(), expression: expression, source_status: z.enum(SOURCE_STATUSES) }).optional(),
    body_rules: z.array(bodyRuleSchema).max(20).default([]),
    validity: z.array(validityConditionSchema).max(20).default([]),
    /** Shown beside every translation with this mapping, where the number can mislead. */
    caution: optionalText(1000),
    source_status: z.enum(SOURCE_STATUSES).default("confirmed"),
    /** Keys of the references this formula comes from. */
    references: z.array(referenceKey).max(20).default([]),
    /** Equation or table of the first reference. */
    locator: optionalText(200),
    notes: optionalText(2000),
    retired: retirementSchema.optional(),
});

export const mappingSchema = mappingObject.superRefine((m, ctx) => {
    if ((m.kind === "inspiral_phase" || m.kind === "inspiral_amplitude") && m.pn_order === undefined) {
      ctx.addIssue({ code: "custom", path: ["pn_order"], message: "is required for an inspiral mapping" });
    }
    if (m.kind === "inspiral_phase" && m.b === undefined) ctx.addIssue({ code: "custom", path: ["b"], message: "is required for an inspiral_phase mapping" });
    if (m.kind === "inspiral_amplitude" && m.a === undefined) ctx.addIssue({ code: "custom", path: ["a"], message: "is required for an inspiral_amplitude mapping" });
    // Yunes & Pretorius 2009 (arXiv:0909.3328): a correction at relative n-th PN order has amplitude exponent a = 2n.
    if (m.kind === "inspiral_amplitude" && m.a !== undefined && m.pn_order !== undefined && Math.abs(m.a - 2 * m.pn_order) > 1e-9) {
      ctx.addIssue({ code: "custom", path: ["a"], message: `must be 2n for a correction at n-th PN order: pn_order ${m.pn_order} gives a = ${2 * m.pn_order}, not ${m.a}` });
    }
    if ((m.kind === "ringdown_frequency" || m.kind === "ringdown_damping") && m.mode === undefined) {
      ctx.addIssue({ code: "custom", path: ["mode"], message: "is required for a ringdown mapping: the quasinormal mode (l, m, n), e.g. (2, 2, 0)" });
    }
  });

export const referenceBoundSchema = z.strictObject({
  /** Symbol of the coupling the bound limits. */
  coupling: symbol,
  /** Symbol of the quantity the value is quoted as (sqrt_alpha, or m_g for lambda_g), when not the coupling itself. */
  quoted_symbol: symbol.optional(),
  /** In `unit`, the quoted unit. */
  value: z.number().finite(),
  unit: text(32),
  side: z.enum(BOUND_SIDES),
  /** Credible level as a fraction, e.g. 0.9. */
  credibility: z.number().gt(0).lt(1).optional(),
  /** Which data: "GWTC-3 binary black holes", "a low-mass X-ray binary". */
  data: optionalText(300),
  reference: referenceKey,
  source_status: z.enum(SOURCE_STATUSES).optional(),
  /** Convention the value is quoted in, when not the canonical one. */
  convention: optionalText(80),
  note: optionalText(1000),
});

export const theoryEntryObject = z.strictObject({
  slug: z.string().regex(SLUG_PATTERN, "must be lower-case words joined by hyphens, e.g. edgb or massive-graviton").max(64),
  name: text(200),
  kind: z.enum(ENTRY_KINDS).default("theory"),
  family: z.enum(THEORY_FAMILIES),
  summary: text(4000),
  action_latex: optionalText(8000),
  metric_latex: optionalText(8000),
  assumptions: z.array(text(1000)).max(40).default([]),
  /** Set when any mapping or bound rests on a formula recalled from memory: an editor must confirm it. */
  needs_source_confirmation: z.boolean().optional(),
  couplings: z.array(couplingSchema).min(1, "needs at least one coupling").max(20),
  definitions: z.array(definitionSchema).max(40).default([]),
  mappings: z.array(mappingSchema).min(1, "needs at least one mapping").max(40),
  references: z.array(referenceInputSchema).min(1, "needs at least one reference").max(100),
  reference_bounds: z.array(referenceBoundSchema).max(50).default([]),
  retired: retirementSchema.optional(),
});

/** Keys and symbols that parts of an entry point at must exist, and names must be unique. */
export const theoryEntrySchema = theoryEntryObject.superRefine((e, ctx) => {
  const keys = new Set<string>();
  e.references.forEach((r, i) => {
    if (!r.key) return;
    if (keys.has(r.key)) ctx.addIssue({ code: "custom", path: ["references", i, "key"], message: `duplicates the key "${r.key}"` });
    keys.add(r.key);
  });
  const cite = (key: string | undefined, path: (string | number)[]) => {
    if (key !== undefined && !keys.has(key)) ctx.addIssue({ code: "custom", path, message: `cites "${key}", which is not the key of any reference in this entry` });
  };
  const symbols = new Map<string, string>();
  const claim = (s: string, what: string, path: (string | number)[]) => {
    const prior = symbols.get(s);
    if (prior) ctx.addIssue({ code: "custom", path, message: `"${s}" is already used by ${prior}` });
    else symbols.set(s, what);
  };
  e.couplings.forEach((c, i) => {
    claim(c.symbol, `coupling ${i}`, ["couplings", i, "symbol"]);
    c.conventions.forEach((cv, j) => cite(cv.reference, ["couplings", i, "conventions", j, "reference"]));
  });
  e.definitions.forEach((d, i) => claim(d.symbol, `definition ${i}`, ["definitions", i, "symbol"]));
  const couplingSymbols = new Set(e.couplings.map((c) => c.symbol));
  const retiredCouplings = new Set(e.couplings.filter((c) => c.retired).map((c) => c.symbol));
  e.mappings.forEach((m, i) => {
    m.references.forEach((k, j) => cite(k, ["mappings", i, "references", j]));
    if (m.coupling !== undefined && !couplingSymbols.has(m.coupling)) {
      ctx.addIssue({ code: "custom", path: ["mappings", i, "coupling"], message: `"${m.coupling}" is not a coupling of this entry` });
    }
    const constrained = m.coupling ?? e.couplings[0]?.symbol;
    if (!m.retired && constrained !== undefined && retiredCouplings.has(constrained)) {
      ctx.addIssue({ code: "custom", path: ["mappings", i, "coupling"], message: `constrains the retired coupling "${constrained}": retire this mapping too, or restore the coupling` });
    }
    for (const held of Object.keys(m.held_fixed ?? {})) {
      if (!couplingSymbols.has(held)) ctx.addIssue({ code: "custom", path: ["mappings", i, "held_fixed", held], message: `"${held}" is not a coupling of this entry` });
    }
    m.body_rules.forEach((r, j) => cite(r.reference, ["mappings", i, "body_rules", j, "reference"]));
  });
  e.reference_bounds.forEach((b, i) => {
    cite(b.reference, ["reference_bounds", i, "reference"]);
    if (!couplingSymbols.has(b.coupling)) ctx.addIssue({ code: "custom", path: ["reference_bounds", i, "coupling"], message: `"${b.coupling}" is not a coupling of this entry` });
  });
});
export type TheoryEntryInput = z.input<typeof theoryEntrySchema>;
export type TheoryEntry = z.output<typeof theoryEntrySchema>;
export type Mapping = TheoryEntry["mappings"][number];
export type Coupling = TheoryEntry["couplings"][number];

// ---------------------------------------------------------------------------------------------
// Engine checks, as stored with a submission or revision

export const checkResultSchema = z.object({
  /** What was checked, as a path into the entry: "mappings.0" or "mappings.0.validity.1". */
  path: z.string(),
  /** Short machine name: parse, symbols, dimension, ppe_order, derivation, validity ... */
  name: z.string(),
  ok: z.boolean(),
  /**
   * "inconclusive": the check could not finish in its time limit. Not a failure (it says nothing
   * about the expression); it runs again on the next save, and an entry with one cannot be accepted.
   */
  severity: z.enum(["error", "warning", "info", "inconclusive"]),
  message: z.string(),
});
export type CheckResult = z.infer<typeof checkResultSchema>;

export const checksReportSchema = z.object({
  /** True when no check failed with severity "error" and none is inconclusive. */
  ok: z.boolean(),
  failures: z.number().int(),
  warnings: z.number().int(),
  /** Checks stopped by a time limit (reports stored before this count existed have none). */
  inconclusive: z.number().int().optional(),
  results: z.array(checkResultSchema),
  checked_at: z.string(),
});
export type ChecksReport = z.infer<typeof checksReportSchema>;
