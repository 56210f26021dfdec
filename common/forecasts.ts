import { z } from "zod";
import { cautionSchema, convertResultSchema, notApplicableSchema } from "./convert.ts";

/**
 * Fisher-matrix forecasts of the ppE beta bound (POST /api/v1/forecasts), the noise curves they use
 * (built-in and uploaded), and the combination of uploaded Fisher matrices (/forecasts/combine).
 * Request schemas are strict: an unknown field is a 400 naming it.
 */

const num = (what: string) => z.number({ error: (i) => (i.input === undefined ? `${what} is required` : `${what} must be a number`) });
const positive = (what: string, unit: string) => num(what).positive(`${what} must be positive (${unit})`);

export const COALESCENCE_OPTIONS = ["shared", "phi_c_per_detector", "phi_c_t_c_per_detector"] as const;

export const BUILT_IN_CURVE_IDS = ["aligo-design", "aligo-o1", "et-b", "lisa", "tianqin", "decigo", "b-decigo"] as const;
export const CURVE_CONVENTIONS = ["l_shaped", "triangle", "two_channel_triangle", "response_averaged"] as const;
export type CurveConventionDto = (typeof CURVE_CONVENTIONS)[number];

/** A curve id: a built-in id or custom:<id> of an uploaded curve. */
export const curveIdSchema = z
  .string({ error: "curve must be a curve id" })
  .regex(/^(?:[a-z0-9-]{1,40}|custom:\d{1,10})$/, 'curve must be a built-in id (e.g. "aligo-design") or "custom:<id>"');

export const forecastSourceSchema = z.strictObject({
  m1: positive("m1", "solar masses"),
  m2: positive("m2", "solar masses"),
  chi1: num("chi1").gt(-1, "|chi1| must be below 1").lt(1, "|chi1| must be below 1").default(0),
  chi2: num("chi2").gt(-1, "|chi2| must be below 1").lt(1, "|chi2| must be below 1").default(0),
  frame: z.enum(["source", "detector"], { error: 'frame must be "source" or "detector"' }).default("source"),
  distance_mpc: positive("distance_mpc", "Mpc").optional(),
  z: positive("z", "redshift").optional(),
}).superRefine((s, ctx) => {
  if (s.distance_mpc === undefined && s.z === undefined) ctx.addIssue({ code: "custom", path: ["distance_mpc"], message: "give distance_mpc or z (or both)" });
});

export const forecastDetectorSchema = z.strictObject({
  curve: curveIdSchema,
  label: z.string().trim().min(1, "label must not be empty").max(60, "label must be at most 60 characters").optional(),
  f_low: positive("f_low", "Hz").optional(),
  f_high: positive("f_high", "Hz").optional(),
  years_observed: positive("years_observed", "years").max(100, "years_observed must be at most 100").optional(),
  years_before_merger: positive("years_before_merger", "years").max(1000, "years_before_merger must be at most 1000").optional(),
  orientation: z.enum(["sky_averaged", "optimal"], { error: 'orientation must be "sky_averaged" or "optimal"' }).default("sky_averaged"),
});

const priorWidth = (what: string) => positive(what, "a prior width; null for no prior").nullable();

export const MAX_FORECAST_DETECTORS = 8;
export const MAX_FORECAST_NETWORKS = 12;
export const MAX_FORECAST_B = 40;

