import { existsSync } from "node:fs";
import path from "node:path";
import express, { type Express } from "express";
import { pinoHttp } from "pino-http";
import type { Config } from "./config.ts";
import type { Knex } from "./db/knex.ts";
import { healthRoutes } from "./features/health/routes.ts";
import { apiNotFound, errorMiddleware } from "./http/error-middleware.ts";
import { RouteTable } from "./http/route.ts";
import type { Logger } from "./logger.ts";

export interface AppDeps {
  db: Knex;
  config: Config;
  logger: Logger;
  clock?: () => Date;
}

export interface DragomanApp extends Express {
  locals: Express["locals"] & { routeTable: RouteTable };
}

/** Builds the Express application. No listen here: server/index.ts and the tests do that. */
export function createApp(deps: AppDeps): DragomanApp {
  const { config, logger, db } = deps;
  const app = express() as DragomanApp;
  const table = new RouteTable();
  app.locals.routeTable = table;
  app.disable("x-powered-by");
  app.set("trust proxy", "loopback");

  app.use(
    pinoHttp({
      logger,
      autoLogging: { ignore: (req) => req.url === "/api/health" },
      customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? "error" : res.statusCode >= 400 ? "warn" : "info"),
    }),
  );
  app.use(express.json({ limit: "2mb" }));

  const api = express.Router();
  table.mount(api, "/api", healthRoutes(db));
  app.use("/api", api);
  app.use("/api", apiNotFound);

  mountClient(app, config);
  app.use(errorMiddleware(logger, config.NODE_ENV !== "production"));
  return app;
}

/** Serves the built client and falls back to index.html for client routes. */
function mountClient(app: Express, config: Config): void {
  const dist = path.resolve(config.CLIENT_DIST);
  const index = path.join(dist, "index.html");
  app.use(express.static(dist, { index: false, maxAge: "1h" }));
  app.get("/{*splat}", (req, res, next) => {
    if (req.path.startsWith("/auth/")) return next();
    if (!existsSync(index)) {
      res.status(503).type("text/plain").send("The client has not been built yet: run `npm run build` (npm start does it for you).");
      return;
    }
    res.sendFile(index, { maxAge: 0 });
  });
}
