import type { BoundRequest, Caution, ConvertResult, QuotedValueDto } from "../../../common/convert.ts";
import type { BoundedResult } from "../../physics/convert.ts";
import { formatLatexNumber, unitLatex } from "../../physics/latex-format.ts";
import { engineCautions, leadingPnCaution, oneSignedCaution, priorCaution, signConventionCaution, validityCautions } from "./cautions.ts";
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
  bound: BoundRequest;
  requestedConvention: string | undefined;
  propagation?: { z: number; alphaMd: number; mpc: number };
}

const plain = (q: { symbol: string; latex: string; value: number; unit: string; side: "upper" | "lower" }): QuotedValueDto => ({
  symbol: q.symbol,
  latex: q.latex,
  value: q.value,
  unit: q.unit,
  side: q.side,
});

export function buildResult({ theory, ready, result, bound, requestedConvention, propagation }: ResultInput): ConvertResult {
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
  const referenceBounds = theory.referenceBounds.map((kb) => compareWithBound({ byConvention, shown: convention }, kb));

  let closedForm = result.latex;
  if (chosen) {
    const unit = unitLatex(coupling.unit);
    closedForm += `,\\qquad \\text{convention ${chosen.name}: } ${coupling.latex} ${coupling.side === "upper" ? "\\le" : "\\ge"} ${formatLatexNumber(coupling.value)}${unit ? `\\,${unit}` : ""}`;
  }

  const cautions: Caution[] = [...validityCautions(result)];
  cautions.push(leadingPnCaution(ready.notes.pnOrder));
  cautions.push(priorCaution(coupling.symbol));
  const oneSigned = oneSignedCaution(result, "The theory", bound.upper);
  if (oneSigned) {
    cautions.push(oneSigned);
    if (bound.parameter === "ppe_beta" && bound.sign_convention === "minus") cautions.push(signConventionCaution(true));
  }
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
    b: result.b,
    beta_max: result.beta_max,
    method: result.method,
    valid: result.valid,
    validity: result.validity.map((v) => ({
      label: v.label,
      condition: v.condition,
      value: Number.isFinite(v.value) ? v.value : null,
      max: v.max,
      ok: v.ok,
      kind: v.kind,
      ...(v.reference ? { reference: v.reference } : {}),
    })),
    closed_form_latex: closedForm,
    mapping_latex: ready.notes.latex,
    reference_bounds: referenceBounds,
    references: keys.filter((k) => refs.some((r) => r.key === k)).map(cite),
    cautions,
  };
}
