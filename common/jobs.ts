import { z } from "zod";
import { consistencyResultSchema } from "./consistency.ts";
import { forecastGridResultSchema } from "./forecasts.ts";
import { bodyKindSchema, cautionSchema, cosmologySchema, fLowSchema, gimrKSchema, signConventionSchema, theorySlugSchema } from "./convert.ts";

/**
 * Background jobs (docs/samples-jobs.md): POST /api/v1/jobs/samples (multipart: `file` and
 * `request`, the JSON text below), POST /api/v1/jobs/stack, GET and DELETE /api/v1/jobs/:id.
 * Shared by the routes, the worker and the translate page.
 */

export const JOB_STATUSES = ["queued", "running", "done", "failed", "cancelled"] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];
export const JOB_KINDS = ["samples", "stack", "consistency", "forecast"] as const;
export type JobKind = (typeof JOB_KINDS)[number];

/** 144 random bits, base64url (24 characters). */
export const jobIdSchema = z.string().regex(/^[A-Za-z0-9_-]{24}$/, "a job id is 24 characters of letters, digits, - and _");

const finite = (what: string) => z.number({ error: (issue) => (issue.input === undefined ? `${what} is required` : `${what} must be a number`) });
const columnName = (what: string) => z.string({ error: `${what} must be a column name` }).trim().min(1, `${what} must name a column`).max(200);

export const COLUMN_ROLES = ["deviation", "m1", "m2", "mchirp", "q", "mtotal", "chi1", "chi2", "z", "distance_mpc"] as const;
export type ColumnRoleName = (typeof COLUMN_ROLES)[number];

const range = (what: string) =>
  z
    .tuple([finite(`${what}.0`), finite(`${what}.1`)], { error: `${what} must be [low, high]` })
    .refine(([a, b]) => a < b, `${what} must satisfy low < high`);

const couplingSymbolSchema = z.string().trim().min(1, "coupling must not be empty").max(60, "coupling is at most 60 characters");

export const priorSchema = z.strictObject({
  kind: z.enum(["as_translated", "uniform", "log_uniform"], { error: 'prior.kind must be "as_translated", "uniform" or "log_uniform"' }),
  range: range("prior.range").optional(),
});
export type PriorRequest = z.output<typeof priorSchema>;

export const samplesJobRequestSchema = z
  .strictObject({
    theory: theorySlugSchema,
    /** The coupling's symbol, when the theory has several at this b. */
    coupling: couplingSymbolSchema.optional(),
    parameter: z.enum(["ppe_beta", "gimr_dphi"], { error: 'parameter must be "ppe_beta" or "gimr_dphi"' }),
    b: finite("b").optional(),
    k: gimrKSchema.optional(),
    credibility: finite("credibility").gt(0, "credibility must lie strictly between 0 and 1").lt(1, "credibility must lie strictly between 0 and 1"),
    sign_convention: signConventionSchema.default("plus"),
    includes_spin: z.boolean().default(false),
    /** HDF5 group or compound dataset (or a JSON key path) holding the samples. */
    table: z.string().trim().max(500).optional(),
    columns: z.strictObject({
      deviation: columnName("columns.deviation"),
      m1: columnName("columns.m1").optional(),
      m2: columnName("columns.m2").optional(),
      mchirp: columnName("columns.mchirp").optional(),
      q: columnName("columns.q").optional(),
      mtotal: columnName("columns.mtotal").optional(),
      chi1: columnName("columns.chi1").optional(),
      chi2: columnName("columns.chi2").optional(),
      z: columnName("columns.z").optional(),
      distance_mpc: columnName("columns.distance_mpc").optional(),
    }),
    frame: z.enum(["source", "detector"], { error: 'frame must be "source" or "detector"' }),
    bodies: z.tuple([bodyKindSchema, bodyKindSchema]).default(["bh", "bh"]),
    cosmology: cosmologySchema.optional(),
    /** Lowest observed frequency of the analysis band (Hz), for the in-band validity conditions. */
    f_low: fLowSchema,
    prior: priorSchema.default({ kind: "as_translated" }),
    /** The analysis prior: uniform in the deviation over this range (default: the samples' span). */
    analysis_prior_range: range("analysis_prior_range").optional(),
  })
  .superRefine((r, ctx) => {
    if (r.parameter === "ppe_beta" && r.b === undefined) ctx.addIssue({ code: "custom", path: ["b"], message: "a ppe_beta posterior needs b" });
    if (r.parameter === "gimr_dphi" && r.k === undefined) ctx.addIssue({ code: "custom", path: ["k"], message: "a gimr_dphi posterior needs k" });
    const c = r.columns;
    const pairs = [c.m1 !== undefined && c.m2 !== undefined, c.mchirp !== undefined && c.q !== undefined, c.mtotal !== undefined && c.q !== undefined].filter(Boolean).length;
    if (pairs !== 1 || (c.mchirp !== undefined && c.mtotal !== undefined) || ((c.m1 !== undefined) !== (c.m2 !== undefined))) {
      ctx.addIssue({ code: "custom", path: ["columns", "m1"], message: "map the masses as exactly one of: m1 and m2; mchirp and q; mtotal and q" });
    }
    if (c.z !== undefined && c.distance_mpc !== undefined) ctx.addIssue({ code: "custom", path: ["columns", "distance_mpc"], message: "map either z or distance_mpc, not both" });
    if (r.frame === "detector" && c.z === undefined && c.distance_mpc === undefined) {
      ctx.addIssue({ code: "custom", path: ["columns", "z"], message: "detector-frame masses need a z or distance_mpc column" });
    }
    if (r.prior.kind === "log_uniform" && r.prior.range && !(r.prior.range[0] > 0)) {
      ctx.addIssue({ code: "custom", path: ["prior", "range"], message: "a log-uniform prior needs a positive lower end" });
    }
  });