/** Everything a forecast asks for besides the source (shared by single forecasts and grids). */
const forecastSettingsShape = {
  cosmology: z
    .strictObject({
      H0: positive("H0", "km/s/Mpc").default(67.66),
      Omega_m: num("Omega_m").min(0, "Omega_m must lie in [0, 1]").max(1, "Omega_m must lie in [0, 1]").default(0.3111),
    })
    .optional(),
  detectors: z.array(forecastDetectorSchema).min(1, "detectors must list at least one detector").max(MAX_FORECAST_DETECTORS, `at most ${MAX_FORECAST_DETECTORS} detectors`),
  networks: z
    .array(z.array(z.number().int("a network lists detector indices (whole numbers)").min(0, "detector indices start at 0")).min(1, "a network names at least one detector"))
    .min(1, "networks must list at least one network")
    .max(MAX_FORECAST_NETWORKS, `at most ${MAX_FORECAST_NETWORKS} networks`),
  b: z.array(num("b").min(-20, "b must lie in [-20, 10]").max(10, "b must lie in [-20, 10]")).min(1, "b must list at least one exponent").max(MAX_FORECAST_B, `at most ${MAX_FORECAST_B} values of b`),
  priors: z.strictObject({ phi_c: priorWidth("phi_c").optional(), chi_s: priorWidth("chi_s").optional(), chi_a: priorWidth("chi_a").optional() }).optional(),
  credibility: num("credibility").gt(0, "credibility must lie strictly between 0 and 1").lt(1, "credibility must lie strictly between 0 and 1").default(0.9),
  sides: z.enum(["one", "two"], { error: 'sides must be "one" or "two"' }).default("two"),
  /** "isco" (inspiral only) or an extrapolation of TaylorF2 to the PhenomA merger frequency, labelled so. */
  upper_cut: z.enum(["isco", "merger_extrapolated"], { error: 'upper_cut must be "isco" or "merger_extrapolated"' }).default("isco"),
  /**
   * One phi_c and t_c for all detectors of a network ("shared", phase-coherent), or one phi_c (and
   * t_c) per detector, for detectors that are not phase-coherent (a space and a ground detector years apart).
   */
  coalescence: z.enum(COALESCENCE_OPTIONS, { error: `coalescence must be one of ${COALESCENCE_OPTIONS.join(", ")}` }).default("shared"),
  /** Translate each network's bound into the catalogue's theories (default true). */
  translate: z.boolean({ error: "translate must be true or false" }).default(true),
  include_matrices: z.boolean({ error: "include_matrices must be true or false" }).default(false),
};

export const forecastRequestSchema = z.strictObject({
  source: forecastSourceSchema,
  ...forecastSettingsShape,
});
export type ForecastRequest = z.output<typeof forecastRequestSchema>;
export type ForecastRequestInput = z.input<typeof forecastRequestSchema>;

// ---------------------------------------------------------------------------------------------
// Forecast grids as background jobs (POST /api/v1/jobs/forecast)

export const MAX_GRID_SOURCES = 60;
export const MAX_GRID_B = 200;

/**
 * A heavy forecast: several sources (e.g. a grid of masses) and up to 200 values of b, every other
 * setting as in POST /forecasts. Runs on the job queue; its result is one forecast answer per source.
 */
export const forecastGridRequestSchema = z.strictObject({
  ...forecastSettingsShape,
  sources: z.array(forecastSourceSchema).min(1, "sources must list at least one source").max(MAX_GRID_SOURCES, `at most ${MAX_GRID_SOURCES} sources`),
  b: z.array(num("b").min(-20, "b must lie in [-20, 10]").max(10, "b must lie in [-20, 10]")).min(1, "b must list at least one exponent").max(MAX_GRID_B, `at most ${MAX_GRID_B} values of b`),
});
export type ForecastGridRequest = z.output<typeof forecastGridRequestSchema>;
export type ForecastGridRequestInput = z.input<typeof forecastGridRequestSchema>;

const statusSchema = z.enum(["ok", "ill_conditioned", "no_constraint"]);

export const forecastRowSchema = z.object({
  b: z.number(),
  sigma_beta: z.number().nullable(),
  bound: z.number().nullable(),
  condition_number: z.number().nullable(),
  status: statusSchema,
  note: z.string().optional(),
});
export type ForecastRowDto = z.infer<typeof forecastRowSchema>;

export const forecastNetworkSchema = z.object({
  detectors: z.array(z.number().int()),
  labels: z.array(z.string()),
  snr: z.object({ total: z.number(), per_detector: z.array(z.number()) }),
  cautions: z.array(z.string()),
  rows: z.array(forecastRowSchema),
});
export type ForecastNetworkDto = z.infer<typeof forecastNetworkSchema>;

