import { z } from "zod";
import { pingDb, type Knex } from "../../db/knex.ts";
import { DB_RETRY_AFTER_SECONDS } from "../../http/db-unavailable.ts";
import { access, type RouteSpec } from "../../http/route.ts";
import { APP_VERSION } from "../../version.ts";

export const healthResponse = z.object({
  status: z.enum(["ok", "degraded"]),
  db: z.enum(["up", "down"]),
  version: z.string(),
});

export function healthRoutes(db: Knex): RouteSpec[] {
  return [
    {
      method: "get",
      path: "/health",
      access: access.public,
      summary: "Liveness and database reachability",
      tags: ["platform"],
      response: healthResponse,
      errors: [503],
      handler: async (_req, res) => {
        const up = await pingDb(db);
        if (!up) res.set("Retry-After", String(DB_RETRY_AFTER_SECONDS));
        res.set("Cache-Control", "no-store");
        res.status(up ? 200 : 503).json({ status: up ? "ok" : "degraded", db: up ? "up" : "down", version: APP_VERSION });
      },
    },
  ];
}
