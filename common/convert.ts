import { z } from "zod";

/**
 * Request and response shapes of the bound translator (POST /api/v1/convert and /convert/table).
 * The translate form validates with these same schemas, so a field the server refuses is a field
 * the form would have refused.
 */

/** Planck 2018 (TT,TE,EE+lowE+lensing+BAO): value from memory, to be confirmed against A&A 641, A6 Table 2. */
export const DEFAULT_COSMOLOGY = { H0: 67.66, Omega_m: 0.3111 } as const;

/** gIMR indices with a TaylorF2 term (k = -2 and 1 are absolute: phi_k = 0 in GR); "5l", "6l" are the log terms. */
export const GIMR_KS = [-2, 0, 1, 2, 3, 4, 5, "5l", 6, "6l", 7] as const;
export type GimrK = (typeof GIMR_KS)[number];

const finite = (what: string) =>
  z.number({ error: (issue) => (issue.input === undefined ? `${what} is required` : `${what} must be a number`) });

const credibility = finite("credibility").gt(0, "credibility must lie strictly between 0 and 1").lt(1, "credibility must lie strictly between 0 and 1");
const upper = finite("upper").positive("upper must be positive: it is the bound on |beta| or |dphi_k|");

/** Lowest frequency of the analysis band when the request does not say: 20 Hz is common practice for ground-based detectors. */
export const DEFAULT_F_LOW_HZ = 20;

export const signConventionSchema = z.enum(["plus", "minus"], { error: 'sign_convention must be "plus" (exp(+i Psi)) or "minus" (exp(-i Psi))' });
export type SignConvention = z.infer<typeof signConventionSchema>;

export const gimrKSchema = z.union([finite("k"), z.enum(["5l", "6l"])], { error: 'k must be a number or "5l" / "6l"' }).refine(
  (k) => (GIMR_KS as readonly (number | string)[]).includes(k),
  { message: `k must be one of ${GIMR_KS.join(", ")}` },
);

// ---------------------------------------------------------------------------------------------
// The bound model, shared by every route that takes a bound (and by later features).
//
// A bound on the signed deviation x (ppE beta, or gIMR dphi_k) is one of
//   { upper: U }            |x| <= U (the symmetric case [-U, U]);
//   { interval: [lo, hi] }  a signed credible interval, lo < hi; either end null for a one-sided bound;
// plus its credibility, the phase-sign convention it was stated in (ppE only) and the lowest
// frequency of the analysis band, f_low (Hz), which the validity conditions need.

/** One end of an interval: a number, or null for "unbounded on this side". */
const intervalEnd = z.number({ error: "each end of interval must be a number or null" }).nullable();
export const intervalSchema = z.tuple([intervalEnd, intervalEnd], { error: "interval must be [lo, hi], either end null for a one-sided bound" });
export type BoundInterval = z.infer<typeof intervalSchema>;

export const fLowSchema = finite("f_low").positive("f_low must be positive (Hz)").max(1e5, "f_low must be at most 1e5 Hz").default(DEFAULT_F_LOW_HZ);

/** The number fields of a bound: exactly one of upper and interval, the credibility and f_low. */
export const boundValueFields = {
  upper: upper.optional(),
  interval: intervalSchema.optional(),
  credibility,
  f_low: fLowSchema,
};

/** The message every route gives for an interval that excludes zero: GR itself is outside. */
export function grOutsideMessage(lo: number | null, hi: number | null): string {
  return `GR itself is outside the interval [${lo ?? "-inf"}, ${hi ?? "inf"}]: it excludes 0, so it reports a deviation rather than a bound, and nothing was translated`;
}

/**
 * The rules of the bound model, as zod issues at `path` (upper or interval). Shared with the
 * routes that carry a bound's numbers beside other fields (table rows, events).
 */
