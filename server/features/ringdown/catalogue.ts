import { theoryEntrySchema, type TheoryEntry } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
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
  broken: { index: number; reason: string }[];
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
        const mappings: CompiledRingdownMapping[] = [];
        const remnant: CompiledRemnantMapping[] = [];
        const broken: { index: number; reason: string }[] = [];
        entry.mappings.forEach((m, i) => {
          if (m.retired) return;
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
        theories.push({ slug: row.slug, name: row.name, revision: row.number, entry, mappings, remnant, broken });
      }
      cached = { token: now, theories };
      return { revision: now, theories };
  };
  return {
    loadVersioned,
    load: async () => (await loadVersioned()).theories,
  };
}
