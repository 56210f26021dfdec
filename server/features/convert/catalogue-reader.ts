import { conditionText } from "../../../common/symbol-text.ts";
import type { BibliographyEntry } from "../../../common/convert.ts";
import type { StoredReference, TheoryDetail } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import type { CatalogueTheory } from "../../physics/catalogue-mapping.ts";
import { catalogueRevision, getTheoryDetail } from "../catalogue/read-repository.ts";
import type { AcceptedTheory, CatalogueReader } from "./catalogue-snapshot.ts";

/**
 * Reads the accepted catalogue through the catalogue's own repository and reshapes each entry for the
 * translator. The revision token is one aggregate query, so a request with a warm cache costs a
 * single round trip; the full read happens once per catalogue change.
 */

/** 2 -> "L^2", 1 -> "L", 0 -> "1": the length-power notation the mapping compiler reads. */
function dimensionText(power: number): string {
  if (power === 0) return "1";
  if (power === 1) return "L";
  return `L^${power}`;
}

function keyOf(ref: StoredReference): string {
  return ref.key ?? `ref-${ref.id}`;
}

export function bibliographyEntry(ref: StoredReference): BibliographyEntry {
  return {
    key: keyOf(ref),
    authors: ref.authors,
    title: ref.title,
    year: ref.year,
    journal: ref.journal,
    volume: ref.volume,
    pages: ref.pages,
    arxiv: ref.arxiv,
    doi: ref.doi,
  };
}

export function acceptedTheoryOf(detail: TheoryDetail): AcceptedTheory {
  const entry: CatalogueTheory = {
    slug: detail.slug,
    couplings: detail.couplings.map((c) => ({
      symbol: c.symbol,
      latex: c.latex,
      dimension: dimensionText(c.dimension),
      unit: c.unit,
      ...(c.quoted
        ? {
            quoted: {
              form: c.quoted.form,
              symbol: c.quoted.symbol,
              latex: c.quoted.latex,
              unit: c.quoted.unit,
              ...(c.quoted.alpha_md === undefined ? {} : { alpha_md: c.quoted.alpha_md }),
            },
          }
        : {}),
      ...(c.convention ? { convention: c.convention } : {}),
      ...(c.range ? { range: c.range } : {}),
      ...(c.gr_value ? { gr_value: c.gr_value } : {}),
      conventions: c.conventions.map((cv) => ({ name: cv.name, factor: cv.factor, ...(cv.reference ? { reference: keyOf(cv.reference) } : {}) })),
    })),
    definitions: detail.definitions.map((d) => ({ symbol: d.symbol, expression: d.expression })),
    mappings: detail.mappings.map((m) => ({
      kind: m.kind,
      b: m.b ?? Number.NaN,
      ...(m.a === null ? {} : { a: m.a }),
      expression: m.expression,
      coupling: m.coupling,
      ...(m.held_fixed ? { held_fixed: m.held_fixed } : {}),
      ...(m.alpha_md === null ? {} : { alpha_md: m.alpha_md }),
      validity: m.validity.map((v) => ({
        expression: v.expression,
        max: v.max,
        // Conditions stored in ASCII (entries published before labels were typeset) read as mathematics.
        label: conditionText(v.label),
        kind: v.kind,
        ...(v.reference ? { reference: keyOf(v.reference) } : v.reference_note ? { reference: v.reference_note } : {}),
        ...(v.body === null ? {} : { body: v.body }),
        ...(v.applies_to === null ? {} : { applies_to: v.applies_to }),
      })),
      body_rules: m.body_rules.map((r) => ({ kind: r.kind, description: r.description, ...(r.bodies ? { bodies: r.bodies } : {}) })),
      source_status: m.source_status,
      ...(m.caution ? { caution: conditionText(m.caution) } : {}),
    })),
  };
  const references = new Map<string, BibliographyEntry>();
  const remember = (r: StoredReference) => {
    if (!references.has(keyOf(r))) references.set(keyOf(r), bibliographyEntry(r));
  };
  detail.references.forEach(remember);
  detail.mappings.forEach((m) => m.references.forEach(remember));
  detail.reference_bounds.forEach((b) => remember(b.reference));
  return {
    slug: detail.slug,
    name: detail.name,
    revision: detail.revision.number,
    entry,
    notes: detail.mappings.map((m) => ({ latex: m.latex, pnOrder: m.pn_order, sourceStatus: m.source_status, referenceKeys: m.references.map(keyOf) })),
    referenceBounds: detail.reference_bounds.map((b) => ({
      symbol: b.quoted_symbol ?? b.coupling,
      value: b.value,
      unit: b.unit,
      side: b.side,
      convention: b.convention,
      credibility: b.credibility,
      note: b.note ?? b.data,
      reference: { key: keyOf(b.reference), authors: b.reference.authors, year: b.reference.year },
    })),
    references: [...references.values()],
  };
}

export function dbCatalogueReader(db: Knex): CatalogueReader {
  const revision = (): Promise<string> => catalogueRevision(db);
  return {
    revision,
    async load() {
      const token = await revision();
      const slugs = await db("theories").orderBy("name").pluck<string[]>("slug");
      const details: TheoryDetail[] = [];
      // One theory at a time: a cache miss should not take every pooled connection.
      for (const slug of slugs) {
        const d = await getTheoryDetail(db, slug);
        // Retired entries and mappings leave translations (and everything built on them); they stay readable in the catalogue.
        const live = d && !d.retired ? { ...d, mappings: d.mappings.filter((m) => !m.retired) } : undefined;
        if (live?.mappings.length) details.push(live);
      }
      return { revision: token, theories: details.map(acceptedTheoryOf) };
    },
  };
}
