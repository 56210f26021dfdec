import { z } from "zod";
import { failingConditionSchema, validityItemSchema, verdictSchema } from "./convert.ts";

/**
 * Request and response shapes of the inspiral-merger-ringdown consistency test
 * (POST /api/v1/consistency with Gaussian summaries; the sample-based job answers with the same result).
 * The consistency page validates with these same schemas.
 */

const num = (what: string) => z.number({ error: (i) => (i.input === undefined ? `${what} is required` : `${what} must be a number`) });

export const DEFAULT_LEVELS = [0.68, 0.9, 0.95] as const;

export const remnantSummarySchema = z.strictObject({
  /** Remnant mass, solar masses, in the request's frame. */
  M_f: num("M_f").positive("M_f must be positive (solar masses)"),
  chi_f: num("chi_f").gt(-1, "|chi_f| must be below 1 (a Kerr black hole)").lt(1, "|chi_f| must be below 1 (a Kerr black hole)"),
  sigma_M_f: num("sigma_M_f").positive("sigma_M_f must be positive"),
  sigma_chi_f: num("sigma_chi_f").positive("sigma_chi_f must be positive"),
  /** Correlation of M_f and chi_f within this estimate; when absent it is taken as 0 and a caution says so. */
  rho: num("rho")
    .gt(-1, "|rho| must be below 1, or the covariance matrix is not positive definite")
    .lt(1, "|rho| must be below 1, or the covariance matrix is not positive definite")
    .optional(),
});
export type RemnantSummaryInput = z.input<typeof remnantSummarySchema>;

export const levelsSchema = z
  .array(num("level").gt(0, "each level must lie strictly between 0 and 1").lt(1, "each level must lie strictly between 0 and 1"))
  .min(1, "give at least one level")
  .max(6, "at most 6 levels")
  .default([...DEFAULT_LEVELS]);

export const massFrameSchema = z.enum(["detector", "source"], { error: 'frame must be "detector" or "source"' });

/**
 * The remnant predicted from the full-signal estimate (same frame as the two estimates): Ghosh et al.
 * 2016, 2018 split the data at twice the orbital frequency of its ISCO. When absent, the split
 * frequency is computed from the inspiral estimate's remnant, and the answer says so.
 */
export const fullSignalRemnantSchema = z.strictObject({
  M_f: num("M_f").positive("M_f must be positive (solar masses)"),
  chi_f: num("chi_f").gt(-1, "|chi_f| must be below 1 (a Kerr black hole)").lt(1, "|chi_f| must be below 1 (a Kerr black hole)"),
});

export const consistencyRequestSchema = z.strictObject({
  inspiral: remnantSummarySchema,
  merger_ringdown: remnantSummarySchema,
  frame: massFrameSchema,
  /** Redshift; with source-frame masses it lets the split frequency be given in the detector frame. */
  z: num("z").min(0, "z must be >= 0").optional(),
  levels: levelsSchema,
  full_signal: fullSignalRemnantSchema.optional(),
});
export type ConsistencyRequest = z.output<typeof consistencyRequestSchema>;
export type ConsistencyRequestInput = z.input<typeof consistencyRequestSchema>;

const point = z.tuple([z.number(), z.number()]);

