import type { BibliographyEntry } from "../../common/convert.ts";
import { THEORIES, type TheoryEntry } from "../../seeds/data/theories.ts";
import type { AcceptedTheory, CatalogueSnapshot } from "../../server/features/convert/catalogue-snapshot.ts";
import { compileCatalogue, type CompiledCatalogue } from "../../server/features/convert/compiled-catalogue.ts";

/**
 * The seeded catalogue content, compiled without a database: for the science checks of the
 * translator, which must not depend on how the catalogue is stored.
 */
export function seedTheory(entry: TheoryEntry): AcceptedTheory {
  const references: BibliographyEntry[] = entry.references.map((r) => ({
    key: r.key,
    authors: r.authors.split(/,\s+/).filter(Boolean),
    title: r.title,
    year: r.year,
    journal: r.journal ?? null,
    volume: null,
    pages: null,
    arxiv: r.arxiv ?? null,
    doi: r.doi ?? null,
  }));
  const byKey = new Map(references.map((r) => [r.key, r]));
  return {
    slug: entry.slug,
    name: entry.name,
    revision: 1,
    entry,
    notes: entry.mappings.map((m) => ({ latex: m.latex ?? null, pnOrder: m.pn_order, sourceStatus: m.source_status, referenceKeys: [...(m.references ?? [])] })),
    referenceBounds: (entry.reference_bounds ?? []).map((b) => {
      const ref = byKey.get(b.reference);
      return {
        symbol: b.quoted_symbol,
        value: b.value,
        unit: b.unit,
        side: b.side,
        convention: b.convention ?? null,
        credibility: b.credibility ?? null,
        note: b.note ?? null,
        reference: { key: b.reference, authors: ref?.authors ?? [], year: ref?.year ?? 0 },
      };
    }),
    references,
  };
}

export function seedSnapshot(): CatalogueSnapshot {
  return { revision: "seed", theories: THEORIES.map(seedTheory) };
}

export function seedCatalogue(): CompiledCatalogue {
  return compileCatalogue(seedSnapshot());
}
