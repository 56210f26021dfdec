import type { Request, RequestHandler } from "express";
import multer from "multer";
import { eventsRequestSchema, eventsResponseSchema, samplesRequestSchema, samplesResponseSchema } from "../../../common/convert-samples.ts";
import type { Config } from "../../config.ts";
import { ValidationError } from "../../errors.ts";
import { readJsonBody } from "../../http/json-body.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { convertEvents } from "./events.ts";
import { withCsvLines } from "./csv-rows.ts";
import { convertRateLimit } from "./rate-limit.ts";
import { formField, uploadedCsv } from "./upload-fields.ts";
import { parseSamplesCsv } from "./samples-csv.ts";
import { convertSamples, type SamplesInput } from "./samples.ts";
import type { ConvertService } from "./service.ts";

/**
 * POST /api/v1/convert/samples (JSON columns, or a CSV upload in the field `file`) and
 * POST /api/v1/convert/events. Open to anyone and rate-limited, like /convert.
 */

function samplesFromUpload(req: Request): unknown {
  const csv = uploadedCsv(req);
  const theory = formField(req, "theory");
  return {
    theory: typeof theory === "number" ? String(theory) : theory,
    parameter: formField(req, "parameter"),
    b: formField(req, "b"),
    k: formField(req, "k"),
    credibility: formField(req, "credibility"),
    sign_convention: formField(req, "sign_convention"),
    includes_spin: formField(req, "includes_spin"),
    bodies: formField(req, "bodies", true),
    frame: formField(req, "frame"),
    cosmology: formField(req, "cosmology", true),
    columns: parseSamplesCsv(csv),
  };
}

/** "columns.m1.4" gains "(CSV line 6)": line 1 is the header. */
const SAMPLE_ROW = /^columns\.\w+\.(\d+)$/;

export function samplesRoutes(service: ConvertService, config: Config): RouteSpec[] {
  const limit = convertRateLimit(config);
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: config.CONVERT_SAMPLES_MAX_BYTES, files: 1, fields: 16 } });
  const csvUpload: RequestHandler = upload.single("file");

  return [
    {
      method: "post",
      path: "/v1/convert/samples",
      access: access.public,
      summary: "Translate posterior samples of a ppE beta or gIMR dphi_k, sample by sample at each sample's binary, into a credible bound on one theory's coupling",
      tags: ["convert"],
      body: samplesRequestSchema,
      response: samplesResponseSchema,
      errors: [400, 429],
      before: [limit, csvUpload],
      // Posterior samples arrive as JSON columns (up to MAX_SAMPLES rows): this route has its own limit; larger posteriors go to the jobs.
      bodyLimit: config.CONVERT_SAMPLES_MAX_BYTES,
      rawJsonBody: true,
      handler: async (req, res) => {
        let request: SamplesInput;
        if (req.is("multipart/form-data")) {
          try {
            request = parseWith(samplesRequestSchema, samplesFromUpload(req));
          } catch (err) {
            throw err instanceof ValidationError ? withCsvLines(err, SAMPLE_ROW) : err;
          }
        } else {
          // JSON: parsed and validated in the body worker thread when large (up to 20 000 rows, 4 MiB).
          request = await readJsonBody(req, "convert-samples");
        }
        // A turn of the event loop between validating up to 20 000 rows and converting them (which
        // yields every few thousand samples itself), so the two never run as one stall.
        await new Promise((resolve) => setImmediate(resolve));
        res.json(await convertSamples(await service.catalogue(), request));
      },
    },
    {
      method: "post",
      path: "/v1/convert/events",
      access: access.public,
      summary: "Translate one bound per event for one theory and combine the events at the level of the coupling",
      tags: ["convert"],
      body: eventsRequestSchema,
      response: eventsResponseSchema,
      errors: [400, 429],
      before: [limit],
      handler: async (req, res) => {
        const request = parseWith(eventsRequestSchema, req.body);
        res.json(convertEvents(await service.catalogue(), request));
      },
    },
  ];
}
