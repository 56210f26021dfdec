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

export const signConventionSchema = z.enum(["plus", "minus"], { error: 'sign_convention must be "plus" (exp(+i Psi)) or "minus" (exp(-i Psi))' });
export type SignConvention = z.infer<typeof signConventionSchema>;

export const gimrKSchema = z.union([finite("k"), z.enum(["5l", "6l"])], { error: 'k must be a number or "5l" / "6l"' }).refine(
  (k) => (GIMR_KS as readonly (number | string)[]).includes(k),
  { message: `k must be one of ${GIMR_KS.join(", ")}` },
);

export const ppeBoundSchema = z.object({
  parameter: z.literal("ppe_beta"),
  b: finite("b"),
  upper,
  credibility,
  sign_convention: signConventionSchema.default("plus"),
});

export const gimrBoundSchema = z.object({
  parameter: z.literal("gimr_dphi"),
  k: gimrKSchema,
  upper,
  credibility,
  /** Whether the analysis stretched the spin-including phi_k rather than the non-spinning one. */
  includes_spin: z.boolean().default(false),
});

export const boundSchema = z.discriminatedUnion("parameter", [ppeBoundSchema, gimrBoundSchema], {
  error: 'parameter must be "ppe_beta" or "gimr_dphi"',
});
export type BoundRequest = z.output<typeof boundSchema>;

export const bodyKindSchema = z.enum(["bh", "ns"], { error: 'each body must be "bh" or "ns"' });

const spin = (what: string) =>
  finite(what).gt(-1, `|${what}| must be below 1`).lt(1, `|${what}| must be below 1`).default(0);
const mass = (what: string) => finite(what).positive(`${what} must be positive (solar masses)`);

/** A body's scalar sensitivity: 0 (no scalar charge) to 1/2 (a black hole). */
const sensitivity = finite("scalar sensitivity").min(0, "scalar sensitivity must lie in [0, 0.5]").max(0.5, "scalar sensitivity must lie in [0, 0.5] (a black hole has 1/2)");

export const binarySchema = z
  .object({
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

export const cosmologySchema = z.object({
  H0: finite("H0").positive("H0 must be positive (km/s/Mpc)").default(DEFAULT_COSMOLOGY.H0),
  Omega_m: finite("Omega_m").min(0, "Omega_m must lie in [0, 1]").max(1, "Omega_m must lie in [0, 1]").default(DEFAULT_COSMOLOGY.Omega_m),
});
export type CosmologyRequest = z.output<typeof cosmologySchema>;

export const theorySlugSchema = z.string().regex(/^[a-z0-9][a-z0-9-]{0,63}$/, "name a catalogue entry by its short name, as in its address: lower-case letters, digits and dashes (edgb, massive-graviton)");

export const convertRequestSchema = z.object({
  bound: boundSchema,
  binary: binarySchema,
  cosmology: cosmologySchema.optional(),
  theories: z.array(theorySlugSchema).min(1, "theories, when given, must name at least one theory").max(100).optional(),
  /** Per theory slug: the stored convention to quote the limit in. */
  conventions: z.record(theorySlugSchema, z.string().min(1).max(80)).optional(),
});
export type ConvertRequest = z.output<typeof convertRequestSchema>;
export type ConvertRequestInput = z.input<typeof convertRequestSchema>;

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

export const validityItemSchema = z.object({
  label: z.string(),
  condition: z.string(),
  value: z.number().nullable(),
  max: z.number(),
  ok: z.boolean(),
  kind: z.enum(["hard", "rule_of_thumb"]),
  reference: z.string().optional(),
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
  verdict: z.enum(["tighter", "weaker", "equal", "incomparable"]),
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
  b: z.number(),
  beta_max: z.number(),
  method: z.enum(["closed_form", "numeric_root"]),
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
  bound: z.object({ b: z.number().nullable(), beta_max: z.number().nullable(), credibility: z.number() }),
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
  .object({
    b: finite("b").optional(),
    k: gimrKSchema.optional(),
    upper,
    label: z.string().max(200).optional(),
  })
  .superRefine((r, ctx) => {
    if ((r.b === undefined) === (r.k === undefined)) {
      ctx.addIssue({ code: "custom", path: [r.b === undefined ? "b" : "k"], message: "give exactly one of b and k per row" });
    }
  });
export type TableRow = z.output<typeof tableRowSchema>;

export const MAX_TABLE_ROWS = 200;

export const convertTableRequestSchema = z.object({
  rows: z.array(tableRowSchema).min(1, "rows must hold at least one row").max(MAX_TABLE_ROWS, `at most ${MAX_TABLE_ROWS} rows`),
  binary: binarySchema,
  cosmology: cosmologySchema.optional(),
  credibility,
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
      input: z.object({ b: z.number().nullable(), k: z.union([z.number(), z.string()]).nullable(), upper: z.number() }),
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
