import type { Knex } from "knex";
import { accountsSeed } from "./accounts.ts";
import { catalogueSeed } from "./catalogue.ts";
import { amplitudeCatalogueSeed } from "./amplitude-catalogue.ts";
import { catalogueWave2bSeed, catalogueWave2cSeed, catalogueWave2Seed } from "./catalogue-wave2.ts";
import { demoScenarioSeed } from "./demo-scenario.ts";
import { ringdownCatalogueSeed } from "./ringdown-catalogue.ts";
import { sheetsSeed } from "./sheets.ts";

export interface SeedStep {
  name: string;
  run: (trx: Knex.Transaction) => Promise<void>;
}

/** Seed steps in order. Later features append theirs (accounts, catalogue, demo scenario). */
// sheetsSeed comes last: it translates the demo analyst's sheet against the whole seeded catalogue, so a
// fresh demo's sheet is current (a catalogue step after it would mark the sheet's translations stale).
export const demoSeedSteps: SeedStep[] = [accountsSeed, catalogueSeed, demoScenarioSeed, ringdownCatalogueSeed, catalogueWave2Seed, catalogueWave2bSeed, amplitudeCatalogueSeed, catalogueWave2cSeed, sheetsSeed];

/**
 * Seeds the demo data inside ONE transaction: an interrupted seed leaves nothing behind. Each step is
 * recorded by name in seed_runs and never runs twice, so a seeded database is never duplicated or
 * wiped; a step added by a later release (a new feature's demo data) is applied once on the next start.
 */
export async function seedDemo(db: Knex, steps: SeedStep[] = demoSeedSteps): Promise<"seeded" | "already-seeded"> {
  const applied = await seedSteps(db, steps);
  return applied.length ? "seeded" : "already-seeded";
}

/** Runs the steps not yet recorded, in order, and returns their names. */
export async function seedSteps(db: Knex, steps: SeedStep[] = demoSeedSteps): Promise<string[]> {
  return db.transaction(async (trx) => {
    // Serialise concurrent seeders (two npm start at once).
    await trx.raw("select pg_advisory_xact_lock(4711)");
    const done = new Set((await trx("seed_runs").select<{ name: string }[]>("name")).map((r) => r.name));
    const applied: string[] = [];
    for (const step of steps) {
      if (done.has(step.name)) continue;
      await step.run(trx);
      await trx("seed_runs").insert({ name: step.name });
      applied.push(step.name);
    }
    return applied;
  });
}
