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
import type { CurvesRepository } from "../forecasts/repository.ts";
import type { Identity } from "../../http/identity.ts";
import type { CustomCurveData } from "../../physics/forecast/forecast.ts";
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

/**
 * The uploaded curve a forecast test names (custom:<id>), with the forecasts' rule: only its owner,
 * signed in, may use it. A 400 names test.forecast.curve otherwise. Built-in ids need nothing.
 */
async function uploadedCurves(curves: CurvesRepository | undefined, who: Identity | undefined, curve: string | undefined, field = "test.forecast.curve"): Promise<CustomCurveData[]> {
  const m = curve === undefined ? null : /^custom:(\d+)$/.exec(curve);
  if (!m) return [];
  const refuse = (message: string): never => {
    throw new ValidationError(`Invalid request body: ${field}: ${message}`, { [field]: message });
  };
  if (!who || !curves) return refuse("sign in to use your uploaded curves");
  const [row] = await curves.findOwned(who.id, [Number(m[1])]);
  if (!row) return refuse(`you have no uploaded curve ${curve}`);
  return [{ id: `custom:${row.id}`, name: row.name, convention: row.convention, space: row.space, frequencies: row.frequencies, psd: row.psd }];
}

/** POST /api/v1/consistency: the IMR consistency test from two Gaussian remnant estimates; open to anyone, rate-limited. */
export function consistencyRoutes(config: Config, catalogue: RingdownCatalogue, curves?: CurvesRepository): RouteSpec[] {
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
        const uploaded = [
          ...(await uploadedCurves(curves, req.identity, request.test.forecast?.curve)),
          // The inspiral bias's own detector, with given widths (the same rule: the owner's uploaded curves only).
          ...(await uploadedCurves(curves, req.identity, request.test.inspiral_bias?.curve, "test.inspiral_bias.curve")),
        ];
        try {
          res.json(await couplingExclusionFor(catalogue, request, (input) => getForecastPool().inspiralWidths({ ...input, curves: uploaded })));
        } catch (err) {
          asValidation(() => {
            throw err;
          });
        }
      },
    },
  ];
}
