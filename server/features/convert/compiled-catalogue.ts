import { compileMapping, type CompiledMapping } from "../../physics/catalogue-mapping.ts";
import type { AcceptedTheory, CatalogueSnapshot, MappingNotes } from "./catalogue-snapshot.ts";

/**
 * The accepted catalogue with every inspiral-phase and amplitude mapping compiled to a plain function, built once
 * per catalogue revision. A mapping that does not compile is kept with its reason, so the theory is
 * listed as not applicable with that reason rather than silently missing.
 */
export interface ReadyMapping {
  compiled: CompiledMapping;
  notes: MappingNotes;
}

export interface CompiledTheory {
  theory: AcceptedTheory;
  mappings: ReadyMapping[];
  /** Every b this theory's phase mappings enter at (compiled or not), for "enters at b = ...". */
  bs: number[];
  broken: { b: number | null; reason: string }[];
  /** True when the entry has no inspiral-phase mapping at all (only ringdown or amplitude). */
  noPhaseMapping: boolean;
  /** The amplitude mappings (alpha at a; a distance ratio is the term at a = 0), compiled like the phase ones. */
  amplitude: ReadyMapping[];
  /** Every a this theory's amplitude mappings enter at. */
  as: number[];
  amplitudeBroken: { a: number | null; reason: string }[];
}

export interface CompiledCatalogue {
  revision: string;
  theories: CompiledTheory[];
  bySlug: ReadonlyMap<string, CompiledTheory>;
}

const EMPTY_NOTES: MappingNotes = { latex: null, pnOrder: null, sourceStatus: null, referenceKeys: [] };

export function compileCatalogue(snapshot: CatalogueSnapshot): CompiledCatalogue {
  const theories = snapshot.theories.map((theory): CompiledTheory => {
    const mappings: ReadyMapping[] = [];
    const broken: CompiledTheory["broken"] = [];
    const bs: number[] = [];
    const amplitude: ReadyMapping[] = [];
    const amplitudeBroken: CompiledTheory["amplitudeBroken"] = [];
    const as: number[] = [];
    theory.entry.mappings.forEach((m, i) => {
      if (m.kind === "inspiral_amplitude") {
        const a = m.a !== undefined && Number.isFinite(m.a) ? m.a : null;
        if (a !== null) as.push(a);
        try {
          amplitude.push({ compiled: compileMapping(theory.entry, i), notes: theory.notes[i] ?? EMPTY_NOTES });
        } catch (err) {
          amplitudeBroken.push({ a, reason: err instanceof Error ? err.message : String(err) });
        }
        return;
      }
      if (m.kind !== "inspiral_phase") return;
      if (Number.isFinite(m.b)) bs.push(m.b);
      try {
        mappings.push({ compiled: compileMapping(theory.entry, i), notes: theory.notes[i] ?? EMPTY_NOTES });
      } catch (err) {
        broken.push({ b: Number.isFinite(m.b) ? m.b : null, reason: err instanceof Error ? err.message : String(err) });
      }
    });
    return {
      theory,
      mappings,
      bs: [...new Set(bs)].sort((a, b) => a - b),
      broken,
      noPhaseMapping: bs.length === 0 && broken.length === 0,
      amplitude,
      as: [...new Set(as)].sort((x, y) => x - y),
      amplitudeBroken,
    };
  });
  return { revision: snapshot.revision, theories, bySlug: new Map(theories.map((t) => [t.theory.slug, t])) };
}
