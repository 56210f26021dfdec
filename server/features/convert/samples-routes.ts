import type { Request, RequestHandler } from "express";
import multer from "multer";
import { eventsRequestSchema, eventsResponseSchema, samplesRequestSchema, samplesResponseSchema } from "../../../common/convert-samples.ts";
import type { Config } from "../../config.ts";
import { ValidationError } from "../../errors.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { convertEvents } from "./events.ts";
import { convertRateLimit } from "./rate-limit.ts";
import { parseSamplesCsv } from "./samples-csv.ts";
import { convertSamples } from "./samples.ts";
import type { ConvertService } from "./service.ts";

/**
 * POST /api/v1/convert/samples (JSON columns, or a CSV upload in the field `file`) and
 * POST /api/v1/convert/events. Open to anyone and rate-limited, like /convert.
 */

function field(req: Request, name: string, json = false): unknown {
  const raw: unknown = req.body?.[name];
  if (typeof raw !== "string") return raw;
  const t = raw.trim();
  if (t === "") return undefined;
  if (json || t.startsWith("{") || t.startsWith("[")) {
    try {
      return JSON.parse(t);
    } catch {
      throw new ValidationError(`Invalid ${name}: the form field must hold JSON`, { [name]: "must be JSON text" });
    }
  }
  if (t === "true" || t === "false") return t === "true";
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
}

function samplesFromUpload(req: Request): unknown {
  const file = req.file;
  if (!file) throw new ValidationError("Invalid upload: attach the CSV as the form field file", { file: "attach the CSV as the form field file" });
  const theory = field(req, "theory");
  return {
    theory: typeof theory === "number" ? String(theory) : theory,
    parameter: field(req, "parameter"),
    b: field(req, "b"),
    k: field(req, "k"),
    credibility: field(req, "credibility"),
    sign_convention: field(req, "sign_convention"),
    includes_spin: field(req, "includes_spin"),
    bodies: field(req, "bodies", true),
    frame: field(req, "frame"),
    cosmology: field(req, "cosmology", true),
    columns: parseSamplesCsv(file.buffer.toString("utf8")),
  };
}

/** "columns.m1.4" gains "(CSV line 6)": line 1 is the header. */
function withLines(err: ValidationError): ValidationError {
  if (!err.fields) return err;
  const fields: Record<string, string> = {};
  for (const [key, message] of Object.entries(err.fields)) {
    const m = /^columns\.\w+\.(\d+)$/.exec(key);
    fields[key] = m ? `${message} (CSV line ${Number(m[1]) + 2})` : message;
  }
  const first = Object.entries(fields)[0];
  return new ValidationError(first ? `Invalid CSV upload: ${first[0]}: ${first[1]}` : err.message, fields);
}

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
      handler: async (req, res) => {
        const fromUpload = Boolean(req.is("multipart/form-data"));
        let request;
        try {
          request = parseWith(samplesRequestSchema, fromUpload ? samplesFromUpload(req) : req.body);
        } catch (err) {
          throw fromUpload && err instanceof ValidationError ? withLines(err) : err;
        }
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