export const forecastBandSchema = z.object({
  index: z.number().int(),
  curve: z.string(),
  label: z.string(),
  convention: z.enum(CURVE_CONVENTIONS),
  orientation: z.enum(["sky_averaged", "optimal"]),
  f_low: z.number(),
  f_high: z.number(),
  low_cut: z.string(),
  high_cut: z.string(),
  extrapolated: z.boolean(),
  /** The curve's convention is still to be checked against its source (see the curve list). */
  to_confirm: z.string().nullable(),
  years_observed: z.number().nullable(),
  years_before_merger: z.number().nullable(),
  snr: z.number(),
});

export const forecastTranslationSchema = z.object({
  network: z.number().int(),
  b: z.number(),
  beta_max: z.number(),
  sides: z.enum(["one", "two"]),
  /** The signed interval on beta that was translated: [-B, B] two-sided; [-B, null] or [null, B] one-sided. */
  interval: z.tuple([z.number().nullable(), z.number().nullable()]),
  results: z.array(convertResultSchema),
  not_applicable: z.array(notApplicableSchema),
  cautions: z.array(cautionSchema),
});
export type ForecastTranslationDto = z.infer<typeof forecastTranslationSchema>;

export const forecastResponseSchema = z.object({
  source: z.object({
    m1: z.number(),
    m2: z.number(),
    chi1: z.number(),
    chi2: z.number(),
    z: z.number(),
    distance_mpc: z.number(),
    distance_from: z.enum(["given", "z", "both_given"]),
    mc_z_msun: z.number(),
    m_z_msun: z.number(),
    eta: z.number(),
    f_isco_hz: z.number(),
  }),
  cosmology: z.object({ H0: z.number(), Omega_m: z.number() }),
  parameters: z.array(z.string()),
  priors: z.object({ phi_c: z.number().nullable(), chi_s: z.number().nullable(), chi_a: z.number().nullable() }),
  credibility: z.number(),
  sides: z.enum(["one", "two"]),
  multiplier: z.number(),
  upper_cut: z.enum(["isco", "merger_extrapolated"]),
  coalescence: z.enum(COALESCENCE_OPTIONS),
  detectors: z.array(forecastBandSchema),
  networks: z.array(forecastNetworkSchema),
  cautions: z.array(z.string()),
  matrices: z.array(z.object({ b: z.number(), per_detector: z.array(z.array(z.array(z.number()))) })).optional(),
  translations: z.array(forecastTranslationSchema),
  catalogue_revision: z.string().nullable(),
});
export type ForecastResponse = z.infer<typeof forecastResponseSchema>;

/** A finished forecast grid job: one answer per source, in the order of the request. */
export const forecastGridResultSchema = z.object({
  kind: z.literal("forecast_grid"),
  forecasts: z.array(forecastResponseSchema),
  /** Seconds of computation in the worker. */
  seconds: z.number(),
});
export type ForecastGridResult = z.infer<typeof forecastGridResultSchema>;

// ---------------------------------------------------------------------------------------------
// Curves

export const curveInfoSchema = z.object({
  id: z.string(),
  name: z.string(),
  source: z.string(),
  convention: z.enum(CURVE_CONVENTIONS),
  convention_note: z.string(),
  /** What of the curve's convention is still to be checked against its source; null when nothing is. */
  to_confirm: z.string().nullable(),
  f_min: z.number(),
  f_max: z.number(),
  default_f_low: z.number(),
  space: z.boolean(),
  custom: z.boolean(),
  points: z.number().int().nullable(),
  created_at: z.string().nullable(),
});
export type CurveInfoDto = z.infer<typeof curveInfoSchema>;
export const curveListSchema = z.object({ curves: z.array(curveInfoSchema) });

export const MAX_CURVE_POINTS = 20_000;
export const MAX_CURVE_BYTES = 1_000_000;

const curveUploadFields = {
  name: z.string({ error: "name is required" }).trim().min(1, "name is required").max(80, "name must be at most 80 characters"),
  /** What the second column holds: amplitude (1/sqrt(Hz)) or power (1/Hz) spectral density. */
  kind: z.enum(["asd", "psd"], { error: 'kind must be "asd" or "psd": say what the second column holds' }),
  convention: z.enum(CURVE_CONVENTIONS, { error: `convention must be one of ${CURVE_CONVENTIONS.join(", ")}` }),
};

