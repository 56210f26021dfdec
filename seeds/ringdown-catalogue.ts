import { theoryEntrySchema, type TheoryEntryInput } from "../common/catalogue.ts";
import type { Knex } from "../server/db/knex.ts";
import { ConflictError } from "../server/errors.ts";
import { checkEntry, guardEntryExpressions } from "../server/features/catalogue/entry-checks.ts";
import { publishEntry } from "../server/features/catalogue/publish.ts";
import { latestRevisionEntryOf } from "../server/features/catalogue/revision-repository.ts";
import { inProcessCheckRunner } from "../server/features/expressions/check-runner.ts";
import { edgbRingdownMappings, johannsenPsaltis, johannsenRingdownMappings, remnantDeviation, RINGDOWN_REFS, ringdownDeviation } from "./data/theories-ringdown.ts";
import type { SeedStep } from "./index.ts";

/**
 * Ringdown content, published through the same code as an accepted submission: two new entries, and a
 * new revision of the Johannsen 2013 entry that adds its ringdown mappings (and the reference they cite).
 */
async function publish(trx: Knex.Transaction, input: TheoryEntryInput, targetSlug: string | null, acceptedBy: number | null, now: Date) {
  const entry = theoryEntrySchema.parse(input);
  const runner = inProcessCheckRunner();
  await guardEntryExpressions(entry, runner, "seed", `${entry.slug}.`);
  const checks = await checkEntry(entry, runner, "seed", now);
  return publishEntry(trx, entry, checks, { targetSlug, submissionId: null, authorId: null, acceptedBy, now });
}

/** The current Johannsen 2013 entry with the ringdown mappings added, or null when it is absent or already has them. */
export async function johannsenWithRingdown(trx: Knex.Transaction): Promise<TheoryEntryInput | null> {
  return withRingdown(trx, "johannsen", johannsenRingdownMappings);
}

/** The current EdGB entry with its (eikonal, from-memory) ringdown mappings added, or null when absent or already there. */
export async function edgbWithRingdown(trx: Knex.Transaction): Promise<TheoryEntryInput | null> {
  return withRingdown(trx, "edgb", edgbRingdownMappings);
}

async function withRingdown(trx: Knex.Transaction, slug: string, added: TheoryEntryInput["mappings"]): Promise<TheoryEntryInput | null> {
  const theory = await trx("theories").where({ slug }).first<{ id: number } | undefined>("id");
  if (!theory) return null;
  const latest = await latestRevisionEntryOf(trx, theory.id);
  const parsed = theoryEntrySchema.safeParse(latest?.entry);
  if (!parsed.success) return null;
  const entry = parsed.data;
  if (entry.mappings.some((m) => m.kind === "ringdown_frequency" || m.kind === "ringdown_damping")) return null;
  const haveKey = entry.references.some((r) => r.key === RINGDOWN_REFS.cardoso2009.key);
  return {
    ...entry,
    mappings: [...entry.mappings, ...added],
    references: haveKey ? entry.references : [...entry.references, RINGDOWN_REFS.cardoso2009],
  };
}

export const ringdownCatalogueSeed: SeedStep = {
  name: "ringdown-catalogue",
  run: async (trx) => {
    const editor = await trx("users").where({ login: "demo-editor" }).first<{ id: number } | undefined>("id");
    const now = new Date();
    const steps: [TheoryEntryInput | null, string | null][] = [
      [ringdownDeviation, null],
      [remnantDeviation, null],
      [johannsenPsaltis, null],
      [await johannsenWithRingdown(trx), "johannsen"],
      [await edgbWithRingdown(trx), "edgb"],
    ];
    for (const [entry, target] of steps) {
      if (!entry) continue;
      try {
        await publish(trx, entry, target, editor?.id ?? null, now);
      } catch (err) {
        // Same policy as the first catalogue step: a refused entry is reported, and a test fails on it.
        if (!(err instanceof ConflictError)) throw err;
        process.stderr.write(`ringdown catalogue seed: left out "${entry.slug}": ${err.message}\n`);
      }
    }
  },
};
