import type { BibliographyEntry, QuotedValueDto, ReferenceComparison } from "../../../common/convert.ts";
import type { RingdownResult } from "../../../common/ringdown.ts";
import type { TheoryEntry } from "../../../common/catalogue.ts";
import { presentLimit, type QuotedFormSpec } from "../../physics/quoted-forms.ts";
import type { CompiledRingdownMapping } from "../../physics/ringdown/ringdown-mapping.ts";
import { compareWithBound, shortCitation, type KnownBound } from "../convert/reference-compare.ts";

/**
 * What stands beside a ringdown limit, as beside an inspiral one (server/features/convert/build-result.ts):
 * the limit in the unit the literature quotes (sqrt(alpha) in km), the published bounds on the same
 * coupling compared with it (only like with like, only for a valid limit on the magnitude), and the
 * references of the mapping used, with full details for the bibliography.
 */

type Entry = TheoryEntry;

/** The entry's reference with this key, as the bibliography lists it. */
function bibliographyOf(entry: Entry, key: string): BibliographyEntry | undefined {
  const r = entry.references.find((x) => x.key === key);
  if (!r) return undefined;
  return {
    key,
    authors: r.authors,
    title: r.title,
    year: r.year,
    journal: r.journal ?? null,
    volume: r.volume ?? null,
    pages: r.pages ?? null,
    arxiv: r.arxiv ?? null,
    doi: r.doi ?? null,
  };
}

/** The published bounds the entry holds on this coupling, in the comparison's shape. */
function knownBounds(entry: Entry, coupling: string): KnownBound[] {
  return entry.reference_bounds.flatMap((b) => {
    if (b.coupling !== coupling) return [];
    const ref = entry.references.find((r) => r.key === b.reference);
    if (!ref) return [];
    return [
      {
        symbol: b.quoted_symbol ?? b.coupling,
        value: b.value,
        unit: b.unit,
        side: b.side,
        convention: b.convention ?? null,
        credibility: b.credibility ?? null,
        note: b.note ?? b.data ?? null,
        reference: { key: b.reference, authors: ref.authors, year: ref.year },
      },
    ];
  });
}

export interface RingdownCitations {
  /** The limit on the magnitude in the quoted unit, when the result is one (null: a signed end only, or no limit). */
  limit: QuotedValueDto | null;
  reference_bounds: ReferenceComparison[];
  references: { key: string; citation: string }[];
  bibliography: BibliographyEntry[];
}

/**
 * The magnitude limit of a bounded result: |x| <= max(|lower|, |upper|) when both sides are limited, or
 * the positive side of a coupling that cannot be negative. A coupling of either sign limited on one side
 * only has no bound on its magnitude.
 */
function magnitudeOf(m: CompiledRingdownMapping, result: Pick<RingdownResult, "lower" | "upper">): number | null {
  if (m.coupling.range !== "any_sign") return result.upper?.value ?? null;
  if (!result.lower || !result.upper) return null;
  return Math.max(Math.abs(result.lower.value), Math.abs(result.upper.value));
}

export function ringdownCitations(entry: Entry, m: CompiledRingdownMapping, result: Pick<RingdownResult, "status" | "lower" | "upper" | "verdict">): RingdownCitations {
  const coupling = entry.couplings.find((c) => c.symbol === m.coupling.symbol);
  const spec: QuotedFormSpec = coupling?.quoted
    ? { form: coupling.quoted.form, symbol: coupling.quoted.symbol, latex: coupling.quoted.latex, unit: coupling.quoted.unit, ...(coupling.quoted.alpha_md === undefined ? {} : { alphaMd: coupling.quoted.alpha_md }) }
    : { form: "identity", symbol: m.coupling.symbol, latex: m.coupling.range === "any_sign" ? `|${m.coupling.latex}|` : m.coupling.latex, unit: m.coupling.unit };
  const magnitude = result.status === "bounded" ? magnitudeOf(m, result) : null;
  const shown = coupling?.convention ?? coupling?.conventions.find((c) => c.factor === 1)?.name ?? "canonical";
  const byConvention = new Map<string, QuotedValueDto[]>();
  const factors = new Map<string, number>([[shown, 1]]);
  let limit: QuotedValueDto | null = null;
  if (magnitude !== null && magnitude > 0) {
    const p = presentLimit(magnitude, "upper", spec);
    limit = { symbol: p.primary.symbol, latex: p.primary.latex, value: p.primary.value, unit: p.primary.unit, side: "upper" };
    byConvention.set(shown, [limit, ...p.extras.map((e) => ({ symbol: e.symbol, latex: e.latex, value: e.value, unit: e.unit, side: e.side }))]);
    for (const c of coupling?.conventions ?? []) {
      factors.set(c.name, c.factor);
      if (c.name !== shown) {
        const q = presentLimit(magnitude / c.factor, "upper", spec).primary;
        byConvention.set(c.name, [{ symbol: q.symbol, latex: q.latex, value: q.value, unit: q.unit, side: "upper" }]);
      }
    }
  }
  const withheld =
    result.status !== "bounded"
      ? "this entry gives no limit from this bound"
      : magnitude === null
        ? "this limit is one end of a signed interval, not a bound on the magnitude"
        : result.verdict === "outside_validity"
          ? "this limit is outside the validity of its mapping"
          : result.verdict === "not_assessed"
            ? "the validity of this limit is not assessed"
            : null;
  const known = knownBounds(entry, m.coupling.symbol);
  const reference_bounds = known.map((kb) => compareWithBound({ byConvention, shown, factors, form: spec.form, primarySymbol: spec.symbol, withheld }, kb));

  const mapping = entry.mappings[m.index];
  const keys = [...new Set([...(mapping?.references ?? []), ...known.map((k) => k.reference.key)])];
  const bibliography = keys.flatMap((k) => {
    const b = bibliographyOf(entry, k);
    return b ? [b] : [];
  });
  return {
    limit,
    reference_bounds,
    references: bibliography.map((b) => ({ key: b.key, citation: shortCitation(b) })),
    bibliography,
  };
}
