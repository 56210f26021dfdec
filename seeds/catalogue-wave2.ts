import { theoryEntrySchema, type TheoryEntryInput } from "../common/catalogue.ts";
import type { Knex } from "../server/db/knex.ts";
import { ConflictError } from "../server/errors.ts";
import { checkEntry, guardEntryExpressions } from "../server/features/catalogue/entry-checks.ts";
import { publishEntry } from "../server/features/catalogue/publish.ts";
import { inProcessCheckRunner } from "../server/features/expressions/check-runner.ts";
import { THEORIES_WAVE2, THEORIES_WAVE2_B, THEORIES_WAVE2_C } from "./data/theories-wave2.ts";
import type { SeedStep } from "./index.ts";

/**
 * The second batch of entries, published as revision 1 each through the accept path (schema,
 * engine checks stored, refused if a check fails). A step of its own, recorded in seed_runs, so an
 * existing database gains these entries once and a fresh one gets them after the first batch. An
 * entry whose slug is already taken (a contributor got there first) is left alone.
 */
export async function publishWave2Entry(trx: Knex.Transaction, input: TheoryEntryInput, acceptedBy: number | null, now: Date) {
  const entry = theoryEntrySchema.parse(input);
  const runner = inProcessCheckRunner();
  await guardEntryExpressions(entry, runner, "seed", `${entry.slug}.`);
  const checks = await checkEntry(entry, runner, "seed", now);
  return publishEntry(trx, entry, checks, { targetSlug: null, submissionId: null, authorId: null, acceptedBy, now });
}

/**
 * A seed step publishing a batch of entries once. A batch written after databases already ran an earlier
 * step gets a step (and name) of its own, so those databases gain it on their next start.
 */
export function catalogueBatchSeed(name: string, entries: readonly TheoryEntryInput[]): SeedStep {
  return {
    name,
    run: async (trx) => {
      const editor = await trx("users").where({ login: "demo-editor" }).first<{ id: number } | undefined>("id");
      const now = new Date();
      for (const input of entries) {
        const taken = await trx("theories").where({ slug: input.slug }).first<{ id: number } | undefined>("id");
        if (taken) continue;
        try {
          await publishWave2Entry(trx, input, editor?.id ?? null, now);
        } catch (err) {
          // A refused entry must not take the demo down; the seeded-* tests of tests/physics fail on it instead.
          if (!(err instanceof ConflictError)) throw err;
          process.stderr.write(`catalogue seed (${name}): left out "${input.slug}": ${err.message}\n`);
        }
      }
    },
  };
}

export const catalogueWave2Seed: SeedStep = catalogueBatchSeed("catalogue-wave2", THEORIES_WAVE2);
/** Einstein-aether and massive scalar-tensor gravity, added after "catalogue-wave2" had run on existing databases. */
export const catalogueWave2bSeed: SeedStep = catalogueBatchSeed("catalogue-wave2-b", THEORIES_WAVE2_B);
/** Massive dark-photon charges, added after "catalogue-wave2-b" had run. */
export const catalogueWave2cSeed: SeedStep = catalogueBatchSeed("catalogue-wave2-c", THEORIES_WAVE2_C);