export function checkBoundValue(v: { upper?: number | undefined; interval?: BoundInterval | undefined }, ctx: z.RefinementCtx, path: (string | number)[] = []): void {
  if (v.upper !== undefined && v.interval !== undefined) {
    ctx.addIssue({ code: "custom", path: [...path, "interval"], message: "give either upper (|x| <= U) or interval ([lo, hi]), not both" });
    return;
  }
  if (v.upper === undefined && v.interval === undefined) {
    ctx.addIssue({ code: "custom", path: [...path, "upper"], message: "upper is required (or give interval: [lo, hi], either end null for a one-sided bound)" });
    return;
  }
  if (!v.interval) return;
  const [lo, hi] = v.interval;
  if (lo === null && hi === null) {
    ctx.addIssue({ code: "custom", path: [...path, "interval"], message: "a one-sided bound needs its finite side: give [lo, null] or [null, hi]" });
    return;
  }
  for (const [i, end] of [lo, hi].entries()) {
    if (end !== null && !Number.isFinite(end)) ctx.addIssue({ code: "custom", path: [...path, "interval", i], message: "each end of interval must be a finite number or null" });
  }
  if (lo !== null && hi !== null && !(lo < hi)) {
    ctx.addIssue({ code: "custom", path: [...path, "interval"], message: `interval must have lo < hi (got [${lo}, ${hi}])` });
    return;
  }
  if ((lo !== null && lo > 0) || (hi !== null && hi < 0)) {
    ctx.addIssue({ code: "custom", path: [...path, "interval"], message: grOutsideMessage(lo, hi) });
  }
}

/** The signed interval [lo, hi] a bound stands for ({ upper: U } is [-U, U]); null ends are unbounded. */
export function intervalOf(v: { upper?: number | undefined; interval?: BoundInterval | undefined }): BoundInterval {
  if (v.interval) return v.interval;
  if (v.upper === undefined) throw new RangeError("a bound needs upper or interval");
  return [-v.upper, v.upper];
}

/** "|β| ≤ 1e-3", "β ∈ [-2e-3, 1e-3]", "β ≥ -2e-3": how a bound reads. */
export function describeBound(v: { upper?: number | undefined; interval?: BoundInterval | undefined }, symbol: string): string {
  const fmt = (x: number) => Number(x.toPrecision(4)).toString();
  if (v.upper !== undefined) return `|${symbol}| ≤ ${fmt(v.upper)}`;
  const [lo, hi] = v.interval ?? [null, null];
  if (lo !== null && hi !== null) return `${symbol} ∈ [${fmt(lo)}, ${fmt(hi)}]`;
  if (lo !== null) return `${symbol} ≥ ${fmt(lo)}`;
  return `${symbol} ≤ ${fmt(hi ?? Number.NaN)}`;
}

export const ppeBoundSchema = z
  .strictObject({
    parameter: z.literal("ppe_beta"),
    b: finite("b"),
    ...boundValueFields,
    sign_convention: signConventionSchema.default("plus"),
  })
  .superRefine((v, ctx) => checkBoundValue(v, ctx));

export const gimrBoundSchema = z
  .strictObject({
    parameter: z.literal("gimr_dphi"),
    k: gimrKSchema,
    ...boundValueFields,
    /** Whether the analysis stretched the spin-including phi_k rather than the non-spinning one. */
    includes_spin: z.boolean().default(false),
  })
  .superRefine((v, ctx) => checkBoundValue(v, ctx));

/** A bound on the inspiral phase as every route takes it (exported for reuse: samples jobs, forecasts, sheets, events). */
export const boundSchema = z.discriminatedUnion("parameter", [ppeBoundSchema, gimrBoundSchema], {
  error: 'parameter must be "ppe_beta" or "gimr_dphi"',
});
export type BoundRequest = z.output<typeof boundSchema>;
export type BoundRequestInput = z.input<typeof boundSchema>;

// ---------------------------------------------------------------------------------------------
// Amplitude bounds (POST /convert only).
//
// ppe_alpha: the ppE amplitude correction h = h_GR (1 + alpha u^a) (Yunes & Pretorius 2009,
// arXiv:0909.3328), a bound on alpha at the exponent a, in the same bound model as beta. The
// exp(+/- i Psi) sign convention does not touch the amplitude, so there is no sign_convention.
//
// distance_ratio: the ratio d_L^GW / d_L^EM of the luminosity distance read from the wave's amplitude
// to the electromagnetic one of the same source (a counterpart or host galaxy), at the source's
// redshift z. GR gives 1, so the interval must contain 1; both ends are positive.

export const ppeAlphaBoundSchema = z
  .strictObject({
    parameter: z.literal("ppe_alpha"),
    a: finite("a"),
    ...boundValueFields,
  })
  .superRefine((v, ctx) => checkBoundValue(v, ctx));

/** GR's value of d_L^GW / d_L^EM. */
export const GR_DISTANCE_RATIO = 1;

