import { existsSync } from "node:fs";
import path from "node:path";
import compression from "compression";
import express, { type Express, type RequestHandler } from "express";
import { pinoHttp } from "pino-http";
import type { Config } from "./config.ts";
import { attachBreaker, type DbBreaker } from "./db/breaker.ts";
import type { Knex } from "./db/knex.ts";
import { installAuth } from "./auth/install-auth.ts";
import { accountsRoutes } from "./features/accounts/routes.ts";
import { adminRoutes } from "./features/admin/routes.ts";
import { catalogueApiRoutes } from "./features/catalogue/api.ts";
import { dbCatalogueReader } from "./features/convert/catalogue-reader.ts";
import { consistencyJobRoutes } from "./features/consistency/job-routes.ts";
import { consistencyRoutes } from "./features/consistency/routes.ts";
import { ringdownCatalogue } from "./features/ringdown/catalogue.ts";
import { ringdownRoutes } from "./features/ringdown/routes.ts";
import { ringdownService } from "./features/ringdown/service.ts";
import { convertRoutes } from "./features/convert/routes.ts";
import { samplesRoutes } from "./features/convert/samples-routes.ts";
import { convertService } from "./features/convert/service.ts";
import { createCheckRunner } from "./features/expressions/check-runner.ts";
import { expressionRoutes } from "./features/expressions/routes.ts";
import { forecastJobRoutes } from "./features/forecasts/job-routes.ts";
import { getForecastPool } from "./features/forecasts/pool.ts";
import { curvesRepository } from "./features/forecasts/repository.ts";
import { forecastsRoutes } from "./features/forecasts/routes.ts";
import { forecastsService } from "./features/forecasts/service.ts";
import { healthRoutes } from "./features/health/routes.ts";
import { createJobQueue, type JobQueue } from "./features/jobs/queue.ts";
import { jobsRoutes } from "./features/jobs/routes.ts";
import { jobsService } from "./features/jobs/service.ts";
import { apiNotFound, errorMiddleware } from "./http/error-middleware.ts";
import { precompressedAssets } from "./http/precompressed.ts";
import { redactUrl } from "./http/redact-url.ts";
import { RouteTable } from "./http/route.ts";
import { textGuard } from "./http/text-guard.ts";
import type { Logger } from "./logger.ts";
import type { MailDispatcher } from "./mail/dispatcher.ts";
import type { Mailer } from "./mail/mailer.ts";
import { createMailOutbox } from "./mail/outbox.ts";
import { openApiRoutes } from "./openapi/routes.ts";
import { CheckPool } from "./physics/checks/check-pool.ts";
import type { SymbolicPool } from "./physics/expr/pool.ts";
import { sheetsRoutes } from "./features/sheets/routes.ts";
import { sheetsService } from "./features/sheets/service.ts";

export interface AppDeps {
  db: Knex;
  config: Config;
  logger: Logger;
  clock?: () => Date;
  /** Sends mail from the outbox; default: SMTP as configured (the local sink in development and tests). */
  mailer?: Mailer;
  /** The CAS the check workers' symbolic steps use; default: the shared pool. */
  symbolicPool?: SymbolicPool;
  /** The background-job queue (pg-boss); default: one on DATABASE_URL, started on first use. */
  jobQueue?: JobQueue;
}

export interface DragomanApp extends Express {
  locals: Express["locals"] & { routeTable: RouteTable; mailOutbox: MailDispatcher; jobQueue: JobQueue; checkPool: CheckPool; dbBreaker: DbBreaker };
}

