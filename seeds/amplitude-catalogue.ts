import { ConflictError } from "../server/errors.ts";
import { publishWave2Entry } from "./catalogue-wave2.ts";
import { THEORIES_AMPLITUDE } from "./data/theories-amplitude.ts";
import type { SeedStep } from "./index.ts";

/**
 * The amplitude entries (birefringence, modified friction, the dipole amplitude), published as revision 1
 * each through the accept path: a step of its own, recorded in seed_runs, so an existing database gains
 * them once. A slug already taken is left alone.
 */
export const amplitudeCatalogueSeed: SeedStep = {
  name: "catalogue-amplitude",
  run: async (trx) => {
    const editor = await trx("users").where({ login: "demo-editor" }).first<{ id: number } | undefined>("id");
    const now = new Date();
    for (const input of THEORIES_AMPLITUDE) {
      const taken = await trx("theories").where({ slug: input.slug }).first<{ id: number } | undefined>("id");
      if (taken) continue;
      try {
        await publishWave2Entry(trx, input, editor?.id ?? null, now);
      } catch (err) {
        // A refused entry must not take the demo down; tests/physics/seeded-amplitude.test.ts fails on it instead.
        if (!(err instanceof ConflictError)) throw err;
        process.stderr.write(`catalogue seed (amplitude): left out "${input.slug}": ${err.message}\n`);
      }
    }
  },
};
