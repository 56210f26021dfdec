import type { Caution, CautionCode } from "../../../common/convert.ts";
import type { BoundedResult } from "../../physics/convert.ts";

/**
 * The cautions shown beside a translated number. They say where the number can mislead: a validity
 * condition failing at the limit, a leading-PN truncation, the prior, one-signed theories, sign
 * conventions, spin terms of gIMR coefficients and log terms.
 */

const fmt = (x: number) => (Number.isFinite(x) ? Number(x.toPrecision(3)).toString() : String(x));

export function validityCautions(result: BoundedResult): Caution[] {
  return result.validity
    .filter((v) => !v.ok)
    .map((v) => ({
      code: "validity" as const,
      message:
        v.kind === "hard"
          ? `Not valid at this limit: “${v.label}” fails (${fmt(v.value)} > ${fmt(v.max)}), so the expansion behind the mapping does not hold there.`
          : `Rule of thumb not met at this limit: “${v.label}” (${fmt(v.value)} > ${fmt(v.max)}).`,
    }));
}

export function leadingPnCaution(pnOrder: number | null): Caution {
  const order = pnOrder === null ? "" : ` (${pnOrder}PN relative order)`;
  return {
    code: "leading_pn",
    message: `Leading-PN mapping${order}: the theory's higher-order terms are left out.`,
  };
}

export function priorCaution(symbol: string): Caution {
  return {
    code: "prior",
    message: `A flat prior on the deviation is not flat in ${symbol}: translating posterior samples one by one is better than translating this summary bound.`,
  };
}

/** One-signed theories (EdGB and scalar dipole radiation give beta < 0) constrain only one side. */
export function oneSignedCaution(result: BoundedResult, theoryName: string, upper: number): Caution | undefined {
  if (result.theory_sign === 0) return undefined;
  const sign = result.theory_sign < 0 ? "β < 0" : "β > 0";
  const side = result.theory_sign < 0 ? "negative" : "positive";
  return {
    code: "one_signed",
    message: `${theoryName} predicts ${sign} at every coupling, so only the ${side} side of the bound constrains it: the symmetric |β| ≤ ${fmt(upper)} was used, and a one-sided bound on that side is the better input.`,
  };
}

export function signConventionCaution(perTheory: boolean): Caution {
  return {
    code: "sign_convention",
    message: perTheory
      ? "The bound was stated for h ∝ exp(−iΨ); it was normalised to exp(+iΨ) (β → −β) before this theory's sign was applied."
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
    if (seen.has(text) || /^rule of thumb not met/i.test(text)) continue;
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
