/**
 * `npm run worker` (and the worker `npm start` runs next to the server): one worker process on
 * DATABASE_URL. Start as many as the load needs, on any machine that reaches the database. The
 * process runs at the lower priority WORKER_NICE, like the server's worker threads.
 */
import { parseConfig } from "../config.ts";
import { createDb } from "../db/knex.ts";
import { exitOnFatal } from "../index.ts";
import { createLogger } from "../logger.ts";
import { lowerProcessPriority } from "./priority.ts";
import { startWorker } from "./worker.ts";

async function main(): Promise<void> {
  const config = parseConfig();
  const logger = createLogger(config);
  // Before the pool and the queue start their threads, which then inherit the lower priority.
  const refused = lowerProcessPriority(config.WORKER_NICE);
  if (refused.length > 0) logger.warn({ refused, nice: config.WORKER_NICE }, "could not lower the worker's priority; it runs at the normal one");
  const db = createDb(config.DATABASE_URL, { max: 4 });
  const worker = await startWorker({ config, db, logger });
  process.stdout.write(`Dragoman worker ${process.pid} is taking jobs.\n`);
  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    await worker.stop();
    await db.destroy();
    process.exit(0);
  };
  process.on("SIGINT", () => void stop());
  process.on("SIGTERM", () => void stop());
}

main().catch(exitOnFatal);
