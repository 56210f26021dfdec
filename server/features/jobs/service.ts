import { randomBytes } from "node:crypto";
import { unlink } from "node:fs/promises";
import { jobViewSchema, type JobView, type SamplesJobRequest, type StackJobRequest } from "../../../common/jobs.ts";
import type { Config } from "../../config.ts";
import type { Knex } from "../../db/knex.ts";
import { ConflictError, NotFoundError, ValidationError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import type { ConvertService } from "../convert/service.ts";
import { selectTarget } from "../convert/samples-common.ts";
import type { JobQueue } from "./queue.ts";
import { nonMonotonicRefusal } from "./monotonic-check.ts";
import { jobsRepository, type JobRow } from "./repository.ts";
import { VALUES_CSV } from "../../jobs/samples-job.ts";
import { sniffFormat, type StoredUpload } from "./upload.ts";

const CSV_POLL_MS = 250;
const CSV_WAIT_MS = 60_000;

/** Creating, reading and cancelling jobs (docs/samples-jobs.md). The heavy work is the worker's. */

export function newJobId(): string {
  return randomBytes(18).toString("base64url");
}

export function jobsService(db: Knex, config: Config, queue: JobQueue, translator: ConvertService) {
  const repo = jobsRepository(db);

  const view = (row: JobRow): JobView =>
    jobViewSchema.parse({
      id: row.id,
      kind: row.kind,
      status: row.status,
      progress: row.progress,
      created_at: row.created_at.toISOString(),
      finished_at: row.finished_at?.toISOString() ?? null,
      expires_at: row.expires_at?.toISOString() ?? null,
      file: row.file,
      ...(row.status === "done" && row.result ? { result: row.result } : {}),
      ...(row.status === "failed" && row.error ? { error: row.error } : {}),
    });

  /** A queued or running record whose queue entry failed or vanished is failed: never stuck running. */
  async function reconcile(row: JobRow): Promise<JobRow> {
    if ((row.status !== "queued" && row.status !== "running") || !row.queue_id) return row;
    const state = await queue.state(row.queue_id);
    if (state === "failed" || state === null || state === "completed" || state === "cancelled") {
      const message =
        state === "failed" || state === null
          ? `The worker stopped before finishing this job (${row.attempts} attempt(s)); it was given up. Submit it again; if it fails again, the file may be too large for the workers' memory.`
          : "The job ended without a result.";
      await repo.fail(row.id, { message }, config.JOBS_RETENTION_HOURS);
      return (await repo.get(row.id)) ?? row;
    }
    return row;
  }

  async function enqueue(id: string): Promise<void> {
    const queueId = await queue.send(id);
    await repo.setQueueId(id, queueId);
  }

  return {
    repo,
    async createSamples(request: SamplesJobRequest, upload: StoredUpload, identity: Identity | undefined): Promise<JobView> {
      try {
        // Cheap checks now (theory, b, a mapping that turns for every plausible binary): a 400, not a failed job.
        const refusal = nonMonotonicRefusal(selectTarget(await translator.catalogue(), request), request);
        if (refusal) throw refusal;
        const format = await sniffFormat(upload.path);
        if (format !== "hdf5" && request.table && format === "text") {
          throw new ValidationError("Invalid table: a text file has one table; leave table out", { table: "only HDF5 and JSON files have tables" });
        }
        const id = newJobId();
        const file = { name: upload.originalname.slice(0, 255) || "upload", bytes: upload.size, sha256: upload.sha256, format };
        const maxSamples = identity ? config.JOBS_MAX_SAMPLES : config.JOBS_ANON_MAX_SAMPLES;
        await db.transaction(async (trx) => {
          await repo.insert(trx, { id, kind: "samples", owner_id: identity?.id ?? null, request: { ...request, max_samples: maxSamples }, file });
          await repo.storeFile(trx, id, "upload", upload.path);
        });
        await enqueue(id);
        return view((await repo.get(id))!);
      } finally {
        await unlink(upload.path).catch(() => undefined);
      }
    },
    async createStack(request: StackJobRequest, identity: Identity | undefined): Promise<JobView> {
      selectTarget(await translator.catalogue(), request);
      const fields: Record<string, string> = {};
      for (const [i, e] of request.events.entries()) {
        if (!("job" in e)) continue;
        const row = await repo.get(e.job);
        if (!row || row.kind !== "samples") fields[`events.${i}.job`] = `no samples job ${e.job} (finished jobs are kept ${config.JOBS_RETENTION_HOURS} hours)`;
        else if (row.status !== "done") fields[`events.${i}.job`] = `job ${e.job} is ${row.status}, not done`;
        else if ((row.request as { theory?: string }).theory !== request.theory) fields[`events.${i}.job`] = `job ${e.job} translated ${(row.request as { theory?: string }).theory}, not ${request.theory}`;
      }
      const first = Object.entries(fields)[0];
      if (first) throw new ValidationError(`Invalid ${first[0]}: ${first[1]}`, fields);
      const id = newJobId();
      await repo.insert(db, { id, kind: "stack", owner_id: identity?.id ?? null, request, file: null });
      await enqueue(id);
      return view((await repo.get(id))!);
    },
    async get(id: string): Promise<JobView> {
      const row = await repo.get(id);
      if (!row) throw new NotFoundError(`No job ${id}: it never existed or has expired (finished jobs are kept ${config.JOBS_RETENTION_HOURS} hours).`);
      return view(await reconcile(row));
    },
    async cancel(id: string): Promise<JobView> {
      const row = await repo.get(id);
      if (!row) throw new NotFoundError(`No job ${id}: it never existed or has expired.`);
      const ok = await repo.cancel(id, config.JOBS_RETENTION_HOURS);
      if (!ok) throw new ConflictError(`Job ${id} is already ${row.status}: only queued or running jobs can be cancelled.`);
      if (row.queue_id) await queue.cancel(row.queue_id).catch(() => undefined);
      return view((await repo.get(id))!);
    },
    async csv(id: string): Promise<AsyncGenerator<Buffer>> {
      const row = await repo.get(id);
      if (!row || row.kind !== "samples") throw new NotFoundError(`No samples job ${id}.`);
      if (row.status !== "done") throw new ConflictError(`Job ${id} is ${row.status}: the per-sample values exist once it is done.`);
      // The worker writes the CSV just after the result: wait for it (no work on this process, only polls).
      for (let waited = 0; !(await repo.hasBlob(id, VALUES_CSV)); waited += CSV_POLL_MS) {
        if (waited >= CSV_WAIT_MS) throw new ConflictError(`Job ${id}'s per-sample values were not written (the worker stopped after the result?); run the job again for the CSV.`);
        await new Promise((r) => setTimeout(r, CSV_POLL_MS));
      }
      return repo.blobChunks(id, VALUES_CSV);
    },
  };
}

export type JobsService = ReturnType<typeof jobsService>;
