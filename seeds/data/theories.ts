/**
 * The catalogue's seeded theories, as plain typed data (no database code). Each mapping records
 * whether its formula is confirmed against a paper, re-derived, or recalled from memory; entries
 * resting on memory carry `needs_source_confirmation` for an editor.
 */
import { bransDicke, dcs, edgb, scalarDipole } from "./theories-quadratic-scalar.ts";
import { dispersionEntries, massiveGraviton } from "./theories-propagation.ts";
import { extraDimension, varyingG } from "./theories-secular.ts";
import { johannsen, noncommutative } from "./theories-spacetime.ts";
import type { TheoryEntry } from "./theory-entry.ts";

export type { TheoryEntry } from "./theory-entry.ts";

export const THEORIES: readonly TheoryEntry[] = [
  edgb,
  dcs,
  bransDicke,
  scalarDipole,
  massiveGraviton,
  ...dispersionEntries,
  varyingG,
  extraDimension,
  noncommutative,
  johannsen,
];

export function theoryBySlug(slug: string): TheoryEntry | undefined {
  return THEORIES.find((t) => t.slug === slug);
}
