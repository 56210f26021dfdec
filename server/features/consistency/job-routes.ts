import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import type { RequestHandler } from "express";
import multer from "multer";
import { consistencyJobRequestSchema } from "../../../common/consistency.ts";
import { jobCreatedSchema } from "../../../common/jobs.ts";
import type { Config } from "../../config.ts";
import type { Knex } from "../../db/knex.ts";
import { AppError, ValidationError } from "../../errors.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { CONSISTENCY_FILES } from "../../jobs/consistency-job.ts";
import { convertRateLimit } from "../convert/rate-limit.ts";
import type { JobQueue } from "../jobs/queue.ts";
import { jobsRepository } from "../jobs/repository.ts";
import { newJobId } from "../jobs/service.ts";

/**
 * POST /api/v1/jobs/consistency: two posterior-samples files (`inspiral`, `merger_ringdown`) and the
 * settings (`request`, JSON text) become a background job on the shared job queue; its result has the
 * shape of POST /api/v1/consistency. The web process only stores the bytes; the worker parses them.
 */
export function consistencyJobRoutes(db: Knex, config: Config, queue: JobQueue): RouteSpec[] {
  const repo = jobsRepository(db);
  const limit = convertRateLimit(config);
  const make = (bytes: number) =>
    multer({ storage: multer.memoryStorage(), limits: { fileSize: bytes, files: 2, fields: 2, fieldSize: 1 << 16 } }).fields(CONSISTENCY_FILES.map((name) => ({ name, maxCount: 1 })));
  const signedIn = make(config.JOBS_MAX_BYTES);
  const anonymous = make(config.JOBS_ANON_MAX_BYTES);
  const upload: RequestHandler = (req, res, next) =>
    (req.identity ? signedIn : anonymous)(req, res, (err?: unknown) => {
      if (err instanceof multer.MulterError && err.code === "LIMIT_FILE_SIZE") {
        next(new AppError(413, "file_too_large", `A samples file is over the limit${req.identity ? "" : " for anonymous jobs; sign in for larger files"}.`, { [err.field ?? "file"]: "too large" }));
        return;
      }
      if (err instanceof multer.MulterError) {
        next(new ValidationError(`Invalid upload: ${err.message}${err.field ? ` (${err.field})` : ""}`, { [err.field ?? "file"]: err.message }));
        return;
      }
      next(err);
    });

  return [
    {
      method: "post",
      path: "/v1/jobs/consistency",
      access: access.public,
      summary: "Start a background job running the IMR consistency test on two posterior-samples files (inspiral, merger_ringdown)",
      tags: ["jobs", "consistency"],
      body: consistencyJobRequestSchema,
      response: jobCreatedSchema,
      errors: [400, 413, 429],
      before: [limit, upload],
      multipart: true,
      handler: async (req, res) => {
        const raw = (req.body as Record<string, unknown> | undefined)?.request;
        let parsedJson: unknown;
        try {
          parsedJson = typeof raw === "string" && raw.trim() !== "" ? JSON.parse(raw) : undefined;
        } catch {
          throw new ValidationError("Invalid request: the form field request must hold JSON", { request: "must be JSON text" });
        }
        if (parsedJson === undefined) throw new ValidationError("Invalid request: send the settings as JSON text in the form field request", { request: "required: JSON text" });
        const request = parseWith(consistencyJobRequestSchema, parsedJson, "request");
        const files = (req.files ?? {}) as Record<string, Express.Multer.File[] | undefined>;
        for (const name of CONSISTENCY_FILES) {
          if (!files[name]?.[0]) throw new ValidationError(`Invalid ${name}: attach the ${name.replace("_", "-")} samples file as the form field ${name}`, { [name]: "attach the samples file" });
        }
        const id = newJobId();
        const dir = await mkdtemp(path.join(tmpdir(), "dragoman-consistency-"));
        try {
          await db.transaction(async (trx) => {
            const first = files.inspiral![0]!;
            await repo.insert(trx, {
              id,
              kind: "consistency",
              owner_id: req.identity?.id ?? null,
              request,
              file: { name: first.originalname.slice(0, 255) || "inspiral", bytes: first.size, sha256: "", format: "text" },
            });
            for (const name of CONSISTENCY_FILES) {
              const target = path.join(dir, name);
              await writeFile(target, files[name]![0]!.buffer);
              await repo.storeFile(trx, id, name, target);
            }
          });
        } finally {
          await rm(dir, { recursive: true, force: true });
        }
        const queueId = await queue.send(id);
        await repo.setQueueId(id, queueId);
        res.status(202).location(`/api/v1/jobs/${id}`).json({ job: { id, status: "queued", progress: 0 } });
      },
    },
  ];
}
