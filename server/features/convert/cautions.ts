import { RULE_OF_THUMB_STRETCH, type AmplitudeBoundRequest, type Caution, type CautionCode, type ConvertBoundRequest } from "../../../common/convert.ts";
import { sciText, thresholdText, unitText } from "../../../common/number-text.ts";
import { symbolText } from "../../../common/symbol-text.ts";
import type { BoundedResult } from "../../physics/convert.ts";

/**
 * The cautions shown beside a translated number. They say where the number can mislead: a validity
 * condition failing at the limit, a leading-PN truncation, the prior, one-signed theories, sign
 * conventions, spin terms of gIMR coefficients and log terms.
 */

/** Three figures, in scientific notation as papers print it when large or small (3.26 × 10¹⁶, not 32600000000000000). */
const fmt = (x: number) => (Number.isFinite(x) ? sciText(x, 3) : String(x));

export function validityCautions(result: Pick<BoundedResult, "validity">): Caution[] {
  return result.validity
    .filter((v) => !v.ok)
    .map((v) => ({
      code: "validity" as const,
      message:
        v.status === "stretched"
          ? `Stretched approximation at this limit: the rule of thumb “${v.label}” is exceeded ${fmt(v.factor)} times (${fmt(v.value)} > ${thresholdText(v.max)}), by no more than ${RULE_OF_THUMB_STRETCH} times, so the limit is kept as valid but the expansion is pushed.`
          : v.kind === "hard"
            ? `Outside validity at this limit: “${v.label}” fails ${Number.isFinite(v.factor) ? `by a factor ${fmt(v.factor)} ` : ""}(${fmt(v.value)} > ${thresholdText(v.max)}), so the expansion behind the mapping does not hold there.`
            : `Outside validity at this limit: the rule of thumb “${v.label}” fails ${Number.isFinite(v.factor) ? `by a factor ${fmt(v.factor)} ` : ""}(${fmt(v.value)} > ${thresholdText(v.max)}), more than ${RULE_OF_THUMB_STRETCH} times its threshold.`,
    }));
}

export function leadingPnCaution(pnOrder: number | null): Caution {
  const order = pnOrder === null ? "" : ` (${pnOrder}PN relative order)`;
  return {
    code: "leading_pn",
    message: `Leading-PN mapping${order}: the theory's higher-order terms are left out.`,
  };
}

/**
 * Beside every amplitude result: what the mapping leaves out. Amplitude mappings are the leading
 * correction to the amplitude at one exponent; a distance ratio is the a = 0 term.
 */
export function amplitudeMappingCaution(channel: "amplitude" | "distance_ratio", pnOrder: number | null): Caution {
  if (channel === "distance_ratio") {
    return {
      code: "amplitude",
      message: "Distance ratio: the limit treats d_L^GW/d_L^EM as the amplitude correction at a = 0 (α = d_L^EM/d_L^GW − 1, derived); the theory's other effects on the waveform and on the background expansion are left out, and the ratio carries the uncertainty of the electromagnetic distance.",
    };
  }
  const order = pnOrder === null ? "" : ` at ${pnOrder}PN relative order`;
  return {
    code: "amplitude",
    message: `Leading amplitude correction${order}: the theory's higher-order amplitude terms, and any phase term the same coupling produces, are left out of this limit.`,
  };
}

/** About an amplitude bound itself, before any theory. */
export function amplitudeBoundCautions(bound: AmplitudeBoundRequest): Caution[] {
  if (bound.parameter === "distance_ratio") {
    return [
      {
        code: "amplitude",
        message: `The ratio d_L^GW/d_L^EM at z = ${bound.z} was translated as the amplitude correction at a = 0, α = 1/r − 1 (derived): the interval on r becomes one on α with its ends swapped.`,
      },
    ];
  }
  if (bound.a === 0) {
    return [
      {
        code: "amplitude",
        message: "An amplitude correction at a = 0 is a constant factor, fully degenerate with the luminosity distance: it is measurable only with an independent (electromagnetic) distance, which is the distance-ratio bound (distance_ratio in the API).",
      },
    ];
  }
  return [];
}

/** The coupling by its symbol as people write it (√α), from its LaTeX when given, else from its identifier. */
export function priorCaution(symbol: string, latex?: string | null): Caution {
  return {
    code: "prior",
    message: `A flat prior on the deviation is not flat in ${symbolText(symbol, latex)}: translating posterior samples one by one is better than translating this summary bound.`,
  };
}

/**
 * Only where it is true: the theory gives one sign of beta over its coupling's physical range for this
 * binary, so only that side of the bound constrains it.
 */
