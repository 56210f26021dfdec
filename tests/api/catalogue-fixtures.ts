import type { TheoryEntryInput } from "../../common/catalogue.ts";
import type { Knex } from "../../server/db/knex.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";

/**
 * Shared inputs for the catalogue and review tests (not a test file itself).
 *
 * The toy entry is a scalar-dipole mapping with the EdGB normalisation of the project's physics
 * form (Yagi 2012, PRD 86 081504): beta = -(5/7168) zeta (m1^2 s2 - m2^2 s1)^2 / (M^4 eta^(18/5)),
 * zeta = 16 pi alpha^2 / M^4, b = -7 at -1PN. It passes every engine check.
 */
export function toyEntry(overrides: Partial<TheoryEntryInput> = {}): TheoryEntryInput {
  return {
    slug: "toy-dipole",
    name: "Toy scalar dipole (test entry)",
    family: "scalar-tensor",
    summary: "A test entry: scalar dipole radiation with the EdGB normalisation.",
    couplings: [{ symbol: "alpha", latex: "\\alpha", dimension: 2, unit: "km^2" }],
    definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }],
    mappings: [
      {
        kind: "inspiral_phase",
        pn_order: -1,
        b: -7,
        expression: "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))",
        validity: [{ expression: "16*pi*alpha^2/m1^4", max: 1 / 6, label: "small coupling on body 1" }],
      },
    ],
    references: [
      { key: "yunes-pretorius-2009", arxiv: "0909.3328", doi: "10.1103/PhysRevD.80.122003", authors: ["N. Yunes", "F. Pretorius"], title: "Fundamental theoretical bias in gravitational wave astrophysics and the parametrized post-Einsteinian framework", year: 2009 },
    ],
    ...overrides,
  };
}

/** The same entry with a dimension error: alpha (length^2) where the dimensionless zeta belongs. */
export function dimensionErrorEntry(): TheoryEntryInput {
  const e = toyEntry();
  return { ...e, mappings: [{ kind: "inspiral_phase", pn_order: -1, b: -7, expression: "-(5/7168)*alpha*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))" }] };
}

/** Seeds the accepted catalogue (seeds/data/theories.ts) as npm start does, in one transaction. */
export async function seedCatalogue(db: Knex): Promise<void> {
  await db.transaction((trx) => catalogueSeed.run(trx));
}
