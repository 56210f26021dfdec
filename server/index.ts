import type { Server } from "node:http";
import { createApp, type AppDeps } from "./app.ts";
import { ConfigError, parseConfig, type Config } from "./config.ts";
import { createDb } from "./db/knex.ts";
import { createLogger } from "./logger.ts";
import { closeSymbolicPool, getSymbolicPool } from "./physics/expr/pool.ts";

export interface RunningServer {
  server: Server;
  url: string;
  close: () => Promise<void>;
}

/** Starts the HTTP server. Used by scripts/stack.ts (npm start) and by production (node --import tsx server/index.ts). */
export async function startServer(config: Config, extra: Partial<AppDeps> = {}): Promise<RunningServer> {
  const logger = extra.logger ?? createLogger(config);
  const db = extra.db ?? createDb(config.DATABASE_URL);
  const app = createApp({ db, config, logger, ...extra });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.PORT, config.HOST);
    s.once("listening", () => resolve(s));
    s.once("error", (err: NodeJS.ErrnoException) => {
      if (err.code === "EADDRINUSE") reject(new ConfigError(`Port ${config.PORT} on ${config.HOST} is already in use: stop the other program or start with PORT=<free port>.`));
      else reject(err);
    });
  });
  // A cold symbolic worker costs about a second; start them now rather than on the first check.
  getSymbolicPool()
    .warm()
    .catch((err: unknown) => logger.warn({ err }, "symbolic workers did not warm up"));
  const addr = server.address();
  const port = typeof addr === "object" && addr ? addr.port : config.PORT;
  const url = `http://${config.HOST}:${port}`;
  let closing: Promise<void> | undefined;
  const close = () =>
    (closing ??= (async () => {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
        setTimeout(() => server.closeAllConnections(), 5000).unref();
      });
      await app.locals.jobQueue.stop();
      await closeSymbolicPool();
      if (!extra.db) await db.destroy();
    })());
  return { server, url, close };
}

export function exitOnFatal(err: unknown): never {
  if (err instanceof ConfigError) {
    process.stderr.write(`dragoman: ${err.message}\n`);
  } else {
    process.stderr.write(`dragoman: could not start: ${err instanceof Error ? err.message : String(err)}\n`);
  }
  process.exit(1);
}

const isMain = import.meta.url === `file://${process.argv[1]}`;
if (isMain) {
  (async () => {
    const config = parseConfig();
    const running = await startServer(config);
    process.stdout.write(`Dragoman is serving on ${running.url}\n`);
    const stop = () => {
      running.close().then(
        () => process.exit(0),
        () => process.exit(1),
      );
    };
    process.once("SIGINT", stop);
    process.once("SIGTERM", stop);
  })().catch(exitOnFatal);
}
