import { z } from "zod";
import {
  binarySchema,
  bodyKindSchema,
  cautionSchema,
  channelSchema,
  checkBoundValue,
  citedReferenceSchema,
  cosmologySchema,
  fLowSchema,
  gimrKSchema,
  intervalSchema,
  signConventionSchema,
  theorySlugSchema,
  verdictSchema,
} from "./convert.ts";

/**
 * Request and response shapes of POST /api/v1/convert/samples (a posterior, sample by sample) and
 * POST /api/v1/convert/events (several events, one theory, combined at the coupling level).
 * The translate page's panels validate with these same schemas.
 */

/**
 * The in-request route is for small posteriors: it runs on the web process. Larger files go to the
 * posterior-file jobs (POST /api/v1/jobs/samples), which a worker process translates.
 */
export const MAX_SAMPLES = 20_000;
export const MAX_EVENTS = 50;
export const HISTOGRAM_BINS = 40;

const finiteNumber = (what: string) =>
  z.number({ error: (issue) => (issue.input === undefined ? `${what} is required` : `${what} must be a number`) });
const credibility = finiteNumber("credibility").gt(0, "credibility must lie strictly between 0 and 1").lt(1, "credibility must lie strictly between 0 and 1");

export const SAMPLE_COLUMNS = ["beta", "m1", "m2", "chi1", "chi2", "z"] as const;
export type SampleColumn = (typeof SAMPLE_COLUMNS)[number];

// Columns are checked row by row in one pass (not one zod issue per cell): a 200 000-row column with
// a bad cell answers with the column and its first bad row, e.g. fields["columns.m1.1532"].
const column = z.array(z.unknown()).max(MAX_SAMPLES, `at most ${MAX_SAMPLES} samples in one request; send larger posteriors as a file to the background jobs (POST /api/v1/jobs/samples)`);

/** Which coupling of the entry, when it has several at the bound's b (Johannsen's eps3 and alpha13). */
const couplingChoice = z.string().regex(/^[A-Za-z][A-Za-z0-9_]*$/, "coupling must be a coupling symbol of the entry").max(40).optional();

export const samplesRequestSchema = z
  .strictObject({
    theory: theorySlugSchema,
    coupling: couplingChoice,
    parameter: z.enum(["ppe_beta", "gimr_dphi"], { error: 'parameter must be "ppe_beta" or "gimr_dphi"' }),
    b: finiteNumber("b").optional(),
    k: gimrKSchema.optional(),
    credibility,
    sign_convention: signConventionSchema.default("plus"),
    includes_spin: z.boolean().default(false),
    f_low: fLowSchema,
    columns: z.strictObject({
      beta: column,
      m1: column,
      m2: column,
      chi1: column.optional(),
      chi2: column.optional(),
      z: column.optional(),
    }),
    bodies: z.tuple([bodyKindSchema, bodyKindSchema]).default(["bh", "bh"]),
    frame: z.enum(["source", "detector"], { error: 'frame must be "source" or "detector"' }),
    cosmology: cosmologySchema.optional(),
  })
  .superRefine((r, ctx) => {
    if (r.parameter === "ppe_beta" && r.b === undefined) ctx.addIssue({ code: "custom", path: ["b"], message: "a ppe_beta posterior needs b" });
    if (r.parameter === "gimr_dphi" && r.k === undefined) ctx.addIssue({ code: "custom", path: ["k"], message: "a gimr_dphi posterior needs k" });
    const n = r.columns.beta.length;
    if (n === 0) ctx.addIssue({ code: "custom", path: ["columns", "beta"], message: "the beta column holds no samples" });
    for (const name of SAMPLE_COLUMNS) {
      const col = r.columns[name];
      if (!col) continue;
      if (col.length !== n) {
        ctx.addIssue({ code: "custom", path: ["columns", name], message: `column ${name} has ${col.length} samples, beta has ${n}: all columns must be the same length` });
        continue;
      }
      const bad = col.findIndex((v) => typeof v !== "number" || !Number.isFinite(v));
      if (bad >= 0) ctx.addIssue({ code: "custom", path: ["columns", name, bad], message: `column ${name}, row ${bad}: ${JSON.stringify(col[bad]) ?? "nothing"} is not a finite number` });
    }
    if (r.frame === "detector" && !r.columns.z) ctx.addIssue({ code: "custom", path: ["columns", "z"], message: "detector-frame masses need a z column" });
  });
export type SamplesRequest = z.output<typeof samplesRequestSchema>;
export type SamplesRequestInput = z.input<typeof samplesRequestSchema>;

const quantity = z.object({ symbol: z.string(), latex: z.string(), unit: z.string() });

