import { createReadStream, createWriteStream } from "node:fs";
import { once } from "node:events";
import type { Knex } from "../../db/knex.ts";
import type { JobError, JobKind, JobStatus } from "../../../common/jobs.ts";

/** Job records and their stored bytes (analysis_jobs, analysis_job_blobs). Plain objects out. */

export interface JobRow {
  id: string;
  kind: JobKind;
  status: JobStatus;
  progress: number;
  owner_id: number | null;
  request: unknown;
  file: { name: string; bytes: number; sha256: string; format: string } | null;
  result: unknown;
  error: JobError | null;
  attempts: number;
  queue_id: string | null;
  created_at: Date;
  started_at: Date | null;
  finished_at: Date | null;
  expires_at: Date | null;
}

export const BLOB_CHUNK = 1 << 20;
const FETCH_CHUNKS = 8;

export function jobsRepository(db: Knex) {
  return {
    async insert(trx: Knex.Transaction | Knex, row: Pick<JobRow, "id" | "kind" | "owner_id" | "request" | "file">): Promise<void> {
      await trx("analysis_jobs").insert({ ...row, status: "queued", progress: 0, request: JSON.stringify(row.request), file: row.file ? JSON.stringify(row.file) : null });
    },
    async setQueueId(id: string, queueId: string): Promise<void> {
      await db("analysis_jobs").where({ id }).update({ queue_id: queueId });
    },
    async get(id: string): Promise<JobRow | null> {
      const row = await db<JobRow>("analysis_jobs").where({ id }).first();
      return row ?? null;
    },
    /** Claims a job for an attempt: queued or running (a retry after a dead worker) becomes running. */
    async claim(id: string): Promise<JobRow | null> {
      const rows = await db<JobRow>("analysis_jobs")
        .where({ id })
        .whereIn("status", ["queued", "running"])
        .update({ status: "running", progress: 0, started_at: db.fn.now(), attempts: db.raw("attempts + 1") })
        .returning("*");
      return rows[0] ?? null;
    },
    /** False when the job is no longer running (cancelled): the worker stops. */
    async progress(id: string, progress: number): Promise<boolean> {
      const n = await db("analysis_jobs").where({ id, status: "running" }).update({ progress });
      return n > 0;
    },
    async finish(id: string, result: unknown, retentionHours: number, blobs: { name: string; data: Buffer }[]): Promise<boolean> {
      return db.transaction(async (trx) => {
        const n = await trx("analysis_jobs")
          .where({ id, status: "running" })
          .update({ status: "done", progress: 1, result: JSON.stringify(result), error: null, finished_at: trx.fn.now(), expires_at: trx.raw(`now() + interval '1 hour' * ?`, [retentionHours]) });
        if (n === 0) return false;
        await trx("analysis_job_blobs").where({ job_id: id, name: "upload" }).delete();
        for (const b of blobs) await insertChunks(trx, id, b.name, b.data);
        return true;
      });
    },
    async fail(id: string, error: JobError, retentionHours: number): Promise<boolean> {
      return db.transaction(async (trx) => {
        const n = await trx("analysis_jobs")
          .where({ id })
          .whereIn("status", ["queued", "running"])
          .update({ status: "failed", error: JSON.stringify(error), result: null, finished_at: trx.fn.now(), expires_at: trx.raw(`now() + interval '1 hour' * ?`, [retentionHours]) });
        await trx("analysis_job_blobs").where({ job_id: id }).delete();
        return n > 0;
      });
    },
    /** Cancels a queued or running job and deletes everything it stored but its record. */
    async cancel(id: string, retentionHours: number): Promise<boolean> {
      return db.transaction(async (trx) => {
        const n = await trx("analysis_jobs")
          .where({ id })
          .whereIn("status", ["queued", "running"])
          .update({ status: "cancelled", result: null, finished_at: trx.fn.now(), expires_at: trx.raw(`now() + interval '1 hour' * ?`, [retentionHours]) });
        if (n > 0) await trx("analysis_job_blobs").where({ job_id: id }).delete();
        return n > 0;
      });
    },
    /** Stores one more output of a finished job (nothing if it was cancelled or expired meanwhile). */
    async addBlobIfDone(id: string, name: string, data: Buffer): Promise<boolean> {
      return db.transaction(async (trx) => {
        const row = await trx("analysis_jobs").where({ id, status: "done" }).forUpdate().first("id");
        if (!row) return false;
        await insertChunks(trx, id, name, data);
        return true;
      });
    },
    async hasBlob(id: string, name: string): Promise<boolean> {
      return (await db("analysis_job_blobs").where({ job_id: id, name, seq: 0 }).first("seq")) !== undefined;
    },
    async unfinished(): Promise<Pick<JobRow, "id" | "queue_id" | "attempts">[]> {
      return db("analysis_jobs").whereIn("status", ["queued", "running"]).whereNotNull("queue_id").select("id", "queue_id", "attempts");
    },
    async deleteExpired(): Promise<number> {
      return db("analysis_jobs").where("expires_at", "<", db.fn.now()).delete();
    },
    async blobNames(id: string): Promise<string[]> {
      const rows = await db("analysis_job_blobs").where({ job_id: id }).distinct("name");
      return rows.map((r: { name: string }) => r.name);
    },
    async storeFile(trx: Knex.Transaction, id: string, name: string, path: string): Promise<void> {
      let seq = 0;
      for await (const chunk of createReadStream(path, { highWaterMark: BLOB_CHUNK })) {
        await trx("analysis_job_blobs").insert({ job_id: id, name, seq: seq++, data: chunk as Buffer });
      }
    },
    /** Writes a stored blob to a local file, a few chunks per query; false when there is none. */
    async fetchToFile(id: string, name: string, path: string): Promise<boolean> {
      const out = createWriteStream(path);
      let any = false;
      try {
        for await (const chunk of this.blobChunks(id, name)) {
          any = true;
          if (!out.write(chunk)) await once(out, "drain");
        }
      } finally {
        out.end();
        await once(out, "close");
      }
      return any;
    },
    /** Streams a stored blob, FETCH_CHUNKS chunks per query (fewer round trips, bounded memory). */
    async *blobChunks(id: string, name: string): AsyncGenerator<Buffer> {
      for (let seq = 0; ; seq += FETCH_CHUNKS) {
        const rows: { data: Buffer }[] = await db("analysis_job_blobs").where({ job_id: id, name }).where("seq", ">=", seq).where("seq", "<", seq + FETCH_CHUNKS).orderBy("seq").select("data");
        for (const row of rows) yield row.data;
        if (rows.length < FETCH_CHUNKS) return;
      }
    },
    async readBlob(id: string, name: string): Promise<Buffer | null> {
      const rows = await db("analysis_job_blobs").where({ job_id: id, name }).orderBy("seq").select("data");
      if (rows.length === 0) return null;
      return Buffer.concat(rows.map((r: { data: Buffer }) => r.data));
    },
  };
}

async function insertChunks(trx: Knex.Transaction, id: string, name: string, data: Buffer): Promise<void> {
  for (let seq = 0, at = 0; at < data.length || seq === 0; seq++, at += BLOB_CHUNK) {
    await trx("analysis_job_blobs").insert({ job_id: id, name, seq, data: data.subarray(at, at + BLOB_CHUNK) });
  }
}

export type JobsRepository = ReturnType<typeof jobsRepository>;