export type SamplesJobRequest = z.output<typeof samplesJobRequestSchema>;
export type SamplesJobRequestInput = z.input<typeof samplesJobRequestSchema>;

export const verdictSchema = z.enum(["valid", "outside_validity", "not_assessed"]);
export type SamplesVerdict = z.infer<typeof verdictSchema>;

const histogramSchema = z.object({ scale: z.enum(["log", "linear"]), edges: z.array(z.number()), mass: z.array(z.number()) });

export const samplesJobResultSchema = z.object({
  theory: z.string(),
  theory_name: z.string(),
  b: z.number(),
  credibility: z.number(),
  catalogue_revision: z.string(),
  coupling: z.object({
    symbol: z.string(),
    latex: z.string(),
    unit: z.string(),
    side: z.enum(["upper", "lower", "interval"]),
    value: z.number().optional(),
    signed_interval: z.tuple([z.number(), z.number()]).optional(),
  }),
  /** beta = K_i x^p in the canonical coupling; null when the mapping is not a power law (each sample inverted on its own). */
  power: z.number().nullable(),
  range: z.enum(["positive", "non_negative", "any_sign"]),
  prior: z.object({ kind: z.enum(["as_translated", "uniform", "log_uniform"]), range: z.tuple([z.number(), z.number()]).nullable() }),
  analysis_prior: z.object({ kind: z.literal("uniform"), parameter: z.enum(["ppe_beta", "gimr_dphi"]), range: z.tuple([z.number(), z.number()]) }),
  verdict: verdictSchema,
  fraction_outside: z.number(),
  conditions: z.array(z.object({ label: z.string(), condition: z.string(), kind: z.enum(["hard", "rule_of_thumb"]), fraction_outside: z.number(), power: z.number().nullable() })),
  samples: z.object({ read: z.number().int(), used: z.number().int(), dropped: z.number().int(), dropped_reasons: z.array(z.object({ reason: z.string(), count: z.number().int() })) }),
  effective_sample_size: z.number(),
  histogram: histogramSchema,
  cautions: z.array(cautionSchema),
  file: z.object({ name: z.string(), bytes: z.number().int(), sha256: z.string(), format: z.enum(["text", "json", "hdf5"]) }),
  columns: z.record(z.string(), z.string()),
  table: z.string().nullable(),
  frame: z.enum(["source", "detector"]),
  /** Seconds from the file to the result, measured by the worker. */
  seconds: z.number(),
});
export type SamplesJobResult = z.infer<typeof samplesJobResultSchema>;

export const jobErrorSchema = z.object({
  message: z.string(),
  file: z.string().optional(),
  path: z.string().optional(),
  column: z.string().optional(),
  row: z.number().int().optional(),
  line: z.number().int().optional(),
});
export type JobError = z.infer<typeof jobErrorSchema>;

