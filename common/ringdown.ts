import { z } from "zod";
import {
  bibliographyEntrySchema,
  cautionSchema,
  citedReferenceSchema,
  quotedValueSchema,
  referenceComparisonSchema,
  checkBoundValue,
  convertRequestSchema,
  convertResponseSchema,
  failingConditionSchema,
  intervalSchema,
  validityItemSchema,
  verdictSchema,
} from "./convert.ts";

/**
 * Ringdown-only bounds (POST /api/v1/convert/ringdown): a bound on the fractional shift of one
 * quasinormal mode's frequency or damping time, with the remnant it was measured on (or the binary,
 * pushed through the remnant fits), translated through the catalogue's ringdown mappings.
 */

const num = (what: string) => z.number({ error: (i) => (i.input === undefined ? `${what} is required` : `${what} must be a number`) });

export const QNM_MODE_KEYS = ["220", "221", "330", "210", "440"] as const;
export const RINGDOWN_PARAMETERS = ["qnm_dfreq", "qnm_dtau"] as const;
export type RingdownParameter = (typeof RINGDOWN_PARAMETERS)[number];

/** Same bound model as the translator (common/convert.ts): exactly one of upper or a signed interval, either end null for one side. */
export const qnmBoundSchema = z
  .strictObject({
    parameter: z.enum(RINGDOWN_PARAMETERS, { error: 'parameter must be "qnm_dfreq" or "qnm_dtau"' }),
    mode: z.enum(QNM_MODE_KEYS, { error: `mode must be one of ${QNM_MODE_KEYS.join(", ")}` }).default("220"),
    /** Bound on |shift|. */
    upper: num("upper").positive("upper must be positive: it bounds |shift|").optional(),
    /** Credible interval [lo, hi] on the signed shift; either end null for a one-sided bound. */
    interval: intervalSchema.optional(),
    credibility: num("credibility").gt(0, "credibility must lie strictly between 0 and 1").lt(1, "credibility must lie strictly between 0 and 1"),
  })
  .superRefine((b, ctx) => checkBoundValue(b, ctx));

const frame = z.enum(["detector", "source"], { error: 'frame must be "detector" or "source"' });
const z_ = num("z").min(0, "z must be >= 0").optional();

export const remnantInputSchema = z.strictObject({
  M_f: num("M_f").positive("M_f must be positive (solar masses)"),
  chi_f: num("chi_f").min(0, "chi_f must be >= 0 (the fits describe modes co-rotating with the remnant)").lt(1, "chi_f must be below 1 (a Kerr black hole)"),
  frame,
  z: z_,
});

export const ringdownBinarySchema = z.strictObject({
  m1: num("m1").positive("m1 must be positive (solar masses)"),
  m2: num("m2").positive("m2 must be positive (solar masses)"),
  chi1: num("chi1").gt(-1, "|chi1| must be below 1").lt(1, "|chi1| must be below 1").default(0),
  chi2: num("chi2").gt(-1, "|chi2| must be below 1").lt(1, "|chi2| must be below 1").default(0),
  frame,
  z: z_,
});

export const ringdownConvertRequestSchema = z
  .strictObject({
    bound: qnmBoundSchema,
    remnant: remnantInputSchema.optional(),
    binary: ringdownBinarySchema.optional(),
    /** Slugs to translate for; default: every entry with a ringdown mapping of this kind and mode. */
    theories: z.array(z.string().max(64)).max(50).optional(),
  })
  .superRefine((r, ctx) => {
    if ((r.remnant === undefined) === (r.binary === undefined)) {
      ctx.addIssue({ code: "custom", path: ["remnant"], message: "give exactly one of remnant (M_f, chi_f) or binary (pushed through the remnant fits)" });
    }
    for (const [k, v] of [["remnant", r.remnant], ["binary", r.binary]] as const) {
      if (v && v.frame === "detector" && v.z === undefined) ctx.addIssue({ code: "custom", path: [k, "z"], message: "detector-frame masses need the redshift z" });
    }
  });
export type RingdownConvertRequest = z.output<typeof ringdownConvertRequestSchema>;
export type RingdownConvertRequestInput = z.input<typeof ringdownConvertRequestSchema>;

/** A condition the engine could not evaluate at the limit (it needs the binary, or has no finite value there). */
const unassessedSchema = z.object({ label: z.string(), condition: z.string(), reason: z.string() });

