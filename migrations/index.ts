import type { Knex } from "knex";
import * as platform from "./20261201000000_platform.ts";

/**
 * Every migration, in order. Listed explicitly (not read from the folder) so that the same code runs
 * under tsx, vitest and a bundled server; tests/platform/migrations.test.ts fails if a file is missing here.
 */
export const migrations: Record<string, Knex.Migration> = {
  "20261201000000_platform": platform,
};
