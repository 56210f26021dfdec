import { outboxResponseSchema } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import { access, type RouteSpec } from "../../http/route.ts";
import { listDevOutbox } from "./repository.ts";

/** What the local SMTP sink caught. Exists only while DEV_OUTBOX is on (never in production). */
export function outboxRoutes(db: Knex): RouteSpec[] {
  return [
    {
      method: "get",
      path: "/v1/dev/outbox",
      access: access.devOnly,
      summary: "Messages the local mail sink received, newest first (local development and tests only)",
      tags: ["development"],
      response: outboxResponseSchema,
      errors: [403],
      handler: async (_req, res) => {
        res.set("Cache-Control", "no-store").json({ messages: await listDevOutbox(db) });
      },
    },
  ];
}
