import type { QuotedValueDto, ReferenceComparison } from "../../../common/convert.ts";
import { sciText, unitText } from "../../../common/number-text.ts";
import { identifierText, symbolText } from "../../../common/symbol-text.ts";
import { convertQuotedConvention, type QuotedFormName } from "../../physics/quoted-forms.ts";

/**
 * Puts a translated limit beside the published bounds on the same quantity: "3.2 times tighter than
 * Lyu et al. 2022". Only like is compared with like (same symbol, unit and side, and the same coupling
 * convention when the published bound names one); anything else is listed as incomparable.
 */

export interface CitableReference {
  key: string;
  authors: readonly string[];
  year: number;
}

export interface KnownBound {
  /** Symbol of the coupling or of its quoted quantity (sqrt_alpha, m_g, lambda_g ...). */
  symbol: string;
  value: number;
  unit: string;
  side: "upper" | "lower";
  convention: string | null;
  credibility: number | null;
  note: string | null;
  reference: CitableReference;
}

/** The translated limit in every form it can be compared in: per convention, the quoted value and its extras. */
export interface TranslatedForms {
  /** Convention name -> quoted values (primary first). */
  byConvention: ReadonlyMap<string, readonly QuotedValueDto[]>;
  /** The convention the result is shown in (the headline's). */
  shown: string;
  /** Convention name -> factor (coupling_ref = factor x coupling_conv), to restate a published bound in the shown convention. */
  factors?: ReadonlyMap<string, number>;
  /** Quoted form and symbol of the primary quantity (the one a convention factor applies to). */
  form?: QuotedFormName;
  primarySymbol?: string;
  /** Set when no comparison may be made (our limit is not valid): the reason. */
  withheld?: string | null;
}

function surname(author: string): string {
  const a = author.trim();
  if (a.includes(",")) return a.split(",")[0]!.trim();
  const words = a.split(/\s+/);
  return words[words.length - 1] ?? a;
}

/** "Yagi 2012", "Yunes & Pretorius 2009", "Lyu et al. 2022", "LIGO-Virgo 2016" (common practice for collaborations). */
export function shortCitation(ref: Pick<CitableReference, "authors" | "year">): string {
  const joined = ref.authors.join(", ");
  if (/collaboration/i.test(joined)) {
    const members = joined
      .replace(/\([^)]*\)/g, " ")
      .replace(/\b(?:Scientific|Collaborations?)\b/gi, " ")
      .split(/\s*(?:,|\band\b)\s*/i)
      .map((m) => m.trim())
      .filter(Boolean);
    return `${members.join("-")} ${ref.year}`;
  }
  const names = ref.authors.map(surname).filter(Boolean);
  const who = names.length === 0 ? "Anonymous" : names.length === 1 ? names[0]! : names.length === 2 ? `${names[0]} & ${names[1]}` : `${names[0]} et al.`;
  return `${who} ${ref.year}`;
}

function fmt(x: number): string {
  return sciText(x, 3);
}

/** The bound's quantity as people write it (√α, λ_g), from the LaTeX of our own matching quantity when there is one. */
function quantityText(forms: TranslatedForms, symbol: string): string {
  for (const values of forms.byConvention.values()) {
    const match = values.find((q) => q.symbol === symbol);
    if (match) return symbolText(symbol, match.latex);
  }
  return identifierText(symbol);
}

export function compareWithBound(forms: TranslatedForms, bound: KnownBound): ReferenceComparison {
  const citation = shortCitation(bound.reference);
  const base = {
    symbol: bound.symbol,
    value: bound.value,
    unit: bound.unit,
    side: bound.side,
    convention: bound.convention,
    credibility: bound.credibility,
    reference: { key: bound.reference.key, citation },
    note: bound.note,
  };
  const credibilityNote = bound.credibility === null ? ", credibility not stated" : `, ${fmt(bound.credibility * 100)}% credibility`;
  const quoted = (v: number) => `${fmt(v)}${bound.unit && bound.unit !== "1" ? ` ${unitText(bound.unit)}` : ""}`;
  const quantity = quantityText(forms, bound.symbol);
  const stated = `${quantity} ${bound.side === "upper" ? "≤" : "≥"} ${quoted(bound.value)}`;
  if (forms.withheld) {
    return { ...base, ratio: null, verdict: "not_compared", sentence: `not compared with ${citation} (${stated}${credibilityNote}): ${forms.withheld}` };
  }
  // The published bound restated in the headline's convention, when it names another one.
  let value = bound.value;
  let restated = "";
  const from = bound.convention ?? forms.shown;
  if (from !== forms.shown) {
    const f = forms.factors?.get(from);
    const t = forms.factors?.get(forms.shown);
    if (f === undefined || t === undefined || !forms.form || bound.symbol !== forms.primarySymbol) {
      return { ...base, ratio: null, verdict: "incomparable", sentence: `not comparable with ${citation} (${stated}, convention ${from}${credibilityNote})` };
    }
    value = convertQuotedConvention(bound.value, forms.form, f, t);
    restated = ` in convention ${from}, ${quoted(value)} in ${forms.shown}`;
  }
  const candidates = forms.byConvention.get(forms.shown) ?? [];
  const ours = candidates.find((q) => q.symbol === bound.symbol && q.unit === bound.unit && q.side === bound.side);
  if (!ours || !(ours.value > 0) || !(value > 0)) {
    return { ...base, ratio: null, verdict: "incomparable", sentence: `not comparable with ${citation} (${stated}${credibilityNote})` };
  }
  // ratio > 1: ours is tighter. An upper limit is tighter when smaller, a lower limit when larger.
  const ratio = bound.side === "upper" ? value / ours.value : ours.value / value;
  const rel = Math.abs(ratio - 1);
  const against = `${citation} (${stated}${restated}${credibilityNote})`;
  if (rel < 0.005) return { ...base, ratio, verdict: "equal", sentence: `the same as ${against}` };
  if (ratio > 1) return { ...base, ratio, verdict: "tighter", sentence: `${fmt(ratio)} times tighter than ${against}` };
  return { ...base, ratio, verdict: "weaker", sentence: `${fmt(1 / ratio)} times weaker than ${against}` };
}
