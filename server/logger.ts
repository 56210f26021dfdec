import { pino, type Logger } from "pino";
import type { Config } from "./config.ts";

export type { Logger };

export function createLogger(config: Pick<Config, "LOG_LEVEL" | "NODE_ENV">): Logger {
  return pino({
    level: config.NODE_ENV === "test" && config.LOG_LEVEL === "info" ? "silent" : config.LOG_LEVEL,
    base: { app: "dragoman" },
    // A second line of defence behind the request serializers in server/app.ts.
    redact: {
      paths: ["req.headers.cookie", "req.headers.authorization", 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]', "err.config.headers"],
      remove: true,
    },
  });
}
