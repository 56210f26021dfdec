import { mkdtemp, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import type PgBoss from "pg-boss";
import type { JobError, SamplesJobRequest, SamplesJobResult, StackJobRequest } from "../../common/jobs.ts";
import type { Config } from "../config.ts";
import type { Knex } from "../db/knex.ts";
import { dbCatalogueReader } from "../features/convert/catalogue-reader.ts";
import { convertService } from "../features/convert/service.ts";
import { createJobQueue, JOB_QUEUE } from "../features/jobs/queue.ts";
import { jobsRepository } from "../features/jobs/repository.ts";
import type { Logger } from "../logger.ts";
import { AppError } from "../errors.ts";
import { JobCancelled, SampleInputError } from "../physics/samples/sample-input-error.ts";
import { consistencyJobRequestSchema } from "../../common/consistency.ts";
import { CONSISTENCY_FILES, runConsistencyJob } from "./consistency-job.ts";
import { runForecastJob, type ForecastJobInput } from "./forecast-job.ts";
import { readStackValues, runSamplesJob } from "./samples-job.ts";
import { runStackJob } from "./stack-job.ts";

/**
 * A worker: takes jobs from the queue one at a time, runs them, writes progress and results to the
 * record. Started by `npm start` (one process next to the server) and `npm run worker` (more, on
 * any machine that reaches the database). docs/samples-jobs.md.
 */

export interface RunningWorker {
  stop(): Promise<void>;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export async function startWorker(deps: { config: Config; db: Knex; logger: Logger }): Promise<RunningWorker> {
  const { config, db, logger } = deps;
  const queue = createJobQueue(config, { supervise: true });
  const boss = await queue.boss();
  const repo = jobsRepository(db);
  const translator = convertService(dbCatalogueReader(db));

  async function handle(job: PgBoss.JobWithMetadata<{ jobId: string }>): Promise<void> {
    const id = job.data.jobId;
    const row = await repo.claim(id);
    if (!row) return; // cancelled or gone: nothing to do
    const log = logger.child({ job: id, attempt: row.attempts });
    const dir = await mkdtemp(path.join(tmpdir(), "dragoman-job-"));
    let paused = false;
    let last = 0;
    const onProgress = async (fraction: number) => {
      const f = Math.max(last, fraction);
      if (f - last < 0.01 && f < 1 && !(config.JOBS_TEST_PAUSE_MS > 0 && !paused && f >= 0.5)) return;
      last = f;
      if (!(await repo.progress(id, Math.min(1, f)))) throw new JobCancelled();
      if (config.JOBS_TEST_PAUSE_MS > 0 && !paused && f >= 0.5) {
        paused = true;
        for (let waited = 0; waited < config.JOBS_TEST_PAUSE_MS; waited += 100) {
          await sleep(100);
          if (!(await repo.progress(id, f))) throw new JobCancelled();
        }
      }
    };
    try {
      const catalogue = await translator.catalogue();
      if (row.kind === "samples") {
        const filePath = path.join(dir, "upload");
        if (!(await repo.fetchToFile(id, "upload", filePath)) || !row.file) {
          throw new SampleInputError("The uploaded file is no longer stored (was the job cancelled?).");
        }
        const out = await runSamplesJob({
          request: row.request as SamplesJobRequest & { max_samples: number },
          filePath,
          file: row.file as { name: string; bytes: number; sha256: string; format: "text" | "json" | "hdf5" },
          catalogue,
          maxNonFiniteFraction: config.JOBS_MAX_NONFINITE_FRACTION,
          onProgress,
        });
        if (await repo.finish(id, out.result, config.JOBS_RETENTION_HOURS, out.blobs)) {
          // The result is readable now; the per-sample CSV follows (GET .../samples.csv waits for it).
          const csv = await out.valuesCsv();
          await repo.addBlobIfDone(id, csv.name, csv.data);
        }
      } else if (row.kind === "consistency") {
        const files = { inspiral: "", merger_ringdown: "" };
        for (const name of CONSISTENCY_FILES) {
          const blob = await repo.readBlob(id, name);
          if (!blob) throw new SampleInputError(`The ${name} file is no longer stored (was the job cancelled?).`, { file: name });
          files[name] = blob.toString("utf8");
        }
        const out = await runConsistencyJob({ request: consistencyJobRequestSchema.parse(row.request), files, onProgress });
        await repo.finish(id, out, config.JOBS_RETENTION_HOURS, []);
      } else if (row.kind === "forecast") {
        const out = await runForecastJob({ request: row.request as ForecastJobInput["request"], catalogue: (row.request as { translate?: boolean }).translate === false ? null : catalogue, onProgress });
        await repo.finish(id, out, config.JOBS_RETENTION_HOURS, []);
      } else {
        const load = async (jobId: string) => {
          const event = await repo.get(jobId);
          const buf = await repo.readBlob(jobId, "stack.f64");
          if (!event || event.status !== "done" || !buf) return null;
          return { result: event.result as SamplesJobResult, values: readStackValues(buf) };
        };
        const out = await runStackJob({ request: row.request as StackJobRequest, catalogue, load, onProgress });
        await repo.finish(id, out, config.JOBS_RETENTION_HOURS, []);
      }
      log.info("job done");
    } catch (err) {
      if (err instanceof JobCancelled) {
        log.info("job cancelled");
        return;
      }
      if (err instanceof SampleInputError || err instanceof AppError) {
        const error: JobError = { message: err.message, ...(err instanceof SampleInputError ? err.location : {}) };
        await repo.fail(id, error, config.JOBS_RETENTION_HOURS);
        log.info({ error }, "job failed on its input");
        return;
      }
      log.error({ err }, "job attempt failed");
      if (job.retryCount >= job.retryLimit) {
        await repo.fail(id, { message: `The job failed in the worker after ${row.attempts} attempt(s): ${err instanceof Error ? err.message : String(err)}` }, config.JOBS_RETENTION_HOURS);
        return;
      }
      throw err;
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  }

  await boss.work<{ jobId: string }>(JOB_QUEUE, { pollingIntervalSeconds: 0.5, batchSize: 1, includeMetadata: true }, async (jobs) => {
    for (const job of jobs) await handle(job);
  });

  // Reconcile records whose queue entry failed (a dead worker's job after its last retry), delete expired jobs.
  const sweep = async () => {
    try {
      for (const row of await repo.unfinished()) {
        const state = await queue.state(row.queue_id!);
        if (state === "failed" || state === null) {
          await repo.fail(row.id, { message: `The worker stopped before finishing this job (${row.attempts} attempt(s)); it was given up.` }, config.JOBS_RETENTION_HOURS);
        }
      }
      await repo.deleteExpired();
    } catch (err) {
      logger.warn({ err }, "job sweep failed");
    }
  };
  const timer = setInterval(() => void sweep(), config.JOBS_SWEEP_SECONDS * 1000);
  timer.unref();
  void sweep();

  return {
    async stop() {
      clearInterval(timer);
      await queue.stop();
    },
  };
}
