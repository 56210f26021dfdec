import { parseConfig, type Config } from "../../server/config.ts";
import { createApp, type AppDeps } from "../../server/app.ts";
import { createLogger } from "../../server/logger.ts";
import type { TestDatabase } from "./db.ts";

export function testConfig(databaseUrl: string, overrides: Record<string, string> = {}): Config {
  return parseConfig({
    NODE_ENV: "test",
    DATABASE_URL: databaseUrl,
    SESSION_SECRET: "test-secret-test-secret-test-secret-0123",
    LOG_LEVEL: "silent",
    // Suites send many requests from one address; a test that wants to see a 429 sets its own limit.
    RATE_LIMIT_PER_MINUTE: "100000",
    // Workers at the normal priority: on a loaded test machine lower-priority check workers could be
    // starved into their time limits (tests/physics/worker-priority.test.ts covers the setting itself).
    WORKER_NICE: "0",
    ...overrides,
  });
}

export function buildTestApp(tdb: TestDatabase, overrides: Record<string, string> = {}, extra: Partial<AppDeps> = {}) {
  const config = testConfig(tdb.url, overrides);
  return createApp({ db: tdb.db, config, logger: createLogger(config), ...extra });
}
