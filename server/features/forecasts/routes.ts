import type { Request } from "express";
import { z } from "zod";
import { dbId } from "../../../common/ids.ts";
import {
  combineRequestSchema,
  combineResponseSchema,
  curveInfoSchema,
  curveListSchema,
  curveUploadSchema,
  forecastRequestSchema,
  forecastResponseSchema,
} from "../../../common/forecasts.ts";
import type { Config } from "../../config.ts";
import { UnauthorizedError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { convertRateLimit } from "../convert/rate-limit.ts";
import type { ForecastsService } from "./service.ts";

/**
 * Fisher forecasts: open to anyone (rate-limited with the translator's budget, since every forecast
 * is also translated); uploaded noise curves belong to a signed-in user.
 */
const idParams = z.object({ id: dbId("id") });

function caller(req: Request): Identity {
  if (!req.identity) throw new UnauthorizedError();
  return req.identity;
}

export function forecastsRoutes(service: ForecastsService, config: Config): RouteSpec[] {
  const limit = convertRateLimit(config);
  const tags = ["forecasts"];
  return [
    {
      method: "post",
      path: "/v1/forecasts",
      access: access.public,
      summary: "Fisher-matrix forecast of the ppE beta bound for detector networks, translated into the catalogue's theories",
      tags,
      body: forecastRequestSchema,
      response: forecastResponseSchema,
      errors: [400, 429, 503],
      before: [limit],
      handler: async (req, res) => {
        const request = parseWith(forecastRequestSchema, req.body);
        res.json(await service.forecast(req.identity, request));
      },
    },
    {
      method: "get",
      path: "/v1/forecasts/curves",
      access: access.public,
      summary: "Noise curves for forecasts: the built-in ones with source, convention and range, and your uploaded ones when signed in",
      tags,
      response: curveListSchema,
      handler: async (req, res) => {
        res.json({ curves: await service.curves(req.identity) });
      },
    },
    {
      method: "post",
      path: "/v1/forecasts/curves",
      access: access.signedIn,
      summary: "Upload a noise curve (two columns: frequency in Hz and ASD or PSD) for your forecasts; answers its custom:<id>",
      tags,
      body: curveUploadSchema,
      response: curveInfoSchema,
      errors: [400, 401],
      handler: async (req, res) => {
        const upload = parseWith(curveUploadSchema, req.body);
        res.status(201).json(await service.uploadCurve(caller(req), upload));
      },
    },
    {
      method: "delete",
      path: "/v1/forecasts/curves/:id",
      access: access.signedIn,
      summary: "Delete one of your uploaded noise curves",
      tags,
      errors: [400, 401, 404],
      handler: async (req, res) => {
        const { id } = parseWith(idParams, req.params, "path");
        await service.deleteCurve(caller(req), id);
        res.status(204).end();
      },
    },
    {
      method: "post",
      path: "/v1/forecasts/combine",
      access: access.public,
      summary: "Add uploaded per-detector Fisher matrices (JSON with names or CSV with a header) and priors; marginalised bound per network",
      tags,
      body: combineRequestSchema,
      response: combineResponseSchema,
      errors: [400, 429],
      before: [limit],
      handler: (req, res) => {
        const request = parseWith(combineRequestSchema, req.body);
        res.json(service.combine(request));
      },
    },
  ];
}