export const samplesResponseSchema = z.object({
  theory: z.string(),
  theory_name: z.string(),
  b: z.number(),
  credibility: z.number(),
  /** What the numbers mean, in one sentence (shown with the result). */
  meaning: z.string(),
  coupling: quantity.extend({ value: z.number(), side: z.enum(["upper", "lower"]) }),
  /** The power p in beta = K x^p of the canonical coupling. */
  power: z.number(),
  samples: z.object({ total: z.number().int(), used: z.number().int(), dropped: z.number().int(), dropped_reasons: z.array(z.object({ reason: z.string(), count: z.number().int() })) }),
  validity: z.array(z.object({ label: z.string(), condition: z.string(), kind: z.enum(["hard", "rule_of_thumb"]), fraction_ok: z.number(), evaluated: z.number().int() })),
  /** Log-spaced bins of the per-sample coupling, in the quoted unit. */
  histogram: z.object({ edges: z.array(z.number()), counts: z.array(z.number().int()) }),
  cautions: z.array(cautionSchema),
  references: z.array(citedReferenceSchema),
});
export type SamplesResponse = z.infer<typeof samplesResponseSchema>;

// ---------------------------------------------------------------------------------------------
// Several events

export const eventSchema = z
  .strictObject({
    label: z.string().trim().min(1, "each event needs a label").max(80),
    binary: binarySchema,
    /** |beta| <= upper, or a signed interval [lo, hi] (either end null for a one-sided bound). */
    upper: finiteNumber("upper").positive("upper must be positive: it is the bound on |beta| or |dphi_k|").optional(),
    interval: intervalSchema.optional(),
  })
  .superRefine((e, ctx) => checkBoundValue(e, ctx));

export const eventsRequestSchema = z
  .strictObject({
    theory: theorySlugSchema,
    coupling: couplingChoice,
    /** ppe_alpha: each event's bound is on the ppE amplitude alpha at the exponent a. */
    parameter: z.enum(["ppe_beta", "gimr_dphi", "ppe_alpha"], { error: 'parameter must be "ppe_beta", "gimr_dphi" or "ppe_alpha"' }),
    b: finiteNumber("b").optional(),
    k: gimrKSchema.optional(),
    a: finiteNumber("a").optional(),
    credibility,
    f_low: fLowSchema,
    sign_convention: signConventionSchema.default("plus"),
    includes_spin: z.boolean().default(false),
    events: z.array(eventSchema).min(1, "events must hold at least one event").max(MAX_EVENTS, `at most ${MAX_EVENTS} events`),
    cosmology: cosmologySchema.optional(),
  })
  .superRefine((r, ctx) => {
    if (r.parameter === "ppe_beta" && r.b === undefined) ctx.addIssue({ code: "custom", path: ["b"], message: "a ppe_beta bound needs b" });
    if (r.parameter === "gimr_dphi" && r.k === undefined) ctx.addIssue({ code: "custom", path: ["k"], message: "a gimr_dphi bound needs k" });
    if (r.parameter === "ppe_alpha" && r.a === undefined) ctx.addIssue({ code: "custom", path: ["a"], message: "a ppe_alpha bound needs a" });
  });
export type EventsRequest = z.output<typeof eventsRequestSchema>;
export type EventsRequestInput = z.input<typeof eventsRequestSchema>;

export const eventsResponseSchema = z.object({
  theory: z.string(),
  theory_name: z.string(),
  /** phase: b is the phase exponent; amplitude: b holds the amplitude exponent a and beta_max is |alpha|. */
  channel: channelSchema.default("phase"),
  b: z.number(),
  credibility: z.number(),
  coupling: quantity.extend({ side: z.enum(["upper", "lower"]) }),
  /** Null when no event gives a power-law limit. */
  power: z.number().nullable(),
  events: z.array(
    z.object({
      label: z.string(),
      /** Applicable: the event's own limit as /convert gives it; otherwise why not. */
      limit: z.number().nullable(),
      valid: z.boolean().nullable(),
      verdict: verdictSchema.nullable().default(null),
      /** Whether this event entered the combined limit. */
      combined: z.boolean().default(false),
      beta_max: z.number().nullable(),
      /** K_i in beta = K_i x^p for this event's binary (canonical coupling). */
      prefactor: z.number().nullable(),
      reason: z.string().nullable(),
    }),
  ),
  /** The tightest single event for the side: the smallest upper limit, or the largest lower limit. */
  tightest: z.object({ label: z.string(), limit: z.number() }).nullable(),
  combined: z.object({ limit: z.number(), events_used: z.number().int(), rule: z.string() }).nullable(),
  cautions: z.array(cautionSchema),
});
export type EventsResponse = z.infer<typeof eventsResponseSchema>;

/** The b of a samples or events request (gIMR k maps to b = k - 5; log terms have none). */
export function bOfRequest(r: { parameter: "ppe_beta" | "gimr_dphi"; b?: number | undefined; k?: number | string | undefined }): number | null {
  if (r.parameter === "ppe_beta") return r.b ?? null;
  return typeof r.k === "number" ? r.k - 5 : null;
}