export const distanceRatioBoundSchema = z
  .strictObject({
    parameter: z.literal("distance_ratio"),
    interval: intervalSchema,
    /** The source's redshift, at which the ratio was measured. */
    z: finite("z").positive("z must be positive: the ratio is measured at the source's redshift").max(20, "z must be at most 20"),
    credibility,
    f_low: fLowSchema,
  })
  .superRefine((v, ctx) => {
    const [lo, hi] = v.interval;
    if (lo === null && hi === null) {
      ctx.addIssue({ code: "custom", path: ["interval"], message: "a one-sided bound needs its finite side: give [lo, null] or [null, hi]" });
      return;
    }
    for (const [i, end] of [lo, hi].entries()) {
      if (end !== null && !(Number.isFinite(end) && end > 0)) {
        ctx.addIssue({ code: "custom", path: ["interval", i], message: "each end of a distance-ratio interval must be a positive number (d_L^GW / d_L^EM > 0) or null" });
        return;
      }
    }
    if (lo !== null && hi !== null && !(lo < hi)) {
      ctx.addIssue({ code: "custom", path: ["interval"], message: `interval must have lo < hi (got [${lo}, ${hi}])` });
      return;
    }
    if ((lo !== null && lo > GR_DISTANCE_RATIO) || (hi !== null && hi < GR_DISTANCE_RATIO)) {
      ctx.addIssue({
        code: "custom",
        path: ["interval"],
        message: `GR itself (d_L^GW / d_L^EM = 1) is outside the interval [${lo ?? 0}, ${hi ?? "inf"}]: it reports a deviation rather than a bound, and nothing was translated`,
      });
    }
  });

/**
 * The bound of POST /convert: a phase bound (ppe_beta, gimr_dphi) or an amplitude bound
 * (ppe_alpha, distance_ratio). Other routes take the phase bounds only (boundSchema).
 */
export const convertBoundSchema = z.discriminatedUnion("parameter", [ppeBoundSchema, gimrBoundSchema, ppeAlphaBoundSchema, distanceRatioBoundSchema], {
  error: 'parameter must be "ppe_beta", "gimr_dphi", "ppe_alpha" or "distance_ratio"',
});
export type ConvertBoundRequest = z.output<typeof convertBoundSchema>;
export type AmplitudeBoundRequest = z.output<typeof ppeAlphaBoundSchema> | z.output<typeof distanceRatioBoundSchema>;

/** Which part of the waveform a bound constrains. */
export const CHANNELS = ["phase", "amplitude", "distance_ratio"] as const;
export const channelSchema = z.enum(CHANNELS);
export type Channel = z.infer<typeof channelSchema>;

export function channelOf(bound: { parameter: ConvertBoundRequest["parameter"] }): Channel {
  return bound.parameter === "ppe_alpha" ? "amplitude" : bound.parameter === "distance_ratio" ? "distance_ratio" : "phase";
}

/** True for the phase bounds that the other routes (tables, events, sheets) also take. */
export function isPhaseBound(bound: ConvertBoundRequest): bound is BoundRequest {
  return bound.parameter === "ppe_beta" || bound.parameter === "gimr_dphi";
}

export const bodyKindSchema = z.enum(["bh", "ns"], { error: 'each body must be "bh" or "ns"' });

const spin = (what: string) =>
  finite(what).gt(-1, `|${what}| must be below 1`).lt(1, `|${what}| must be below 1`).default(0);
const mass = (what: string) => finite(what).positive(`${what} must be positive (solar masses)`);

/** A body's scalar sensitivity: 0 (no scalar charge) to 1/2 (a black hole). */
const sensitivity = finite("scalar sensitivity").min(0, "scalar sensitivity must lie in [0, 0.5]").max(0.5, "scalar sensitivity must lie in [0, 0.5] (a black hole has 1/2)");

export const binarySchema = z
  .strictObject({
    m1: mass("m1"),
    m2: mass("m2"),
    chi1: spin("chi1"),
    chi2: spin("chi2"),
    bodies: z.tuple([bodyKindSchema, bodyKindSchema]).default(["bh", "bh"]),
    frame: z.enum(["source", "detector"], { error: 'frame must be "source" or "detector"' }),
    z: finite("z").min(0, "z must be >= 0").optional(),
    /** Scalar-tensor sensitivities, same order as m1, m2; a black hole's is 1/2 when left out. */
    scalar_sensitivities: z
      .tuple([sensitivity.nullable(), sensitivity.nullable()])
      .optional(),
  })
  .superRefine((b, ctx) => {
    if (b.frame === "detector" && b.z === undefined) {
      ctx.addIssue({ code: "custom", path: ["z"], message: "detector-frame masses need the redshift z" });
    }
  });
