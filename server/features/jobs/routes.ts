import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import type { RequestHandler } from "express";
import { filePreviewSchema, jobCreatedSchema, jobIdSchema, jobViewSchema, samplesJobRequestSchema, stackJobRequestSchema } from "../../../common/jobs.ts";
import type { Config } from "../../config.ts";
import { TooManyRequestsError, ValidationError } from "../../errors.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import type { JobsService } from "./service.ts";
import { previewFile } from "./preview.ts";
import { samplesUpload, storedUpload } from "./upload.ts";

/**
 * Background jobs: POST /jobs/samples (multipart `file` + `request`), POST /jobs/stack (JSON),
 * GET /jobs/:id, DELETE /jobs/:id, GET /jobs/:id/samples.csv. Anyone holding a job's id may read or
 * cancel it; anonymous callers get small jobs and an hourly budget per address.
 */

function anonymousJobLimit(config: Config): RequestHandler {
  const limiter = rateLimit({
    windowMs: 3_600_000,
    limit: config.JOBS_ANON_PER_HOUR,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    skip: (req) => req.identity !== undefined,
    keyGenerator: (req) => `jobs:${ipKeyGenerator(req.ip ?? "unknown")}`,
    handler: (_req, _res, next) => next(new TooManyRequestsError(`Too many jobs from your address (${config.JOBS_ANON_PER_HOUR} an hour without signing in); sign in or wait.`)),
  });
  return limiter;
}

function parseId(raw: unknown): string {
  return parseWith(jobIdSchema, raw, "id");
}

function requestField(raw: unknown): unknown {
  if (typeof raw !== "string" || raw.trim() === "") throw new ValidationError("Invalid request: send the job's settings as JSON text in the form field request", { request: "required: JSON text" });
  try {
    return JSON.parse(raw);
  } catch {
    throw new ValidationError("Invalid request: the form field request must hold JSON", { request: "must be JSON text" });
  }
}

export function jobsRoutes(service: JobsService, config: Config): RouteSpec[] {
  const limit = anonymousJobLimit(config);
  const upload = samplesUpload(config);
  return [
    {
      method: "post",
      path: "/v1/jobs/samples",
      access: access.public,
      summary: "Start a background job translating a posterior-samples file (CSV/TSV/whitespace text, JSON or HDF5) into a credible bound on one theory's coupling",
      tags: ["jobs"],
      body: samplesJobRequestSchema,
      response: jobCreatedSchema,
      errors: [400, 413, 429],
      before: [limit, upload],
      multipart: true,
      handler: async (req, res) => {
        const file = storedUpload(req);
        try {
          const request = parseWith(samplesJobRequestSchema, requestField((req.body as Record<string, unknown> | undefined)?.request), "request");
          if (!file) throw new ValidationError("Invalid file: attach the samples file as the form field file", { file: "attach the samples file" });
          const job = await service.createSamples(request, file, req.identity);
          res.status(202).location(`/api/v1/jobs/${job.id}`).json({ job: { id: job.id, status: job.status, progress: job.progress } });
        } catch (err) {
          if (file) await import("node:fs/promises").then((fs) => fs.unlink(file.path)).catch(() => undefined);
          throw err;
        }
      },
    },
    {
      method: "post",
      path: "/v1/jobs/preview",
      access: access.public,
      summary: "The column picker's preview of a samples file: its tables, each column's first rows and statistics over the first 1000 rows (nothing is stored)",
      tags: ["jobs"],
      response: filePreviewSchema,
      errors: [400, 413, 429],
      before: [limit, upload],
      multipart: true,
      handler: async (req, res) => {
        const file = storedUpload(req);
        if (!file) throw new ValidationError("Invalid file: attach the samples file as the form field file", { file: "attach the samples file" });
        try {
          res.json(await previewFile(file));
        } finally {
          await import("node:fs/promises").then((fs) => fs.unlink(file.path)).catch(() => undefined);
        }
      },
    },
    {
      method: "post",
      path: "/v1/jobs/stack",
      access: access.public,
      summary: "Start a background job combining several events (finished samples jobs, or summaries as a quick estimate) into one bound on a coupling",
      tags: ["jobs"],
      body: stackJobRequestSchema,
      response: jobCreatedSchema,
      errors: [400, 429],
      before: [limit],
      handler: async (req, res) => {
        const request = parseWith(stackJobRequestSchema, req.body);
        const job = await service.createStack(request, req.identity);
        res.status(202).location(`/api/v1/jobs/${job.id}`).json({ job: { id: job.id, status: job.status, progress: job.progress } });
      },
    },
    {
      method: "get",
      path: "/v1/jobs/:id",
      access: access.public,
      summary: "A job's status, progress and, when done, its result (or its error)",
      tags: ["jobs"],
      response: jobViewSchema,
      errors: [400, 404],
      handler: async (req, res) => {
        res.set("Cache-Control", "no-store").json(await service.get(parseId(req.params.id)));
      },
    },
    {
      method: "delete",
      path: "/v1/jobs/:id",
      access: access.public,
      summary: "Cancel a queued or running job; only its record is kept",
      tags: ["jobs"],
      response: jobViewSchema,
      errors: [400, 404, 409],
      handler: async (req, res) => {
        res.json(await service.cancel(parseId(req.params.id)));
      },
    },
    {
      method: "get",
      path: "/v1/jobs/:id/samples.csv",
      access: access.public,
      summary: "The per-sample translated values of a finished samples job, as CSV (gzip-encoded)",
      tags: ["jobs"],
      errors: [400, 404, 409],
      handler: async (req, res) => {
        const id = parseId(req.params.id);
        const chunks = await service.csv(id);
        res.status(200).set({ "Content-Type": "text/csv; charset=utf-8", "Content-Encoding": "gzip", "Content-Disposition": `attachment; filename="dragoman-samples-${id}.csv"` });
        for await (const chunk of chunks) {
          if (!res.write(chunk)) await new Promise((r) => res.once("drain", r));
        }
        res.end();
      },
    },
  ];
}
