import type { Request, RequestHandler } from "express";
import multer from "multer";
import { convertRequestSchema, convertTableRequestSchema, convertTableResponseSchema } from "../../../common/convert.ts";
import type { Config } from "../../config.ts";
import { ValidationError } from "../../errors.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { parseBoundsCsv, withCsvLines } from "./csv-rows.ts";
import { convertRateLimit } from "./rate-limit.ts";
import { formField, uploadedCsv } from "./upload-fields.ts";
import type { ConvertService } from "./service.ts";
import { convertAnyRequestSchema, convertAnyResponseSchema, isRingdownBody, ringdownConvertRequestSchema } from "../../../common/ringdown.ts";
import type { RingdownService } from "../ringdown/service.ts";

/**
 * POST /api/v1/convert and /api/v1/convert/table: open to anyone, rate-limited. The table route takes
 * JSON rows, or a multipart upload whose `file` is a CSV and whose other fields carry the rest of the
 * request (binary and cosmology as JSON text).
 */

/** The multipart request, reassembled into the JSON shape so one schema judges both. */
function tableRequestFromUpload(req: Request): unknown {
  const rows = parseBoundsCsv(uploadedCsv(req), "file");
  const theories = formField(req, "theories");
  return {
    rows,
    binary: formField(req, "binary", true),
    cosmology: formField(req, "cosmology", true),
    credibility: formField(req, "credibility"),
    sign_convention: formField(req, "sign_convention"),
    includes_spin: formField(req, "includes_spin"),
    // A JSON array arrives parsed; a plain "edgb, dcs" list is split here.
    ...(theories === undefined ? {} : { theories: typeof theories === "string" ? theories.split(",").map((s) => s.trim()).filter(Boolean) : theories }),
  };
}

/** A bound whose kind the translator does not know: the message lists the ringdown kinds too. */
function withRingdownKinds(err: unknown): unknown {
  if (!(err instanceof ValidationError) || !err.fields?.["bound.parameter"]) return err;
  const message = `${err.fields["bound.parameter"]}, or "qnm_dfreq" / "qnm_dtau" for a ringdown bound`;
  return new ValidationError(`Invalid bound.parameter: ${message}`, { ...err.fields, "bound.parameter": message });
}

export function convertRoutes(service: ConvertService, config: Config, ringdown: RingdownService): RouteSpec[] {
  const limit = convertRateLimit(config);
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: config.CONVERT_UPLOAD_MAX_BYTES, files: 1, fields: 12 } });
  // multer skips requests that are not multipart, so JSON bodies pass straight through.
  const csvUpload: RequestHandler = upload.single("file");

  return [
    {
      method: "post",
      path: "/v1/convert",
      access: access.public,
      summary:
        "Translate one bound (ppE beta, gIMR dphi_k, or a ringdown shift qnm_dfreq / qnm_dtau of one mode) into limits on every applicable catalogued coupling, each with its verdict",
      tags: ["convert"],
      body: convertAnyRequestSchema,
      response: convertAnyResponseSchema,
      errors: [400, 429],
      before: [limit],
      handler: async (req, res) => {
        if (isRingdownBody(req.body)) {
          res.json(await ringdown.convert(parseWith(ringdownConvertRequestSchema, req.body)));
          return;
        }
        let request;
        try {
          request = parseWith(convertRequestSchema, req.body);
        } catch (err) {
          throw withRingdownKinds(err);
        }
        res.json(await service.convert(request));
      },
    },
    {
      method: "post",
      path: "/v1/convert/table",
      access: access.public,
      summary: "Translate a table of bounds over b (JSON rows or a CSV upload in the field `file`) for one binary",
      tags: ["convert"],
      body: convertTableRequestSchema,
      response: convertTableResponseSchema,
      errors: [400, 429],
      before: [limit, csvUpload],
      handler: async (req, res) => {
        const fromUpload = Boolean(req.is("multipart/form-data"));
        let request;
        try {
          request = parseWith(convertTableRequestSchema, fromUpload ? tableRequestFromUpload(req) : req.body);
        } catch (err) {
          throw fromUpload && err instanceof ValidationError ? withCsvLines(err) : err;
        }
        res.json(await service.convertTable(request));
      },
    },
  ];
}