export const consistencyResultSchema = z.object({
  method: z.enum(["gaussian", "samples"]),
  /** Deviation variables (dM_f/M_f, dchi_f/chi_f), each normalised by the mean of the two estimates. */
  deviation: z.object({
    mean: point,
    covariance: z.tuple([point, point]),
  }),
  /** Credible level of the contour through (0, 0): small = consistent with GR. */
  gr_quantile: z.number(),
  /** Credible regions, each a list of closed rings [[dM, dchi], ...]. */
  contours: z.array(z.object({ level: z.number(), paths: z.array(z.array(point)) })),
  /** Split frequency (Hz, detector frame), when the frame allows; the same as split.frequency_hz. */
  split_frequency_hz: z.number().optional(),
  /** The split frequency and the remnant it was computed from (full-signal estimate, or the inspiral estimate's). */
  split: z
    .object({
      frequency_hz: z.number(),
      from: z.enum(["full_signal", "inspiral"]),
      /** Detector-frame remnant mass (solar masses) and spin the ISCO was taken at. */
      M_f: z.number(),
      chi_f: z.number(),
    })
    .optional(),
  cautions: z.array(z.string()),
  /**
   * From posterior samples: each estimate's sample mean, standard deviations and correlation of
   * (M_f, chi_f), in the files' frame, so the coupling question can take the test's widths from them.
   */
  estimates: z
    .object({
      frame: massFrameSchema,
      inspiral: z.object({ M_f: z.number(), chi_f: z.number(), sigma_M_f: z.number(), sigma_chi_f: z.number(), rho: z.number() }),
      merger_ringdown: z.object({ M_f: z.number(), chi_f: z.number(), sigma_M_f: z.number(), sigma_chi_f: z.number(), rho: z.number() }),
    })
    .optional(),
});
export type ConsistencyResult = z.infer<typeof consistencyResultSchema>;

// ---------------------------------------------------------------------------------------------
// What coupling would this test exclude (POST /api/v1/consistency/coupling)

const width = z.strictObject({
  sigma_M_f: num("sigma_M_f").positive("sigma_M_f must be positive"),
  sigma_chi_f: num("sigma_chi_f").positive("sigma_chi_f must be positive"),
  rho: num("rho").gt(-1, "|rho| must be below 1, or the covariance matrix is not positive definite").lt(1, "|rho| must be below 1, or the covariance matrix is not positive definite").default(0),
});

/**
 * Widths of the test forecast for a detector instead of given: the inspiral from a Fisher forecast on
 * the band f_low .. split frequency, the merger-ringdown from one (2,2,0) damped sinusoid at
 * ringdown_snr (docs/remnant-consistency.md). Any curve the forecasts take: a built-in one, ground or
 * space, or custom:<id> of the caller's uploaded curve (signed in).
 */
export const testForecastSchema = z.strictObject({
  curve: z
    .string({ error: "curve is required: a noise curve id (aligo-design, et-b, lisa, ... or custom:<id>)" })
    .regex(/^(?:[a-z0-9-]{1,40}|custom:\d{1,10})$/, 'curve must be a built-in id (e.g. "aligo-design", "lisa") or "custom:<id>" of your uploaded curve'),
  /** Space detectors: the observing window (years observed, ending this many years before merger... see the forecasts), default 4 and 4. */
  years_observed: num("years_observed").positive("years_observed must be positive").max(100, "years_observed must be at most 100").optional(),
  years_before_merger: num("years_before_merger").positive("years_before_merger must be positive").max(100, "years_before_merger must be at most 100").optional(),
  f_low: num("f_low").positive("f_low must be positive (Hz)").optional(),
  orientation: z.enum(["sky_averaged", "optimal"], { error: 'orientation must be "sky_averaged" or "optimal"' }).default("sky_averaged"),
  /** Luminosity distance; from the binary's z through the cosmology when absent. */
  distance_mpc: num("distance_mpc").positive("distance_mpc must be positive (Mpc)").optional(),
  /** SNR of the post-inspiral signal carried by the mode; needed when merger_ringdown widths are not given. */
  ringdown_snr: num("ringdown_snr").positive("ringdown_snr must be positive").max(1e4, "ringdown_snr must be at most 1e4").optional(),
});
export type TestForecast = z.output<typeof testForecastSchema>;

/** The noise curve a test is forecast for, and the inspiral bias computed with, when the request names none. */
export const DEFAULT_TEST_CURVE = "aligo-design";

/**
 * The inspiral side of a theory's shift: the linear bias of the GR template fitted to a signal carrying
 * the theory's ppE term (Cutler & Vallisneri 2007), from the inspiral Fisher matrix on f_low .. split
 * frequency. When the inspiral widths are forecast, the bias uses the same detector (give no curve
 * here); with given widths it needs a noise curve of its own (default DEFAULT_TEST_CURVE; a built-in one,
 * or custom:<id> of the caller's uploaded curve).
 */
