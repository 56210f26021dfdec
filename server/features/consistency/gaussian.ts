import type { ConsistencyRequest, ConsistencyResult } from "../../../common/consistency.ts";
import { gaussianContour, gaussianDeviation, gaussianGrQuantile, type RemnantSummary } from "../../physics/ringdown/gaussian-consistency.ts";
import { splitFrequencyHz } from "../../physics/ringdown/isco.ts";

/** Relative width above which an estimate is too broad for the first-order (delta-method) reading. */
const BROAD = 0.15;

export function splitFrequencyFor(request: { frame: "detector" | "source"; z?: number | undefined }, M: number, chi: number): number | undefined {
  if (request.frame === "detector") return splitFrequencyHz(M, chi);
  if (request.z !== undefined) return splitFrequencyHz(M * (1 + request.z), chi);
  return undefined;
}

/** Cautions that hold for any consistency result built from these two estimates. */
export function commonCautions(inspiral: { M_f: number; chi_f: number }, ringdown: { M_f: number; chi_f: number }, split: number | undefined): string[] {
  const out = [
    "Both estimates must come from the same remnant fit and the same frame: fits differ by up to ~0.01 in the final spin for unequal masses (Husa et al. 2016 vs Barausse & Rezzolla 2009), a systematic the widths do not include.",
  ];
  if (split === undefined) {
    out.push("Split frequency not computed: source-frame masses without a redshift z.");
  } else {
    out.push(
      `Split frequency ${split.toFixed(1)} Hz is from the mean of the two estimates; the analysis itself should split at the frequency predicted from the full-signal estimate.`,
    );
  }
  const meanSpin = (inspiral.chi_f + ringdown.chi_f) / 2;
  if (Math.abs(meanSpin) < 0.2) out.push(`The mean remnant spin is small (${meanSpin.toFixed(3)}): dchi_f/chi_f has a small denominator and exaggerates spin differences.`);
  return out;
}

export function gaussianConsistency(request: ConsistencyRequest): ConsistencyResult {
  const inspiral: RemnantSummary = { ...request.inspiral, rho: request.inspiral.rho ?? 0 };
  const ringdown: RemnantSummary = { ...request.merger_ringdown, rho: request.merger_ringdown.rho ?? 0 };
  const g = gaussianDeviation(inspiral, ringdown);
  const levels = [...new Set(request.levels)].sort((a, b) => a - b);
  const split = splitFrequencyFor(request, (inspiral.M_f + ringdown.M_f) / 2, (inspiral.chi_f + ringdown.chi_f) / 2);
  const cautions = [
    "Gaussian approximation: each estimate is read as a 2-D Gaussian and the deviation is propagated to first order; with posterior samples use the sample-based test.",
    ...commonCautions(inspiral, ringdown, split),
  ];
  const noRho = (["inspiral", "merger_ringdown"] as const).filter((k) => request[k].rho === undefined);
  if (noRho.length > 0) {
    cautions.push(
      `No correlation given for the ${noRho.join(" and ")} estimate: taken as 0. Published inspiral and merger-ringdown ellipses are usually strongly tilted, so the contours and the quantile can be far off.`,
    );
  }
  const broad = (["inspiral", "merger_ringdown"] as const).filter((k) => {
    const s = request[k];
    return s.sigma_M_f / s.M_f > BROAD || s.sigma_chi_f / Math.abs(s.chi_f) > BROAD;
  });
  if (broad.length > 0) {
    cautions.push(
      `The ${broad.join(" and ")} estimate is broad (relative width above ${BROAD * 100} %), as with a low post-inspiral SNR: the first-order Gaussian reading is stretched there.`,
    );
  }
  if (Math.abs(g.mean[0]) > 0.3 || Math.abs(g.mean[1]) > 0.3) {
    cautions.push("The deviation is not small (|dM_f/M_f| or |dchi_f/chi_f| above 0.3): the first-order propagation is unreliable.");
  }
  return {
    method: "gaussian",
    deviation: { mean: g.mean, covariance: g.covariance },
    gr_quantile: gaussianGrQuantile(g),
    contours: levels.map((level) => ({ level, paths: [gaussianContour(g, level)] })),
    ...(split === undefined ? {} : { split_frequency_hz: split }),
    cautions,
  };
}
