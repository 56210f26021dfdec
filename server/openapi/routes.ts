import { z } from "zod";
import { access, type RouteSpec, type RouteTable } from "../http/route.ts";
import { APP_VERSION } from "../version.ts";
import { buildOpenApiDocument } from "./generate.ts";

const openApiDocument = z.record(z.string(), z.unknown()).meta({ description: "An OpenAPI 3.1 document" });

/** GET /api/v1/openapi.json: the document of every route in the table, built once on first request. */
export function openApiRoutes(table: RouteTable): RouteSpec[] {
  let cached: { count: number; doc: Record<string, unknown> } | undefined;
  return [
    {
      method: "get",
      path: "/v1/openapi.json",
      access: access.public,
      summary: "This API described as an OpenAPI 3.1 document, generated from the route table",
      tags: ["platform"],
      response: openApiDocument,
      handler: (_req, res) => {
        // Routes are mounted while the app is built; rebuild only if the table grew since.
        if (!cached || cached.count !== table.routes.length) {
          cached = {
            count: table.routes.length,
            doc: buildOpenApiDocument(table.routes, {
              title: "Dragoman API",
              version: APP_VERSION,
              description: "Reviewed catalogue of theory-to-deviation mappings, and translation of measured bounds into coupling limits. See docs/api.md.",
            }),
          };
        }
        res.json(cached.doc);
      },
    },
  ];
}