/** JSON form (API clients): the table as text in `data`. */
export const curveUploadSchema = z.strictObject({
  ...curveUploadFields,
  /** True for a detector in space: its band comes from the observing window before merger. */
  space: z.boolean({ error: "space must be true or false" }).default(false),
  /** Two columns: frequency (Hz) and ASD or PSD; commas, tabs or spaces; # comments and header lines allowed. */
  data: z.string({ error: "data is required: the two-column table as text" }).min(1, "data is required").max(MAX_CURVE_BYTES, `data must be at most ${MAX_CURVE_BYTES} characters`),
});

/** Multipart form (the page): the table is the form field `file`; these are the text fields beside it. */
export const curveFileFieldsSchema = z.strictObject({
  ...curveUploadFields,
  space: z
    .enum(["true", "false"], { error: 'space must be "true" or "false"' })
    .default("false")
    .transform((v) => v === "true"),
});
export type CurveUpload = z.output<typeof curveUploadSchema>;
export type CurveUploadInput = z.input<typeof curveUploadSchema>;

// ---------------------------------------------------------------------------------------------
// Combining uploaded Fisher matrices

export const MAX_COMBINE_MATRICES = 12;
export const MAX_COMBINE_PARAMETERS = 30;

const parameterName = z.string().trim().min(1, "a parameter name must not be empty").max(40, "a parameter name is at most 40 characters");

export const uploadedFisherSchema = z.strictObject({
  label: z.string().trim().min(1, "label must not be empty").max(60).optional(),
  /** JSON form: names and a square matrix in the same order. */
  parameters: z.array(parameterName).min(1).max(MAX_COMBINE_PARAMETERS, `at most ${MAX_COMBINE_PARAMETERS} parameters`).optional(),
  matrix: z.array(z.array(num("matrix entry"))).max(MAX_COMBINE_PARAMETERS).optional(),
  /** CSV form: a header row of parameter names, then one row per parameter. */
  csv: z.string().max(200_000, "csv must be at most 200000 characters").optional(),
}).superRefine((m, ctx) => {
  const json = m.parameters !== undefined || m.matrix !== undefined;
  if (json === (m.csv !== undefined)) ctx.addIssue({ code: "custom", path: ["csv"], message: "give either parameters and matrix, or csv (a header row of names, then the rows)" });
  else if (json && (m.parameters === undefined || m.matrix === undefined)) ctx.addIssue({ code: "custom", path: [m.parameters === undefined ? "parameters" : "matrix"], message: "parameters and matrix go together" });
});

export const combineRequestSchema = z.strictObject({
  matrices: z.array(uploadedFisherSchema).min(1, "matrices must hold at least one Fisher matrix").max(MAX_COMBINE_MATRICES, `at most ${MAX_COMBINE_MATRICES} matrices`),
  networks: z.array(z.array(z.number().int("a network lists matrix indices").min(0)).min(1)).min(1).max(MAX_FORECAST_NETWORKS).optional(),
  target: parameterName.default("beta"),
  priors: z.strictObject({ phi_c: priorWidth("phi_c").optional(), chi_s: priorWidth("chi_s").optional(), chi_a: priorWidth("chi_a").optional() }).optional(),
  credibility: num("credibility").gt(0, "credibility must lie strictly between 0 and 1").lt(1, "credibility must lie strictly between 0 and 1").default(0.9),
  sides: z.enum(["one", "two"], { error: 'sides must be "one" or "two"' }).default("two"),
});
export type CombineRequest = z.output<typeof combineRequestSchema>;

export const combineResponseSchema = z.object({
  parameters: z.array(z.string()),
  target: z.string(),
  priors_applied: z.record(z.string(), z.number()),
  credibility: z.number(),
  sides: z.enum(["one", "two"]),
  multiplier: z.number(),
  networks: z.array(
    z.object({
      detectors: z.array(z.number().int()),
      labels: z.array(z.string()),
      sigma: z.number().nullable(),
      bound: z.number().nullable(),
      condition_number: z.number().nullable(),
      status: statusSchema,
      note: z.string().optional(),
      fisher: z.array(z.array(z.number())),
    }),
  ),
});
export type CombineResponse = z.infer<typeof combineResponseSchema>;
