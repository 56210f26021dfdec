import { z } from "zod";

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

export const consistencyRequestSchema = z.strictObject({
  inspiral: remnantSummarySchema,
  merger_ringdown: remnantSummarySchema,
  frame: massFrameSchema,
  /** Redshift; with source-frame masses it lets the split frequency be given in the detector frame. */
  z: num("z").min(0, "z must be >= 0").optional(),
  levels: levelsSchema,
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
  /** Split frequency (Hz, detector frame) computed from the mean of the two estimates, when the frame allows. */
  split_frequency_hz: z.number().optional(),
  cautions: z.array(z.string()),
});
export type ConsistencyResult = z.infer<typeof consistencyResultSchema>;
