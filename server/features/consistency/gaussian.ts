import type { ConsistencyRequest, ConsistencyResult } from "../../../common/consistency.ts";
import { gaussianContour, gaussianDeviation, gaussianGrQuantile, type RemnantSummary } from "../../physics/ringdown/gaussian-consistency.ts";
import { splitFrequencyHz } from "../../physics/ringdown/isco.ts";

/** Relative width above which an estimate is too broad for the first-order (delta-method) reading. */
const BROAD = 0.15;

export interface SplitChoice {
  frequency_hz: number;
  from: "full_signal" | "inspiral";
  M_f: number;
  chi_f: number;
}

/**
 * The split frequency f_c = 1 / (pi M_f (r_ISCO^{3/2} + chi_f)) in the detector frame (Ghosh et al. 2016,
 * 2018): at the full-signal remnant when given, else at the inspiral estimate's remnant (the mean of the
 * two would let the post-inspiral data move the split). Undefined for source-frame masses without z.
 */
export function splitFor(
  request: { frame: "detector" | "source"; z?: number | undefined; full_signal?: { M_f: number; chi_f: number } | undefined },
  inspiral: { M_f: number; chi_f: number },
): SplitChoice | undefined {
  const at = request.full_signal ?? inspiral;
  const from = request.full_signal ? "full_signal" : "inspiral";
  const scale = request.frame === "detector" ? 1 : request.z !== undefined ? 1 + request.z : undefined;
  if (scale === undefined) return undefined;
  const M = at.M_f * scale;
  return { frequency_hz: splitFrequencyHz(M, at.chi_f), from, M_f: M, chi_f: at.chi_f };
}

/** Cautions that hold for any consistency result built from these two estimates. */
export function commonCautions(inspiral: { M_f: number; chi_f: number }, ringdown: { M_f: number; chi_f: number }, split: SplitChoice | undefined): string[] {
  const out = [
    "Both estimates must come from the same remnant fit and the same frame: fits differ by up to ~0.01 in the final spin for unequal masses (Husa et al. 2016 vs Barausse & Rezzolla 2009), a systematic the widths do not include.",
  ];
  if (split === undefined) {
    out.push("Split frequency not computed: source-frame masses without a redshift z.");
  } else {
    out.push(
      split.from === "full_signal"
        ? `Split frequency ${split.frequency_hz.toFixed(1)} Hz: twice the orbital frequency at the ISCO of the full-signal remnant given (Ghosh et al. 2016, 2018).`
        : `Split frequency ${split.frequency_hz.toFixed(1)} Hz is computed from the inspiral estimate's remnant, since no full-signal remnant was given; Ghosh et al. 2016, 2018 split at the frequency predicted from the full-signal estimate, which the analysis itself should use.`,
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
  const split = splitFor(request, inspiral);
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
    ...(split === undefined ? {} : { split_frequency_hz: split.frequency_hz, split }),
    cautions,
  };
}
