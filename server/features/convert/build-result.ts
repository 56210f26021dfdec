import type { Caution, Channel, ConvertBoundRequest, ConvertResult, QuotedValueDto } from "../../../common/convert.ts";
import type { BoundedResult, ValidityResult } from "../../physics/convert.ts";
import { formatLatexNumber, unitLatex } from "../../physics/latex-format.ts";
import { amplitudeMappingCaution, engineCautions, leadingPnCaution, oneSignedCaution, priorCaution, signConventionCaution, signedIntervalCaution, validityCautions } from "./cautions.ts";
import type { AcceptedTheory } from "./catalogue-snapshot.ts";
import type { ReadyMapping } from "./compiled-catalogue.ts";
import { compareWithBound, shortCitation } from "./reference-compare.ts";

/**
 * A bounded conversion as the API answers it: the limit in the requested convention and the units
 * people quote, the closed form, validity, comparison with published bounds, and the cautions that
 * belong beside the number.
 */
export interface ResultInput {
  theory: AcceptedTheory;
  ready: ReadyMapping;
  result: BoundedResult;
  bound: ConvertBoundRequest;
  requestedConvention: string | undefined;
  propagation?: { z: number; alphaMd: number; mpc: number };
  /** Default "phase". */
  channel?: Channel;
}

const plain = (q: { symbol: string; latex: string; value: number; unit: string; side: "upper" | "lower" }): QuotedValueDto => ({
  symbol: q.symbol,
  latex: q.latex,
  value: q.value,
  unit: q.unit,
  side: q.side,
});

/** A condition at a limit as the API states it (non-finite numbers become null). Shared by every bound kind. */
export function validityItemDto(v: ValidityResult): ConvertResult["validity"][number] {
  return {
    label: v.label,
    condition: v.condition,
    value: Number.isFinite(v.value) ? v.value : null,
    max: v.max,
    ok: v.ok,
    kind: v.kind,
    factor: Number.isFinite(v.factor) ? v.factor : null,
    status: v.status,
    ...(v.reference ? { reference: v.reference } : {}),
  };
}

export function failingDto(v: ValidityResult): NonNullable<ConvertResult["failing"]> {
  return {
    label: v.label,
    condition: v.condition,
    value: Number.isFinite(v.value) ? v.value : null,
    max: v.max,
    factor: Number.isFinite(v.factor) ? v.factor : null,
    kind: v.kind,
  };
}

export function buildResult({ theory, ready, result, bound, requestedConvention, propagation, channel = "phase" }: ResultInput): ConvertResult {
  const spec = ready.compiled.coupling;
  const conventionList = result.conventions;
  const defaultName = spec.convention ?? conventionList.find((c) => c.factor === 1)?.name ?? "canonical";
  const available = [defaultName, ...conventionList.map((c) => c.name).filter((n) => n !== defaultName)];
  const chosen = requestedConvention && requestedConvention !== defaultName ? conventionList.find((c) => c.name === requestedConvention) : undefined;
  const convention = chosen ? chosen.name : defaultName;
  const coupling = plain(chosen ? chosen.quoted : result.quoted);
  // The extra forms (m_g beside lambda_g) are stated for the mapping's own convention.
  const also = chosen ? [] : result.extras.map(plain);

  const byConvention = new Map<string, QuotedValueDto[]>();
  byConvention.set(defaultName, [plain(result.quoted), ...result.extras.map(plain)]);
  for (const c of conventionList) if (c.name !== defaultName) byConvention.set(c.name, [plain(c.quoted)]);
  const factors = new Map<string, number>(conventionList.map((c) => [c.name, c.factor]));
  if (!factors.has(defaultName)) factors.set(defaultName, 1);
  // Published bounds are compared only with a valid limit on the magnitude, in the headline's convention.
  const withheld =
    result.signed_headline
      ? "this limit is one end of a signed interval, not a bound on the magnitude"
      : result.verdict === "outside_validity"
        ? "this limit is outside the validity of its mapping"
        : result.verdict === "not_assessed"
          ? "the validity of this limit is not assessed (the entry states no condition for this binary)"
          : null;
  const referenceBounds = theory.referenceBounds.map((kb) =>
    compareWithBound({ byConvention, shown: convention, factors, form: spec.quoted.form, primarySymbol: spec.quoted.symbol, withheld }, kb),
  );

  let closedForm = result.latex;
  if (chosen) {
    const unit = unitLatex(coupling.unit);
    closedForm += `,\\qquad \\text{convention ${chosen.name}: } ${coupling.latex} ${coupling.side === "upper" ? "\\le" : "\\ge"} ${formatLatexNumber(coupling.value)}${unit ? `\\,${unit}` : ""}`;
  }

  const cautions: Caution[] = [...validityCautions(result)];
  cautions.push(channel === "phase" ? leadingPnCaution(ready.notes.pnOrder) : amplitudeMappingCaution(channel, ready.notes.pnOrder));
  cautions.push(priorCaution(coupling.symbol, coupling.latex));
  const oneSigned = oneSignedCaution(result, bound);
  if (oneSigned) {
    cautions.push(oneSigned);
    if (bound.parameter === "ppe_beta" && bound.sign_convention === "minus") cautions.push(signConventionCaution(true, bound.interval !== undefined));
  }
  const signedCaution = signedIntervalCaution(result);
  if (signedCaution) cautions.push(signedCaution);
  if (propagation) {
    cautions.push({
      code: "frame",
      message: `Propagation effect: the limit uses the distance measure D_${propagation.alphaMd} = ${propagation.mpc.toPrecision(4)} Mpc at z = ${propagation.z} in the stated cosmology.`,
    });
  }
  cautions.push(...engineCautions(result));

  const refs = theory.references;
  const cite = (key: string) => {
    const ref = refs.find((r) => r.key === key);
    return { key, citation: ref ? shortCitation(ref) : key };
  };
  const keys = [...new Set([...ready.notes.referenceKeys, ...theory.referenceBounds.map((b) => b.reference.key)])];

  return {
    theory: theory.slug,
    theory_name: theory.name,
    convention,
    conventions_available: available,
    coupling,
    also,
    canonical: { symbol: result.coupling.symbol, latex: result.coupling.latex, value: result.coupling.value, unit: result.coupling.unit },
    coupling_symbol: result.coupling.symbol,
    channel,
    b: result.b,
    beta_max: result.beta_max,
    beta_interval: [...result.beta_interval],
    theory_sign: result.theory_sign < 0 ? "negative" : result.theory_sign > 0 ? "positive" : "either",
    side_used: result.side_used,
    signed_interval: result.signed_interval ? { ...result.signed_interval } : null,
    method: result.method,
    verdict: result.verdict,
    failing: result.failing ? failingDto(result.failing) : null,
    valid: result.verdict === "valid",
    validity: result.validity.map(validityItemDto),
    closed_form_latex: closedForm,
    mapping_latex: ready.notes.latex,
    reference_bounds: referenceBounds,
    references: keys.filter((k) => refs.some((r) => r.key === k)).map(cite),
    cautions,
  };
}