export function oneSignedCaution(result: BoundedResult, bound: ConvertBoundRequest): Caution | undefined {
  if (result.theory_sign === 0) return undefined;
  if (bound.parameter === "distance_ratio") {
    // alpha = 1/r - 1: alpha > 0 is a ratio below 1 (the wave looks closer than its host), alpha < 0 above 1.
    const below = result.theory_sign > 0;
    const [lo, hi] = bound.interval;
    return {
      code: "one_signed",
      message: `For this source the theory gives d_L^GW/d_L^EM ${below ? "< 1" : "> 1"} at every value of its coupling, so only the ${below ? "lower" : "upper"} end of the ratio's interval (${below ? lo : hi}) constrains it; the other end says nothing about this theory.`,
    };
  }
  const dev = bound.parameter === "ppe_alpha" ? "α" : "β";
  const sign = result.theory_sign < 0 ? `${dev} < 0` : `${dev} > 0`;
  const what = bound.parameter === "ppe_beta" ? "β" : bound.parameter === "ppe_alpha" ? "α" : `δφ_${String(bound.k)}`;
  const end = result.side_used === "lower" ? "lower" : "upper";
  const used =
    bound.upper !== undefined
      ? `the symmetric |${what}| ≤ ${fmt(bound.upper)} was used as its ${end} side only (${dev} ${result.theory_sign < 0 ? "≥" : "≤"} ${fmt(result.theory_sign < 0 ? -result.beta_max : result.beta_max)}); a one-sided bound on that side is the better input`
      : `only the ${end} end of the interval was used (${dev} ${result.theory_sign < 0 ? "≥" : "≤"} ${fmt(result.theory_sign < 0 ? -result.beta_max : result.beta_max)}); the other end says nothing about this theory`;
  return {
    code: "one_signed",
    message: `For this binary the theory gives ${sign} at every value of its coupling, so only that side of the bound constrains it: ${used}.`,
  };
}

/** Couplings of either sign: the signed interval is the result; a magnitude alone would hide which side is bounded. */
export function signedIntervalCaution(result: BoundedResult): Caution | undefined {
  const s = result.signed_interval;
  if (!s) return undefined;
  const end = (x: number | null, inf: string) => (x === null ? inf : fmt(x));
  const unit = unitText(s.unit);
  const interval = `${symbolText(s.symbol, s.latex)} ∈ [${end(s.lower, "−∞")}, ${end(s.upper, "+∞")}]${unit ? ` ${unit}` : ""}`;
  return {
    code: "signed_interval",
    message: result.signed_headline
      ? `The coupling can take either sign and the bound is one-sided: only ${interval} follows; its magnitude is not bounded.`
      : `The coupling can take either sign, so the bound maps to the signed interval ${interval}; the magnitude limit beside it is the larger end.`,
  };
}

export function signConventionCaution(perTheory: boolean, interval = false): Caution {
  return {
    code: "sign_convention",
    message: perTheory
      ? "The bound was stated for h ∝ exp(−iΨ); it was normalised to exp(+iΨ) (β → −β) before this theory's sign was applied."
      : interval
        ? "The bound was stated for h ∝ exp(−iΨ); Dragoman normalises to exp(+iΨ), so β changes sign: the interval [lo, hi] became [−hi, −lo]."
        : "The bound was stated for h ∝ exp(−iΨ); Dragoman normalises to exp(+iΨ), so β changes sign (the magnitude of a symmetric bound does not).",
  };
}

/** The engine's own remarks, sorted into caution codes by what they are about. */
export function engineCautions(result: { warnings: readonly string[]; cautions: readonly string[] }): Caution[] {
  const classify = (text: string): CautionCode => {
    if (/memory|to be confirmed/i.test(text)) return "source_status";
    if (/spin/i.test(text)) return "spin_terms";
    if (/rule of thumb/i.test(text)) return "validity";
    return "engine";
  };
  const seen = new Set<string>();
  const out: Caution[] = [];
  for (const text of [...result.cautions, ...result.warnings]) {
    if (seen.has(text)) continue;
    seen.add(text);
    out.push({ code: classify(text), message: text.charAt(0).toUpperCase() + text.slice(1) + (text.endsWith(".") ? "" : ".") });
  }
  return out;
}

export function logTermCaution(k: string): Caution {
  return {
    code: "log_term",
    message: `δφ_${k} multiplies a v^k ln v term of the phase, which has no single-b ppE equivalent: no theory's β at one b can be translated from it.`,
  };
}

export function gimrSpinCaution(k: number, includesSpin: boolean, spinModelled: boolean): Caution | undefined {
  if (includesSpin && spinModelled) {
    return { code: "spin_terms", message: `δφ_${k} was taken relative to the spin-including φ_${k} of this binary (aligned spins, leading spin terms).` };
  }
  if (!includesSpin && (k === 3 || k === 4)) {
    return {
      code: "spin_terms",
      message: `δφ_${k} was taken relative to the non-spinning φ_${k}. If the analysis stretched the spin-including coefficient, set includes_spin: the translated β changes with the spins.`,
    };
  }
  return undefined;
}
