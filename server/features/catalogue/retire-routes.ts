import type { Request } from "express";
import { z } from "zod";
import { restoreRequestSchema, retirementRequestSchema, retirementResponseSchema } from "../../../common/catalogue.ts";
import { theorySlugSchema } from "../../../common/convert.ts";
import { UnauthorizedError } from "../../errors.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import type { RetirementService } from "./retire.ts";

const slugParams = z.object({ slug: theorySlugSchema });

function who(req: Request) {
  // The access guard has run; this only narrows the type.
  if (!req.identity) throw new UnauthorizedError();
  return req.identity;
}

/** Editors retire an entry, a coupling or a mapping (out of translations, still readable), and restore it. */
export function retirementRoutes(service: RetirementService): RouteSpec[] {
  return [
    {
      method: "post",
      path: "/v1/theories/:slug/retire",
      access: access.roles("editor"),
      summary:
        "Retire the entry, one coupling (with its mappings) or one mapping, with a reason: it leaves translations and forecasts and stays readable; published as the next revision. 409 when already retired",
      tags: ["catalogue", "review"],
      body: retirementRequestSchema,
      response: retirementResponseSchema,
      errors: [400, 401, 403, 404, 409],
      handler: async (req, res) => {
        const { slug } = parseWith(slugParams, req.params, "path");
        const body = parseWith(retirementRequestSchema, req.body);
        res.json(await service.retire(slug, who(req), body));
      },
    },
    {
      method: "post",
      path: "/v1/theories/:slug/restore",
      access: access.roles("editor"),
      summary: "Restore a retired entry, coupling or mapping; published as the next revision. 409 when it is not retired",
      tags: ["catalogue", "review"],
      body: restoreRequestSchema,
      response: retirementResponseSchema,
      errors: [400, 401, 403, 404, 409],
      handler: async (req, res) => {
        const { slug } = parseWith(slugParams, req.params, "path");
        const body = parseWith(restoreRequestSchema, req.body ?? {});
        res.json(await service.restore(slug, who(req), body));
      },
    },
  ];
}