export type BinaryRequest = z.output<typeof binarySchema>;

export const cosmologySchema = z.strictObject({
  H0: finite("H0").positive("H0 must be positive (km/s/Mpc)").default(DEFAULT_COSMOLOGY.H0),
  Omega_m: finite("Omega_m").min(0, "Omega_m must lie in [0, 1]").max(1, "Omega_m must lie in [0, 1]").default(DEFAULT_COSMOLOGY.Omega_m),
});
export type CosmologyRequest = z.output<typeof cosmologySchema>;

export const theorySlugSchema = z.string().regex(/^[a-z0-9][a-z0-9-]{0,63}$/, "name a catalogue entry by its short name, as in its address: lower-case letters, digits and dashes (edgb, massive-graviton)");

export const convertRequestSchema = z.strictObject({
  bound: convertBoundSchema,
  binary: binarySchema,
  cosmology: cosmologySchema.optional(),
  theories: z.array(theorySlugSchema).min(1, "theories, when given, must name at least one theory").max(100).optional(),
  /** Per theory slug: the stored convention to quote the limit in. */
  conventions: z.record(theorySlugSchema, z.string().min(1).max(80)).optional(),
});
export type ConvertRequest = z.output<typeof convertRequestSchema>;
export type ConvertRequestInput = z.input<typeof convertRequestSchema>;
/** A /convert request with a phase bound: what sheets, tables and events take. */
export type PhaseConvertRequest = Omit<ConvertRequest, "bound"> & { bound: BoundRequest };

// ---------------------------------------------------------------------------------------------
// Answers

export const sideSchema = z.enum(["upper", "lower"]);

export const quotedValueSchema = z.object({
  symbol: z.string(),
  latex: z.string(),
  value: z.number(),
  unit: z.string(),
  side: sideSchema,
});
export type QuotedValueDto = z.infer<typeof quotedValueSchema>;

/** How one condition fares at the limit: holds, fails by at most the stretch factor (rule of thumb only), or fails. */
export const validityStatusSchema = z.enum(["ok", "stretched", "fails"]);

export const validityItemSchema = z.object({
  label: z.string(),
  condition: z.string(),
  value: z.number().nullable(),
  max: z.number(),
  ok: z.boolean(),
  kind: z.enum(["hard", "rule_of_thumb"]),
  /** value / max: how many times the condition's threshold is exceeded (null when not a number). */
  factor: z.number().nullable().default(null),
  status: validityStatusSchema.default("ok"),
  reference: z.string().optional(),
});

/**
 * valid: every condition holds at the limit (a rule of thumb exceeded by at most the stretch factor
 * counts as holding, with a caution); outside_validity: a hard condition fails, or a rule of thumb
 * fails by more than the stretch factor; not_assessed: the entry states no condition for this binary.
 */
export const VERDICTS = ["valid", "outside_validity", "not_assessed"] as const;
export const verdictSchema = z.enum(VERDICTS);
export type Verdict = z.infer<typeof verdictSchema>;

/** A rule of thumb failing by more than this factor puts the limit outside validity (project choice). */
export const RULE_OF_THUMB_STRETCH = 10;

export const failingConditionSchema = z.object({
  label: z.string(),
  condition: z.string(),
  value: z.number().nullable(),
  max: z.number(),
  factor: z.number().nullable(),
  kind: z.enum(["hard", "rule_of_thumb"]),
});

export const cautionCodeSchema = z.enum([
  "validity",
  "leading_pn",
  "prior",
  "spin_terms",
  "log_term",
  "one_signed",
  "sign_convention",
  "frame",
  "source_status",
  "engine",
  "couplings",
  "orders",
  "signed_interval",
  "amplitude",
  "remnant",
]);
export type CautionCode = z.infer<typeof cautionCodeSchema>;

export const cautionSchema = z.object({ code: cautionCodeSchema, message: z.string() });
export type Caution = z.infer<typeof cautionSchema>;

export const citedReferenceSchema = z.object({ key: z.string(), citation: z.string() });

