/**
 * npm start, after scripts/start.sh has installed dependencies, started PostgreSQL and built the
 * client: starts the local fakes of hosted services, migrates, seeds the demo data once, serves.
 */
import { spawn } from "node:child_process";
import { parseConfig } from "../server/config.ts";
import { createDb, migrateLatest } from "../server/db/knex.ts";
import { exitOnFatal, startServer } from "../server/index.ts";
import { createLogger } from "../server/logger.ts";
import { seedSteps } from "../seeds/index.ts";
import { startLocalFakes } from "./fakes.ts";

async function main(): Promise<void> {
  const base = parseConfig();
  const fakes = await startLocalFakes(base);
  const config = parseConfig({ ...process.env, ...fakes.env });
  const logger = createLogger(config);
  const db = createDb(config.DATABASE_URL);
  const applied = await migrateLatest(db);
  if (applied.length) process.stdout.write(`Applied ${applied.length} migration(s).\n`);
  const seeded = await seedSteps(db);
  process.stdout.write(seeded.length ? `Seeded demo data: ${seeded.join(", ")}.\n` : "Demo data already present: kept as is.\n");
  const running = await startServer(config, { db, logger });
  // One job worker in its own process next to the server (docs/samples-jobs.md); `npm run worker` adds more.
  const worker = spawn(process.execPath, ["--import", "tsx", "server/jobs/worker-main.ts"], { stdio: "inherit", env: { ...process.env, ...fakes.env } });
  process.stdout.write(`\nDragoman is running at ${running.url}\n${fakes.describe()}Press Ctrl-C to stop.\n`);

  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    process.stdout.write("\nStopping Dragoman...\n");
    worker.kill("SIGTERM");
    await running.close();
    await db.destroy();
    await fakes.close();
    process.exit(0);
  };
  process.on("SIGINT", () => void stop());
  process.on("SIGTERM", () => void stop());
}

main().catch(exitOnFatal);