export const inspiralBiasOptionsSchema = z.strictObject({
  include: z.boolean({ error: "include must be true or false" }).default(true),
  curve: z
    .string({ error: 'curve must be a noise curve id (e.g. "aligo-design", "et-b") or "custom:<id>" of your uploaded curve' })
    .regex(/^(?:[a-z0-9-]{1,40}|custom:\d{1,10})$/, 'curve must be a built-in id (e.g. "aligo-design", "et-b") or "custom:<id>" of your uploaded curve')
    .optional(),
  f_low: num("f_low").positive("f_low must be positive (Hz)").optional(),
  orientation: z.enum(["sky_averaged", "optimal"], { error: 'orientation must be "sky_averaged" or "optimal"' }).optional(),
  /** Sets the weight of the Gaussian priors against the data; from the binary's z when absent. */
  distance_mpc: num("distance_mpc").positive("distance_mpc must be positive (Mpc)").optional(),
});
export type InspiralBiasOptions = z.output<typeof inspiralBiasOptionsSchema>;

export const couplingExclusionRequestSchema = z
  .strictObject({
    theory: z.string().min(1, "theory is required").max(64),
    binary: z.strictObject({
      m1: num("m1").positive("m1 must be positive (solar masses)"),
      m2: num("m2").positive("m2 must be positive (solar masses)"),
      chi1: num("chi1").gt(-1, "|chi1| must be below 1").lt(1, "|chi1| must be below 1").default(0),
      chi2: num("chi2").gt(-1, "|chi2| must be below 1").lt(1, "|chi2| must be below 1").default(0),
      frame: massFrameSchema,
      z: num("z").min(0, "z must be >= 0").optional(),
    }),
    /** Widths of the two remnant estimates (masses in the binary's frame), e.g. from a past analysis or a forecast. */
    test: z.strictObject({ inspiral: width.optional(), merger_ringdown: width.optional(), forecast: testForecastSchema.optional(), inspiral_bias: inspiralBiasOptionsSchema.optional() }),
    credibility: num("credibility").gt(0, "credibility must lie strictly between 0 and 1").lt(1, "credibility must lie strictly between 0 and 1").default(0.9),
    mode: z.enum(["220", "221", "330", "210", "440"], { error: "mode must be one of 220, 221, 330, 210, 440" }).default("220"),
  })
  .superRefine((r, ctx) => {
    if (r.binary.frame === "detector" && r.binary.z === undefined) ctx.addIssue({ code: "custom", path: ["binary", "z"], message: "detector-frame masses need the redshift z" });
    if (!r.test.inspiral && !r.test.forecast) ctx.addIssue({ code: "custom", path: ["test", "inspiral"], message: "give the inspiral estimate's widths, or test.forecast to forecast them for a detector" });
    if (!r.test.merger_ringdown && r.test.forecast?.ringdown_snr === undefined) {
      ctx.addIssue({ code: "custom", path: ["test", "merger_ringdown"], message: "give the merger-ringdown estimate's widths, or test.forecast.ringdown_snr to forecast them" });
    }
    if (r.test.forecast && r.binary.z === undefined) ctx.addIssue({ code: "custom", path: ["binary", "z"], message: "a forecast needs the binary's redshift z" });
    const bias = r.test.inspiral_bias;
    if (bias && !r.test.inspiral && r.test.forecast) {
      for (const key of ["curve", "f_low", "orientation", "distance_mpc"] as const) {
        if (bias[key] !== undefined) {
          ctx.addIssue({ code: "custom", path: ["test", "inspiral_bias", key], message: `the inspiral widths are forecast with test.forecast, and the bias uses the same detector: leave test.inspiral_bias.${key} out` });
        }
      }
    }
  });
export type CouplingExclusionRequest = z.output<typeof couplingExclusionRequestSchema>;
export type CouplingExclusionRequestInput = z.input<typeof couplingExclusionRequestSchema>;

