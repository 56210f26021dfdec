import { createServer, type RequestListener, type Server } from "node:http";
import { createApp, type AppDeps } from "./app.ts";
import { ConfigError, parseConfig, type Config } from "./config.ts";
import { createDb } from "./db/knex.ts";
import { createLogger } from "./logger.ts";
import { closeForecastPool } from "./features/forecasts/pool.ts";
import { closeBodyPool, configureBodyPool, getBodyPool } from "./http/body-pool.ts";
import { closeSymbolicPool, configureSymbolicPool, getSymbolicPool } from "./physics/expr/pool.ts";

export interface RunningServer {
  server: Server;
  url: string;
  close: () => Promise<void>;
}

/**
 * The HTTP server with its timeouts: a client must send its headers within HEADERS_TIMEOUT_MS and the
 * whole request (body included) within REQUEST_TIMEOUT_MS, or it gets 408 and the connection is
 * closed; an idle keep-alive connection closes after KEEP_ALIVE_TIMEOUT_MS. Node checks the first two
 * every connectionsCheckingInterval, so that interval is kept short.
 */
export function createHttpServer(app: RequestListener, config: Pick<Config, "REQUEST_TIMEOUT_MS" | "HEADERS_TIMEOUT_MS" | "KEEP_ALIVE_TIMEOUT_MS">): Server {
  const server = createServer(
    {
      requestTimeout: config.REQUEST_TIMEOUT_MS,
      headersTimeout: config.HEADERS_TIMEOUT_MS,
      keepAliveTimeout: config.KEEP_ALIVE_TIMEOUT_MS,
      connectionsCheckingInterval: Math.min(1000, config.HEADERS_TIMEOUT_MS),
    },
    app,
  );
  return server;
}

/** Starts the HTTP server. Used by scripts/stack.ts (npm start) and by production (node --import tsx server/index.ts). */
export async function startServer(config: Config, extra: Partial<AppDeps> = {}): Promise<RunningServer> {
  const logger = extra.logger ?? createLogger(config);
  configureSymbolicPool({ nice: config.WORKER_NICE });
  configureBodyPool({ nice: config.WORKER_NICE });
  const db = extra.db ?? createDb(config.DATABASE_URL);
  const app = createApp({ db, config, logger, ...extra });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = createHttpServer(app, config);
    s.listen(config.PORT, config.HOST);
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
  app.locals.checkPool.warm().catch((err: unknown) => logger.warn({ err }, "check workers did not warm up"));
  getBodyPool()
    .warm()
    .catch((err: unknown) => logger.warn({ err }, "the body worker did not warm up"));
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
      await app.locals.checkPool.close();
      await app.locals.jobQueue.stop();
      await closeSymbolicPool();
      await closeForecastPool();
      await closeBodyPool();
      if (!extra.db) {
        app.locals.dbBreaker.stop();
        await db.destroy();
      }
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