/** Builds the Express application. No listen here: server/index.ts and the tests do that. */
export function createApp(deps: AppDeps): DragomanApp {
  const { config, logger, db } = deps;
  const app = express() as DragomanApp;
  const table = new RouteTable();
  app.locals.routeTable = table;
  // Fail fast while PostgreSQL is unreachable: 503 at once, a background probe closes the breaker.
  app.locals.dbBreaker = attachBreaker(db, {
    probeIntervalMs: config.DB_PROBE_INTERVAL_MS,
    onOpen: (reason) => logger.warn({ reason }, "database unreachable: answering 503 at once until a probe answers"),
    onClose: (openForMs) => logger.info({ openForMs }, "database reachable again"),
  });
  // The outbox route and the local mail sink exist together; config refuses DEV_OUTBOX in production.
  table.devRoutesEnabled = config.DEV_OUTBOX;
  const mailOutbox = createMailOutbox({ db, config, logger, mailer: deps.mailer });
  app.locals.mailOutbox = mailOutbox;
  // Expression checks never run on this thread: one pool of check workers per app.
  const symbolicPool = deps.symbolicPool;
  const checkPool = new CheckPool({
    size: config.CHECK_WORKERS,
    timeoutMs: config.CHECK_TIMEOUT_MS,
    perClient: config.CHECK_IN_FLIGHT_PER_CLIENT,
    maxQueue: config.CHECK_QUEUE_MAX,
    nice: config.WORKER_NICE,
    ...(symbolicPool ? { symbolic: () => symbolicPool } : {}),
  });
  app.locals.checkPool = checkPool;
  const checks = createCheckRunner(checkPool);
  const jobQueue = deps.jobQueue ?? createJobQueue(config, { supervise: false });
  app.locals.jobQueue = jobQueue;
  app.disable("x-powered-by");
  app.set("trust proxy", "loopback");

  app.use(
    pinoHttp({
      logger,
      autoLogging: { ignore: (req) => req.url === "/api/health" },
      // Log what a request was, never what authenticates it: no headers (cookies, tokens, CSRF), no
      // query string on /auth (the OAuth code and state), no share-link secrets (server/http/redact-url.ts).
      serializers: {
        req: (req: { id: unknown; method: string; url: string; remoteAddress?: string }) => ({
          id: req.id,
          method: req.method,
          url: redactUrl(req.url),
          remoteAddress: req.remoteAddress,
        }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
      customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? "error" : res.statusCode >= 400 ? "warn" : "info"),
    }),
  );
  // gzip or brotli (as the client accepts) for API answers and client files over 1 kB.
  app.use(compression());
  // The path and query are guarded here; each route reads its JSON body itself, after its access
  // rule and rate limit, within its own size limit (server/http/body.ts).
  table.defaultBodyLimit = config.JSON_BODY_MAX_BYTES;
  app.use(textGuard);
  // Headers, rate limits, session, identity, CSRF and the /auth routes (server/auth/install-auth.ts).
  const auth = installAuth(app, table, deps);

  const api = express.Router();
  table.mount(api, "/api", healthRoutes(db));
  table.mount(api, "/api", accountsRoutes(auth));
  table.mount(api, "/api", adminRoutes(db));
  table.mount(api, "/api", expressionRoutes(config, checks));
  table.mount(api, "/api", catalogueApiRoutes({ db, config, clock: deps.clock ?? (() => new Date()), mailQueued: mailOutbox.kick, checks }));
  // One translator per app: its compiled catalogue is shared by the convert and sheets routes.
  const translator = convertService(dbCatalogueReader(db));
  const ringdown = ringdownCatalogue(db);
  const ringdownTranslator = ringdownService(ringdown);
  table.mount(api, "/api", convertRoutes(translator, config, ringdownTranslator));
  table.mount(api, "/api", samplesRoutes(translator, config));
  table.mount(api, "/api", jobsRoutes(jobsService(db, config, jobQueue, translator), config));
  table.mount(api, "/api", consistencyJobRoutes(db, config, jobQueue));
  table.mount(api, "/api", consistencyRoutes(config, ringdown, curvesRepository(db)));
  table.mount(api, "/api", ringdownRoutes(ringdownTranslator, config));
  table.mount(api, "/api", sheetsRoutes(sheetsService(db, translator, deps.clock, ringdownTranslator), config));
  const forecasts = forecastsService(curvesRepository(db), getForecastPool({ nice: config.WORKER_NICE }), translator);
  table.mount(api, "/api", forecastsRoutes(forecasts, config));
  table.mount(api, "/api", forecastJobRoutes(db, config, jobQueue, forecasts));
  // Reads the table at request time, so routes mounted above or below are all in the document.
  table.mount(api, "/api", openApiRoutes(table));
  app.use("/api", api);
  app.use("/api", apiNotFound);

  mountClient(app, config);
  app.use(errorMiddleware(logger, config.NODE_ENV !== "production"));
  return app;
}

/**
 * Serves the built client and falls back to index.html for client routes.
 * Files under /assets/ that the build precompressed go out as their .br or .gz twin to clients that
 * accept it (server/http/precompressed.ts); the others are compressed on the fly.
 * Caching: files under /assets/ carry a content hash in their names (Vite), so they are cached for a
 * year and never revalidated; a missing one is a 404 (an old page asking for a chunk of a previous
 * build), never index.html. index.html is revalidated on every load (no-cache), so a new build is seen
 * at once. Other files of public/ (the icon) are cached for an hour.
 */
function mountClient(app: Express, config: Config): void {
  const dist = path.resolve(config.CLIENT_DIST);
  const index = path.join(dist, "index.html");
  const missing: RequestHandler = (req, res) => {
    res.status(404).type("text/plain").set("Cache-Control", "no-store").send(`No such client file: /assets${req.path}. Reload the page to get the current build.`);
  };
  app.use("/assets", precompressedAssets(path.join(dist, "assets"), missing));
  app.use("/assets", express.static(path.join(dist, "assets"), { index: false, maxAge: "1y", immutable: true, fallthrough: true }));
  app.use("/assets", missing);
  app.use(
    express.static(dist, {
      index: false,
      maxAge: "1h",
      setHeaders: (res, file) => {
        if (file.endsWith(".html")) res.setHeader("Cache-Control", "no-cache");
      },
    }),
  );
  app.get("/{*splat}", (req, res, next) => {
    if (req.path.startsWith("/auth/")) return next();
    if (!existsSync(index)) {
      res.status(503).type("text/plain").send("The client has not been built yet: run `npm run build` (npm start does it for you).");
      return;
    }
    res.setHeader("Cache-Control", "no-cache");
    res.sendFile(index, { cacheControl: false });
  });
}
