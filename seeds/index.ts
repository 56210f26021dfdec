import type { Knex } from "knex";

export interface SeedStep {
  name: string;
  run: (trx: Knex.Transaction) => Promise<void>;
}

/** Seed steps in order. Later features append theirs (accounts, catalogue, demo scenario). */
export const demoSeedSteps: SeedStep[] = [];

/**
 * Seeds the demo data into an empty database, inside ONE transaction: an interrupted seed leaves
 * nothing behind, and a database that was seeded once is never seeded again (no duplicates, no wipes).
 */
export async function seedDemo(db: Knex, steps: SeedStep[] = demoSeedSteps): Promise<"seeded" | "already-seeded"> {
  return db.transaction(async (trx) => {
    // Serialise concurrent seeders (two npm start at once).
    await trx.raw("select pg_advisory_xact_lock(4711)");
    const done = await trx("seed_runs").where({ name: "demo" }).first();
    if (done) return "already-seeded" as const;
    for (const step of steps) await step.run(trx);
    await trx("seed_runs").insert({ name: "demo" });
    return "seeded" as const;
  });
}
