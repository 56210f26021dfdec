import { ringdownConvertRequestSchema, ringdownConvertResponseSchema } from "../../../common/ringdown.ts";
import type { Config } from "../../config.ts";
import { ValidationError } from "../../errors.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import { convertRateLimit } from "../convert/rate-limit.ts";
import type { RingdownService } from "./service.ts";

async function asValidation<T>(fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (err) {
    if (err instanceof PhysicsInputError) throw new ValidationError(`Invalid request body: ${err.field}: ${err.message}`, { [err.field]: err.message });
    throw err;
  }
}

/** POST /api/v1/convert/ringdown: a bound on a QNM shift into limits on the catalogue's couplings. */
export function ringdownRoutes(service: RingdownService, config: Config): RouteSpec[] {
  const limit = convertRateLimit(config);
  return [
    {
      method: "post",
      path: "/v1/convert/ringdown",
      access: access.public,
      summary: "Translate a bound on a fractional QNM frequency or damping-time shift into limits on every catalogued coupling with a ringdown mapping",
      tags: ["convert", "ringdown"],
      body: ringdownConvertRequestSchema,
      response: ringdownConvertResponseSchema,
      errors: [400, 429],
      before: [limit],
      handler: async (req, res) => {
        const request = parseWith(ringdownConvertRequestSchema, req.body);
        res.json(await asValidation(() => service.convert(request)));
      },
    },
  ];
}
