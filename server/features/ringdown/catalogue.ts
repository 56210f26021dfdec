import { theoryEntrySchema, type TheoryEntry } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import { compileMapping, type CatalogueTheory, type CompiledMapping } from "../../physics/catalogue-mapping.ts";
import { catalogueRevision } from "../catalogue/read-repository.ts";
import { compileRemnantMapping, compileRingdownMapping, type CompiledRemnantMapping, type CompiledRingdownMapping } from "../../physics/ringdown/ringdown-mapping.ts";

/**
 * The accepted catalogue as the ringdown translator sees it: each theory's current revision document
 * (which carries QNM modes and coupling ranges) with its ringdown mappings compiled, cached per
 * catalogue state. A mapping that does not compile is kept with its reason.
 */
export interface RingdownTheory {
  slug: string;
  name: string;
  revision: number;
  entry: TheoryEntry;
  mappings: CompiledRingdownMapping[];
  /** Remnant mappings: the fractional shift of the remnant's mass or spin the theory causes. */
  remnant: CompiledRemnantMapping[];
  /** Inspiral-phase mappings (beta at b), compiled as the translator compiles them: the inspiral side of the IMR test. */
  inspiral: CompiledMapping[];
  /** True when the entry has amplitude mappings, which the IMR-test bias does not model. */
  hasAmplitude: boolean;
  /** Inspiral-phase mappings that do not compile (kept apart: the ringdown translator lists only its own). */
  inspiralBroken: { index: number; reason: string }[];
  broken: { index: number; reason: string }[];
}

/** The entry in the shape the inspiral compiler reads (only what compiling a phase mapping needs). */
function inspiralShape(entry: TheoryEntry): CatalogueTheory {
  return {
    slug: entry.slug,
    couplings: entry.couplings.map((c) => ({
      symbol: c.symbol,
      latex: c.latex,
      dimension: c.dimension === 0 ? "1" : c.dimension === 1 ? "L" : `L^${c.dimension}`,
      unit: c.unit,
      ...(c.range ? { range: c.range } : {}),
      ...(c.gr_value ? { gr_value: c.gr_value } : {}),
    })),
    definitions: entry.definitions.map((d) => ({ symbol: d.symbol, expression: d.expression })),
    mappings: entry.mappings.map((m) => ({
      kind: m.kind,
      b: m.b ?? Number.NaN,
      ...(m.a === undefined ? {} : { a: m.a }),
      expression: m.expression,
      ...(m.coupling ? { coupling: m.coupling } : {}),
      ...(m.held_fixed ? { held_fixed: m.held_fixed } : {}),
      ...(m.alpha_md === undefined ? {} : { alpha_md: m.alpha_md }),
      validity: m.validity.map((v) => ({
        expression: v.expression,
        max: v.max,
        label: v.label,
        kind: v.kind,
        ...(v.body === undefined ? {} : { body: v.body }),
        ...(v.applies_to ? { applies_to: v.applies_to } : {}),
      })),
      body_rules: m.body_rules.map((r) => ({ kind: r.kind, description: r.description, ...(r.bodies ? { bodies: r.bodies } : {}) })),
      source_status: m.source_status,
      ...(m.caution ? { caution: m.caution } : {}),
    })),
  };
}

export interface RingdownCatalogue {
  load(): Promise<RingdownTheory[]>;
  /** The same, with the catalogue version it was read at (the token the translator and sheets use). */
  loadVersioned(): Promise<{ revision: string; theories: RingdownTheory[] }>;
}

export function ringdownCatalogue(db: Knex): RingdownCatalogue {
  let cached: { token: string; theories: RingdownTheory[] } | undefined;
  // The convert translator's token: a ringdown answer and an inspiral one name the same catalogue version.
  const token = (): Promise<string> => catalogueRevision(db);
  const loadVersioned = async (): Promise<{ revision: string; theories: RingdownTheory[] }> => {
      const now = await token();
      if (cached?.token === now) return { revision: now, theories: cached.theories };
      const rows = await db("theories as t")
        .join("theory_revisions as r", function join() {
          this.on("r.theory_id", "t.id").andOn("r.number", "t.current_revision");
        })
        .orderBy("t.name")
        .select<{ slug: string; name: string; number: number; entry: unknown }[]>("t.slug", "t.name", "r.number", "r.entry");
      const theories: RingdownTheory[] = [];
      for (const row of rows) {
        const parsed = theoryEntrySchema.safeParse(row.entry);
        if (!parsed.success) continue;
        const entry = parsed.data;
        // A retired entry leaves translations (it stays readable in the catalogue), as for inspiral bounds.
        if (entry.retired) continue;
        const mappings: CompiledRingdownMapping[] = [];
        const remnant: CompiledRemnantMapping[] = [];
        const inspiral: CompiledMapping[] = [];
        const inspiralBroken: { index: number; reason: string }[] = [];
        const broken: { index: number; reason: string }[] = [];
        let shape: CatalogueTheory | undefined;
        entry.mappings.forEach((m, i) => {
          if (m.retired) return;
          if (m.kind === "inspiral_phase") {
            try {
              shape ??= inspiralShape(entry);
              inspiral.push(compileMapping(shape, i));
            } catch (err) {
              inspiralBroken.push({ index: i, reason: err instanceof Error ? err.message : String(err) });
            }
            return;
          }
          const isRingdown = m.kind === "ringdown_frequency" || m.kind === "ringdown_damping";
          const isRemnant = m.kind === "remnant_mass" || m.kind === "remnant_spin";
          if (!isRingdown && !isRemnant) return;
          try {
            if (isRingdown) mappings.push(compileRingdownMapping(entry, i));
            else remnant.push(compileRemnantMapping(entry, i));
          } catch (err) {
            broken.push({ index: i, reason: err instanceof Error ? err.message : String(err) });
          }
        });
        const hasAmplitude = entry.mappings.some((m) => !m.retired && m.kind === "inspiral_amplitude");
        theories.push({ slug: row.slug, name: row.name, revision: row.number, entry, mappings, remnant, inspiral, inspiralBroken, hasAmplitude, broken });
      }
      cached = { token: now, theories };
      return { revision: now, theories };
  };
  return {
    loadVersioned,
    load: async () => (await loadVersioned()).theories,
  };
}