// ---------------------------------------------------------------------------------------------
// Stacking several events

export const stackEventSchema = z.union([
  z.strictObject({ label: z.string().trim().min(1).max(80), job: jobIdSchema }),
  z.strictObject({
    label: z.string().trim().min(1).max(80),
    /** Quick estimate: the deviation as a Gaussian (centre, width) or an interval at the stack's credibility. */
    summary: z.union([z.strictObject({ centre: finite("centre"), width: finite("width").positive("width must be positive") }), z.strictObject({ interval: range("interval") })]),
    binary: z.strictObject({
      m1: finite("m1").positive(),
      m2: finite("m2").positive(),
      chi1: finite("chi1").gt(-1).lt(1).default(0),
      chi2: finite("chi2").gt(-1).lt(1).default(0),
      z: finite("z").min(0).optional(),
    }),
  }),
]);
export type StackEvent = z.output<typeof stackEventSchema>;

export const stackJobRequestSchema = z.strictObject({
  theory: theorySlugSchema,
  coupling: couplingSymbolSchema.optional(),
  parameter: z.enum(["ppe_beta", "gimr_dphi"]),
  b: finite("b").optional(),
  k: gimrKSchema.optional(),
  credibility: finite("credibility").gt(0).lt(1),
  bodies: z.tuple([bodyKindSchema, bodyKindSchema]).default(["bh", "bh"]),
  cosmology: cosmologySchema.optional(),
  f_low: fLowSchema,
  prior: priorSchema.default({ kind: "uniform" }),
  events: z.array(stackEventSchema).min(1, "give at least one event").max(50, "at most 50 events"),
  include_outside_validity: z.boolean().default(false),
});
export type StackJobRequest = z.output<typeof stackJobRequestSchema>;

export const stackJobResultSchema = z.object({
  theory: z.string(),
  theory_name: z.string(),
  credibility: z.number(),
  coupling: samplesJobResultSchema.shape.coupling,
  prior: z.object({ kind: z.string(), range: z.tuple([z.number(), z.number()]).nullable() }),
  verdict: verdictSchema,
  fraction_outside: z.number(),
  events: z.array(z.object({ label: z.string(), kind: z.enum(["samples", "summary"]), used: z.boolean(), reason: z.string().nullable(), verdict: verdictSchema.nullable(), bound: z.number().nullable(), interval: z.tuple([z.number(), z.number()]).optional() })),
  grid: z.object({ x: z.array(z.number()), combined: z.array(z.number()), events: z.array(z.array(z.number())) }),
  cautions: z.array(cautionSchema),
});
export type StackJobResult = z.infer<typeof stackJobResultSchema>;

export const jobViewSchema = z.object({
  id: jobIdSchema,
  kind: z.enum(JOB_KINDS),
  status: z.enum(JOB_STATUSES),
  progress: z.number().min(0).max(1),
  created_at: z.string(),
  finished_at: z.string().nullable(),
  expires_at: z.string().nullable(),
  file: z.object({ name: z.string(), bytes: z.number().int(), sha256: z.string(), format: z.string() }).nullable(),
  result: z.union([samplesJobResultSchema, stackJobResultSchema, consistencyResultSchema, forecastGridResultSchema]).optional(),
  error: jobErrorSchema.optional(),
});
export type JobView = z.infer<typeof jobViewSchema>;

export const jobCreatedSchema = z.object({ job: z.object({ id: jobIdSchema, status: z.enum(JOB_STATUSES), progress: z.number() }) });

export const filePreviewSchema = z.object({
  file: z.object({ name: z.string(), bytes: z.number().int(), format: z.enum(["text", "json", "hdf5"]) }),
  tables: z.array(
    z.object({
      /** HDF5 path or null (text, top-level JSON). */
      path: z.string().nullable(),
      rows: z.number().int().nullable(),
      columns: z.array(
        z.object({ name: z.string(), first: z.array(z.number().nullable()), numeric: z.boolean(), min: z.number().nullable(), max: z.number().nullable(), mean: z.number().nullable(), non_finite: z.number().int() }),
      ),
    }),
  ),
  note: z.string().optional(),
});
export type FilePreview = z.infer<typeof filePreviewSchema>;
