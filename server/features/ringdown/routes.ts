import { ringdownConvertRequestSchema, ringdownConvertResponseSchema } from "../../../common/ringdown.ts";
import type { Config } from "../../config.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { convertRateLimit } from "../convert/rate-limit.ts";
import type { RingdownService } from "./service.ts";

/**
 * POST /api/v1/convert/ringdown: kept for callers of the first ringdown release. It takes only
 * ringdown bounds and answers exactly as POST /api/v1/convert does for them (same service).
 */
export function ringdownRoutes(service: RingdownService, config: Config): RouteSpec[] {
  const limit = convertRateLimit(config);
  return [
    {
      method: "post",
      path: "/v1/convert/ringdown",
      access: access.public,
      summary: "Same as POST /convert with a ringdown bound (qnm_dfreq or qnm_dtau): kept for earlier callers",
      tags: ["convert", "ringdown"],
      body: ringdownConvertRequestSchema,
      response: ringdownConvertResponseSchema,
      errors: [400, 429],
      before: [limit],
      handler: async (req, res) => {
        const request = parseWith(ringdownConvertRequestSchema, req.body);
        res.json(await service.convert(request));
      },
    },
  ];
}
