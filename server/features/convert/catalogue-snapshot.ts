import type { BibliographyEntry } from "../../../common/convert.ts";
import type { CatalogueTheory } from "../../physics/catalogue-mapping.ts";
import type { KnownBound } from "./reference-compare.ts";

/**
 * What the translator needs to know about the accepted catalogue, independent of how it is stored:
 * each theory's entry in the shape the physics compiler reads, plus what is shown beside a result
 * (names, formulas as LaTeX, sources, published bounds, references).
 */
export interface MappingNotes {
  latex: string | null;
  pnOrder: number | null;
  sourceStatus: "confirmed" | "derived" | "memory" | null;
  /** Keys into the theory's references. */
  referenceKeys: string[];
}

export interface AcceptedTheory {
  slug: string;
  name: string;
  revision: number;
  entry: CatalogueTheory;
  /** Parallel to entry.mappings. */
  notes: MappingNotes[];
  referenceBounds: KnownBound[];
  references: BibliographyEntry[];
}

export interface CatalogueSnapshot {
  /** Changes whenever any accepted entry changes; compiled mappings are cached under it. */
  revision: string;
  theories: AcceptedTheory[];
}

export interface CatalogueReader {
  /** A cheap token that changes when the accepted catalogue changes. */
  revision(): Promise<string>;
  load(): Promise<CatalogueSnapshot>;
}
