import { forecastGridRequestSchema } from "../../../common/forecasts.ts";
import { jobCreatedSchema } from "../../../common/jobs.ts";
import type { Config } from "../../config.ts";
import type { Knex } from "../../db/knex.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { sourceField } from "../../jobs/forecast-job.ts";
import { convertRateLimit } from "../convert/rate-limit.ts";
import type { JobQueue } from "../jobs/queue.ts";
import { jobsRepository } from "../jobs/repository.ts";
import { newJobId } from "../jobs/service.ts";
import { checkGridSources } from "./run.ts";
import type { ForecastsService } from "./service.ts";

/**
 * POST /api/v1/jobs/forecast: a heavy forecast (several sources, up to 200 values of b) becomes a job
 * on the shared queue: 202 with the job's id, then GET /api/v1/jobs/:id for progress and the result,
 * DELETE to cancel, as for the samples jobs. The caller's uploaded curves are resolved now and stored
 * with the request, so the worker needs no identity.
 */
export function forecastJobRoutes(db: Knex, config: Config, queue: JobQueue, service: ForecastsService): RouteSpec[] {
  const repo = jobsRepository(db);
  const limit = convertRateLimit(config);
  return [
    {
      method: "post",
      path: "/v1/jobs/forecast",
      access: access.public,
      summary: "Start a background job for a forecast grid: several sources (e.g. a grid of masses) and up to 200 values of b, translated into every theory",
      tags: ["jobs", "forecasts"],
      body: forecastGridRequestSchema,
      response: jobCreatedSchema,
      errors: [400, 429],
      before: [limit],
      handler: async (req, res) => {
        const request = parseWith(forecastGridRequestSchema, req.body);
        const curves = await service.customCurves(req.identity, request.detectors);
        checkGridSources(request, curves, sourceField);
        const id = newJobId();
        await repo.insert(db, { id, kind: "forecast", owner_id: req.identity?.id ?? null, request: { ...request, curves }, file: null });
        const queueId = await queue.send(id);
        await repo.setQueueId(id, queueId);
        res.status(202).location(`/api/v1/jobs/${id}`).json({ job: { id, status: "queued", progress: 0 } });
      },
    },
  ];
}
