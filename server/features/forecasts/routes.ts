import type { Request } from "express";
import { z } from "zod";
import { dbId } from "../../../common/ids.ts";
import {
  combineRequestSchema,
  combineResponseSchema,
  curveInfoSchema,
  curveListSchema,
  curveFileFieldsSchema,
  curveUploadSchema,
  MAX_CURVE_BYTES,
  forecastRequestSchema,
  forecastResponseSchema,
} from "../../../common/forecasts.ts";
import type { Config } from "../../config.ts";
import { AppError, UnauthorizedError, ValidationError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { convertRateLimit } from "../convert/rate-limit.ts";
import type { ForecastsService } from "./service.ts";
import multer from "multer";
import type { RequestHandler } from "express";

/**
 * Fisher forecasts: open to anyone (rate-limited with the translator's budget, since every forecast
 * is also translated); uploaded noise curves belong to a signed-in user.
 */
const idParams = z.object({ id: dbId("id") });

function caller(req: Request): Identity {
  if (!req.identity) throw new UnauthorizedError();
  return req.identity;
}

/** The curve file, in memory (at most MAX_CURVE_BYTES); a larger file is a 413 naming `file`. */
function curveFileUpload(): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_CURVE_BYTES, files: 1, fields: 6, fieldSize: 1024 } }).single("file");
  return (req, res, next) =>
    upload(req, res, (err?: unknown) => {
      if (err instanceof multer.MulterError && err.code === "LIMIT_FILE_SIZE") {
        next(new AppError(413, "file_too_large", `The curve file is over the limit of ${MAX_CURVE_BYTES} bytes.`, { file: `larger than ${MAX_CURVE_BYTES} bytes` }));
        return;
      }
      if (err instanceof multer.MulterError) {
        next(new ValidationError(`Invalid upload: ${err.message}${err.field ? ` (${err.field})` : ""}`, { [err.field ?? "file"]: err.message }));
        return;
      }
      next(err);
    });
}

/** The file's bytes as UTF-8 text; anything else (a spreadsheet, a binary) is refused. */
function decodeText(buffer: Buffer): string {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(buffer);
  } catch {
    throw new ValidationError("Invalid curve file: it is not UTF-8 text (save the table as plain text or CSV)", { file: "not UTF-8 text: save it as plain text or CSV" });
  }
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
      summary:
        "Upload a noise curve for your forecasts: multipart with the file (two columns: frequency in Hz and ASD or PSD, text or CSV) and the fields name, kind, convention, space; or JSON with the table in data. Answers its custom:<id>",
      tags,
      body: curveUploadSchema,
      response: curveInfoSchema,
      errors: [400, 401, 413],
      before: [curveFileUpload()],
      handler: async (req, res) => {
        const who = caller(req);
        if (req.is("multipart/form-data")) {
          const fields = parseWith(curveFileFieldsSchema, req.body ?? {}, "form");
          const file = req.file;
          if (!file) throw new ValidationError("Invalid upload: attach the curve table as the form field file", { file: "attach the two-column table (text or CSV)" });
          const text = decodeText(file.buffer);
          res.status(201).json(await service.uploadCurve(who, { ...fields, data: text }, "file"));
          return;
        }
        const upload = parseWith(curveUploadSchema, req.body);
        res.status(201).json(await service.uploadCurve(who, upload, "data"));
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
