import { catalogueBatchSeed } from "./catalogue-wave2.ts";
import { THEORIES_AMPLITUDE } from "./data/theories-amplitude.ts";
import type { SeedStep } from "./index.ts";

/**
 * The amplitude entries (birefringence, modified friction, the dipole amplitude), published as revision 1
 * each through the accept path: a step of its own, recorded in seed_runs, so an existing database gains
 * them once. A slug already taken is left alone; a refused entry is left out with a message, and
 * tests/physics/seeded-amplitude.test.ts fails on it instead.
 */
export const amplitudeCatalogueSeed: SeedStep = catalogueBatchSeed("catalogue-amplitude", THEORIES_AMPLITUDE);