/** Full details of a reference a translation used, so a saved sheet can export BibTeX on its own. */
export const bibliographyEntrySchema = z.object({
  key: z.string(),
  authors: z.array(z.string()),
  title: z.string(),
  year: z.number().int(),
  journal: z.string().nullable(),
  volume: z.string().nullable(),
  pages: z.string().nullable(),
  arxiv: z.string().nullable(),
  doi: z.string().nullable(),
});
export type BibliographyEntry = z.infer<typeof bibliographyEntrySchema>;

export const referenceComparisonSchema = z.object({
  symbol: z.string(),
  value: z.number(),
  unit: z.string(),
  side: sideSchema,
  convention: z.string().nullable(),
  credibility: z.number().nullable(),
  reference: citedReferenceSchema,
  note: z.string().nullable(),
  /** How many times tighter (>1) or weaker (<1) this translation is, when both are in the same symbol and unit. */
  ratio: z.number().nullable(),
  /** not_compared: our limit is not valid, so no comparison is made (the published bound is listed for reference). */
  verdict: z.enum(["tighter", "weaker", "equal", "incomparable", "not_compared"]),
  sentence: z.string(),
});
export type ReferenceComparison = z.infer<typeof referenceComparisonSchema>;

export const convertResultSchema = z.object({
  theory: z.string(),
  theory_name: z.string(),
  convention: z.string(),
  conventions_available: z.array(z.string()),
  coupling: quotedValueSchema,
  /** The same limit in the units practitioners also quote (m_g in eV beside lambda_g). */
  also: z.array(quotedValueSchema),
  /** The limit on the coupling the mapping takes, in its canonical geometric unit. */
  canonical: z.object({ symbol: z.string(), latex: z.string(), value: z.number(), unit: z.string() }),
  /** Which coupling of the entry this row bounds (an entry with several couplings gives one row each). */
  coupling_symbol: z.string().default(""),
  /** phase: b, beta_max and beta_interval are the phase bound; amplitude: they hold a, |alpha| and the alpha interval; distance_ratio: b is 0 and they hold d_L^GW/d_L^EM - 1. */
  channel: channelSchema.default("phase"),
  b: z.number(),
  beta_max: z.number(),
  /** The bound as stated, in the exp(+i Psi) convention: [lo, hi] (null = unbounded side). */
  beta_interval: z.tuple([z.number().nullable(), z.number().nullable()]).default([null, null]),
  /** Sign of beta the theory predicts for this binary over the coupling's physical range. */
  theory_sign: z.enum(["negative", "positive", "either"]).default("either"),
  /** Which end of the interval bounded the coupling: lower (lo), upper (hi) or both. */
  side_used: z.enum(["lower", "upper", "both"]).default("both"),
  /** For a coupling of either sign: the interval on the signed quantity (null end = unbounded). */
  signed_interval: z
    .object({ symbol: z.string(), latex: z.string(), unit: z.string(), lower: z.number().nullable(), upper: z.number().nullable() })
    .nullable()
    .default(null),
  method: z.enum(["closed_form", "numeric_root"]),
  verdict: verdictSchema.default("not_assessed"),
  /** The condition that fails worst at the limit, when the verdict is outside_validity. */
  failing: failingConditionSchema.nullable().default(null),
  /** Alias of verdict === "valid". */
  valid: z.boolean(),
  validity: z.array(validityItemSchema),
  closed_form_latex: z.string(),
  mapping_latex: z.string().nullable(),
  reference_bounds: z.array(referenceComparisonSchema),
  references: z.array(citedReferenceSchema),
  cautions: z.array(cautionSchema),
});
export type ConvertResult = z.infer<typeof convertResultSchema>;

export const notApplicableCodeSchema = z.enum([
  "different_b",
  "vanishing_mapping",
  "needs_distance",
  "needs_input",
  "degenerate_b",
  "no_ppe_equivalent",
  "coupling_independent",
  "out_of_range",
  "interval_excludes_gr",
  "evaluation_failed",
  "unreachable_side",
  "bodies_not_covered",
  "different_a",
  "different_channel",
]);

export const notApplicableSchema = z.object({
  theory: z.string(),
  theory_name: z.string(),
  code: notApplicableCodeSchema,
  reason: z.string(),
  /** The b values at which this theory's mappings enter. */
  b: z.array(z.number()),
});
export type NotApplicable = z.infer<typeof notApplicableSchema>;