export const couplingExclusionResponseSchema = z.object({
  theory: z.object({ slug: z.string(), name: z.string(), revision: z.number() }),
  coupling: z.object({ symbol: z.string(), latex: z.string(), unit: z.string() }),
  remnant: z.object({ M_f: z.number(), chi_f: z.number(), frame: massFrameSchema, chi_f_alternative: z.number() }),
  credibility: z.number(),
  /** Which of the theory's effects entered: QNM shifts of the mode, shifts of the true remnant, the inspiral's bias. */
  model: z.object({ qnm_frequency: z.boolean(), qnm_damping: z.boolean(), remnant_mass: z.boolean(), remnant_spin: z.boolean(), inspiral_bias: z.boolean() }),
  /** The widths the test used for each estimate, and where they came from. */
  widths: z.object({
    inspiral: z.object({ from: z.enum(["given", "forecast"]), sigma_M_f: z.number(), sigma_chi_f: z.number(), rho: z.number() }),
    merger_ringdown: z.object({ from: z.enum(["given", "forecast"]), sigma_M_f: z.number(), sigma_chi_f: z.number(), rho: z.number() }),
    /** With a forecast: the inspiral band and SNR, and the ringdown SNR used. */
    forecast: z
      .object({ curve: z.string(), f_low: z.number(), f_high: z.number(), high_cut: z.string(), snr: z.number(), split_frequency_hz: z.number(), ringdown_snr: z.number().nullable() })
      .optional(),
  }),
  /**
   * The inspiral bias when modelled: the detector and band of the Fisher matrix it came from, where that
   * detector was named, and per ppE term the shift of the inspiral estimate per unit beta.
   */
  inspiral_bias: z
    .object({
      curve: z.string(),
      label: z.string(),
      curve_from: z.enum(["test.forecast", "test.inspiral_bias", "default"]),
      f_low: z.number(),
      f_high: z.number(),
      snr: z.number(),
      terms: z.array(z.object({ b: z.number(), d_ln_M_f_per_beta: z.number(), d_chi_f_per_beta: z.number() })),
    })
    .nullable(),
  /** What the inspiral side of the test is taken as (biased, or the GR remnant and why); also the first of the cautions. */
  inspiral_side: z.string(),
  /** Covariance of (dM_f/M_f, dchi_f/chi_f) of the test at the GR point. */
  covariance: z.tuple([point, point]),
  sides: z.array(
    z.object({
      side: z.enum(["negative", "positive"]),
      /** Smallest |coupling| at which GR is excluded (exact inversion of the Kerr fit), or null. */
      x: z.number().nullable(),
      /** The same with the linear (Jacobian) reading of the shifted mode. */
      x_linear: z.number().nullable(),
      reason: z.string().optional(),
      /** Where the linear and exact readings part by more than 10 %. */
      linear_breaks_at: z.number().nullable(),
      /** Smallest |coupling| (signed) up to the bound at which the inspiral bias exceeds one standard deviation of the inspiral estimate (either M_f or chi_f), or null. */
      bias_exceeds_sigma_at: z.number().nullable(),
      /** The inspiral bias at the bound in standard deviations of the inspiral estimate (the larger of M_f and chi_f), or null. */
      bias_sigmas_at_bound: z.number().nullable(),
      /** The translator's verdict rule at the limit (common/convert.ts): stretched rules of thumb stay valid. */
      verdict: verdictSchema,
      failing: failingConditionSchema.nullable(),
      validity: z.array(validityItemSchema),
      unassessed: z.array(z.object({ label: z.string(), condition: z.string(), reason: z.string() })),
    }),
  ),
  /** The expected deviation against the coupling, for drawing over the contours. */
  track: z.array(z.object({ x: z.number(), mean: point, linear_mean: point, gr_quantile: z.number() })),
  cautions: z.array(z.string()),
});
export type CouplingExclusionResponse = z.infer<typeof couplingExclusionResponseSchema>;

// ---------------------------------------------------------------------------------------------
// From posterior samples (POST /api/v1/jobs/consistency: multipart `inspiral`, `merger_ringdown`, `request`)

export const consistencyJobRequestSchema = z.strictObject({
  /** Frame of the masses in both files. */
  frame: massFrameSchema,
  z: num("z").min(0, "z must be >= 0").optional(),
  levels: levelsSchema,
  full_signal: fullSignalRemnantSchema.optional(),
});
export type ConsistencyJobRequest = z.output<typeof consistencyJobRequestSchema>;