/**
 * One side's limit, judged by the translator's verdict rule (common/convert.ts): each condition ok,
 * stretched (a rule of thumb exceeded by at most RULE_OF_THUMB_STRETCH, kept as valid with a caution)
 * or failing; the worst failure named.
 */
const sideLimitSchema = z.object({
  value: z.number(),
  shift: z.number(),
  verdict: verdictSchema,
  failing: failingConditionSchema.nullable(),
  validity: z.array(validityItemSchema),
  unassessed: z.array(unassessedSchema),
});
export type RingdownSideLimit = z.infer<typeof sideLimitSchema>;

export const ringdownResultSchema = z.object({
  slug: z.string(),
  name: z.string(),
  revision: z.number().int(),
  status: z.enum(["bounded", "no_constraint", "not_applicable"]),
  reason: z.string().optional(),
  coupling: z.object({ symbol: z.string(), latex: z.string(), unit: z.string() }).optional(),
  mapping: z.object({ kind: z.string(), mode: z.string(), expression: z.string(), latex: z.string().optional(), source_status: z.string() }).optional(),
  /** Limit on the negative side (x >= lower) and on the positive side (x <= upper). */
  lower: sideLimitSchema.nullable(),
  upper: sideLimitSchema.nullable(),
  unconstrained: z.array(z.object({ side: z.enum(["negative", "positive"]), reason: z.string() })),
  verdict: verdictSchema,
  /**
   * The limit on the coupling's magnitude in the unit the literature quotes (sqrt(alpha) in km): the
   * positive side of a coupling that cannot be negative, or max(|lower|, |upper|) when both sides are
   * limited. Null for a signed end alone or when there is no limit.
   */
  limit: quotedValueSchema.nullable().default(null),
  /** The entry's published bounds on this coupling, compared with the limit (only a valid limit on the magnitude is compared). */
  reference_bounds: z.array(referenceComparisonSchema).default([]),
  /** The sources of the mapping used and of the published bounds. */
  references: z.array(citedReferenceSchema).default([]),
  cautions: z.array(cautionSchema),
});
export type RingdownResult = z.infer<typeof ringdownResultSchema>;

export const ringdownConvertResponseSchema = z.object({
  /** Tells a ringdown answer of POST /convert from an inspiral one. */
  kind: z.literal("ringdown"),
  bound: z.object({ parameter: z.enum(RINGDOWN_PARAMETERS), mode: z.enum(QNM_MODE_KEYS), interval: z.tuple([z.number().nullable(), z.number().nullable()]), credibility: z.number() }),
  remnant: z.object({
    /** Source-frame remnant mass (solar masses) and spin used for the mappings. */
    M_f_source: z.number(),
    chi_f: z.number(),
    from: z.enum(["given", "fit"]),
    z: z.number().optional(),
    /** With a binary: the second spin fit and the spread between the two. */
    chi_f_alternative: z.number().optional(),
    chi_f_fit_spread: z.number().optional(),
  }),
  /** The Kerr mode at that remnant (detector frame when z is known, else source frame). */
  qnm: z.object({ mode: z.string(), frequency_hz: z.number(), damping_time_s: z.number(), frame: z.enum(["detector", "source"]) }),
  /** The catalogue version translated against (the same token as an inspiral answer's). */
  catalogue_revision: z.string().default(""),
  results: z.array(ringdownResultSchema),
  cautions: z.array(cautionSchema),
  /** Every reference the results cite, with full details (BibTeX exports of a saved record need nothing else). */
  bibliography: z.array(bibliographyEntrySchema).default([]),
});
export type RingdownConvertResponse = z.infer<typeof ringdownConvertResponseSchema>;

/**
 * POST /api/v1/convert takes either bound family: an inspiral bound (ppE, gIMR, ...) with a binary,
 * or a ringdown bound (qnm_dfreq, qnm_dtau) with a remnant or a binary. The route picks the schema
 * by bound.parameter, so each family's 400 names its own fields.
 */
export const convertAnyRequestSchema = z.union([convertRequestSchema, ringdownConvertRequestSchema]);
export const convertAnyResponseSchema = z.union([convertResponseSchema, ringdownConvertResponseSchema]);

export function isRingdownBody(body: unknown): boolean {
  if (typeof body !== "object" || body === null) return false;
  const bound = (body as { bound?: unknown }).bound;
  if (typeof bound !== "object" || bound === null) return false;
  const parameter = (bound as { parameter?: unknown }).parameter;
  return typeof parameter === "string" && (RINGDOWN_PARAMETERS as readonly string[]).includes(parameter);
}