export const convertResponseSchema = z.object({
  /** The bound as translated: b, and |beta| <= beta_max in the exp(+i Psi) convention. */
  bound: z.object({
    /** Which part of the waveform the bound constrains; for amplitude and distance_ratio, b and beta_* are null and the fields below say what was translated. */
    channel: channelSchema.default("phase"),
    b: z.number().nullable(),
    beta_max: z.number().nullable(),
    /** The bound in the exp(+i Psi) convention, as [lo, hi] on beta (null = unbounded side). */
    beta_interval: z.tuple([z.number().nullable(), z.number().nullable()]).default([null, null]),
    credibility: z.number(),
    f_low: z.number().default(DEFAULT_F_LOW_HZ),
    /** Amplitude: the exponent a of alpha u^a. */
    a: z.number().nullable().default(null),
    /** Amplitude: the bound on alpha as [lo, hi]; distance_ratio: on d_L^GW/d_L^EM - 1 (null = unbounded side). */
    deviation_interval: z.tuple([z.number().nullable(), z.number().nullable()]).nullable().default(null),
    /** distance_ratio: the source's redshift. */
    z: z.number().nullable().default(null),
  }),
  cosmology: z.object({ H0: z.number(), Omega_m: z.number() }),
  catalogue_revision: z.string(),
  results: z.array(convertResultSchema),
  not_applicable: z.array(notApplicableSchema),
  /** Cautions about the bound itself, before any theory (log-term k, degenerate b, sign flips). */
  cautions: z.array(cautionSchema),
  /** Every reference cited by the results, by key. */
  bibliography: z.array(bibliographyEntrySchema),
});
export type ConvertResponse = z.infer<typeof convertResponseSchema>;

// ---------------------------------------------------------------------------------------------
// Table over b

export const tableRowSchema = z
  .strictObject({
    b: finite("b").optional(),
    k: gimrKSchema.optional(),
    upper: upper.optional(),
    interval: intervalSchema.optional(),
    label: z.string().max(200).optional(),
  })
  .superRefine((r, ctx) => {
    if ((r.b === undefined) === (r.k === undefined)) {
      ctx.addIssue({ code: "custom", path: [r.b === undefined ? "b" : "k"], message: "give exactly one of b and k per row" });
    }
    checkBoundValue(r, ctx);
  });
export type TableRow = z.output<typeof tableRowSchema>;

export const MAX_TABLE_ROWS = 200;

export const convertTableRequestSchema = z.strictObject({
  rows: z.array(tableRowSchema).min(1, "rows must hold at least one row").max(MAX_TABLE_ROWS, `at most ${MAX_TABLE_ROWS} rows`),
  binary: binarySchema,
  cosmology: cosmologySchema.optional(),
  credibility,
  f_low: fLowSchema,
  sign_convention: signConventionSchema.default("plus"),
  includes_spin: z.boolean().default(false),
  theories: z.array(theorySlugSchema).min(1).max(100).optional(),
});
export type ConvertTableRequest = z.output<typeof convertTableRequestSchema>;
export type ConvertTableRequestInput = z.input<typeof convertTableRequestSchema>;

export const convertTableResponseSchema = z.object({
  catalogue_revision: z.string(),
  cosmology: z.object({ H0: z.number(), Omega_m: z.number() }),
  rows: z.array(
    z.object({
      index: z.number().int(),
      label: z.string().nullable(),
      input: z.object({
        b: z.number().nullable(),
        k: z.union([z.number(), z.string()]).nullable(),
        upper: z.number().nullable(),
        interval: z.tuple([z.number().nullable(), z.number().nullable()]).nullable().default(null),
      }),
      b: z.number().nullable(),
      beta_max: z.number().nullable(),
      results: z.array(convertResultSchema),
      not_applicable: z.array(notApplicableSchema),
      cautions: z.array(cautionSchema),
    }),
  ),
});
export type ConvertTableResponse = z.infer<typeof convertTableResponseSchema>;

/** The b a bound enters at, or null for the gIMR log terms (no single-b ppE equivalent). */
export function bOfBound(bound: { parameter: "ppe_beta"; b: number } | { parameter: "gimr_dphi"; k: GimrK | number | string }): number | null {
  if (bound.parameter === "ppe_beta") return bound.b;
  return typeof bound.k === "number" ? bound.k - 5 : null;
}
