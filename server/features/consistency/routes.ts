import {
  consistencyRequestSchema,
  consistencyResultSchema,
  couplingExclusionRequestSchema,
  couplingExclusionResponseSchema,
} from "../../../common/consistency.ts";
import type { Config } from "../../config.ts";
import { ValidationError } from "../../errors.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import { convertRateLimit } from "../convert/rate-limit.ts";
import type { RingdownCatalogue } from "../ringdown/catalogue.ts";
import { getForecastPool } from "../forecasts/pool.ts";
import { couplingExclusionFor } from "./coupling.ts";
import { gaussianConsistency } from "./gaussian.ts";

/** A physics refusal becomes a 400 naming the field. */
export function asValidation<T>(fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    if (err instanceof PhysicsInputError) throw new ValidationError(`Invalid request body: ${err.field}: ${err.message}`, { [err.field]: err.message });
    throw err;
  }
}

/** POST /api/v1/consistency: the IMR consistency test from two Gaussian remnant estimates; open to anyone, rate-limited. */
export function consistencyRoutes(config: Config, catalogue: RingdownCatalogue): RouteSpec[] {
  const limit = convertRateLimit(config);
  return [
    {
      method: "post",
      path: "/v1/consistency",
      access: access.public,
      summary: "Inspiral-merger-ringdown consistency test from two Gaussian remnant estimates: deviation, credible contours, GR quantile",
      tags: ["consistency"],
      body: consistencyRequestSchema,
      response: consistencyResultSchema,
      errors: [400, 429],
      before: [limit],
      handler: (req, res) => {
        const request = parseWith(consistencyRequestSchema, req.body);
        res.json(asValidation(() => gaussianConsistency(request)));
      },
    },
    {
      method: "post",
      path: "/v1/consistency/coupling",
      access: access.public,
      summary:
        "Smallest coupling of a theory at which its ringdown and remnant shifts, and the inspiral bias of its ppE terms, make the IMR consistency test exclude GR, with the expected deviation track; the test's widths given, or forecast for a detector",
      tags: ["consistency"],
      body: couplingExclusionRequestSchema,
      response: couplingExclusionResponseSchema,
      errors: [400, 429, 503],
      before: [limit],
      handler: async (req, res) => {
        const request = parseWith(couplingExclusionRequestSchema, req.body);
        try {
          res.json(await couplingExclusionFor(catalogue, request, (input) => getForecastPool().inspiralWidths(input)));
        } catch (err) {
          asValidation(() => {
            throw err;
          });
        }
      },
    },
  ];
}
