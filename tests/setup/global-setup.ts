import { execFileSync } from "node:child_process";
import type { TestProject } from "vitest/node";
import { createDb, migrateLatest } from "../../server/db/knex.ts";

/**
 * Runs once per vitest run: makes sure the test cluster is up (scripts/pg.sh is idempotent), then
 * migrates the template database that every test file clones (tests/helpers/db.ts). The cluster is
 * left running; scripts/test.sh stops it at the end.
 */
export const TEST_PG_PORT = process.env.TEST_PGPORT ?? "54339";
export const TEST_PGDATA_DIR = process.env.TEST_PGDATA_DIR ?? ".data/pg-test";
export const TEMPLATE_DB = "dragoman_test_template";

export default async function setup(project: TestProject): Promise<void> {
  const base = execFileSync("bash", ["scripts/pg.sh", "start"], {
    // The test cluster is throw-away: it may run without fsync (scripts/pg.sh, PG_THROWAWAY).
    env: { ...process.env, PGPORT: TEST_PG_PORT, PGDATA_DIR: TEST_PGDATA_DIR, PG_DATABASES: TEMPLATE_DB, PG_THROWAWAY: "1" },
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
  }).trim();
  const adminUrl = `${base}postgres`;
  const admin = createDb(adminUrl, { max: 1 });
  try {
    // Several vitest runs may share the cluster (developers running suites side by side): serialise.
    await admin.transaction(async (trx) => {
      await trx.raw("select pg_advisory_xact_lock(90210)");
      const tpl = createDb(`${base}${TEMPLATE_DB}`, { max: 1 });
      try {
        await migrateLatest(tpl);
      } finally {
        await tpl.destroy();
      }
    });
  } finally {
    await admin.destroy();
  }
  project.provide("pgBaseUrl", base);
  project.provide("templateDb", TEMPLATE_DB);
}

declare module "vitest" {
  export interface ProvidedContext {
    pgBaseUrl: string;
    templateDb: string;
  }
}
