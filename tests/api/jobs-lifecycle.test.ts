import { spawn, type ChildProcess } from "node:child_process";
import { readdirSync, readFileSync } from "node:fs";
import { getPriority } from "node:os";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { DragomanApp } from "../../server/app.ts";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp, testConfig } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { submitSamples, waitForJob } from "../helpers/jobs.ts";
import { filled, gaussian, toCsv } from "../helpers/samples-data.ts";

/**
 * DELETE /api/v1/jobs/:id mid-job, and a worker process killed mid-job. The worker pauses halfway
 * (JOBS_TEST_PAUSE_MS, refused in production) so "mid-job" is a state the test waits for, not a race.
 * The worker process runs at the lower priority WORKER_NICE, read back while it is mid-job.
 */

const n = 5000;
const csv = toCsv({ beta: gaussian(9, n, 0, 2e-3), m1: filled(n, 10), m2: filled(n, 5) });
const settings = { theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", columns: { deviation: "beta", m1: "m1", m2: "m2" } };
const midway = (v: { status: string; progress: number }) => v.status === "running" && v.progress >= 0.5;

describe("DELETE /api/v1/jobs/:id", () => {
  let tdb: TestDatabase;
  let app: DragomanApp;
  let worker: RunningWorker;
  const overrides = { JOBS_ANON_PER_HOUR: "1000", JOBS_TEST_PAUSE_MS: "30000" };

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb, overrides);
    const config = testConfig(tdb.url, overrides);
    worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
  });
  afterAll(async () => {
    await worker?.stop();
    await app?.locals.jobQueue.stop();
    await tdb?.drop();
  });

  it("when a running job is cancelled mid-way, then it ends cancelled with only its record left, and cannot be cancelled twice", async () => {
    const res = await submitSamples(app, csv, "cancel.csv", settings);
    expect(res.status).toBe(202);
    const id = res.body.job.id as string;
    await waitForJob(app, id, midway);
    const del = await request(app).delete(`/api/v1/jobs/${id}`);
    expect(del.status).toBe(200);
    expect(del.body.status).toBe("cancelled");
    // The worker notices at its next progress write; give it a few of its 100 ms beats, then the record must still say cancelled.
    await new Promise((r) => setTimeout(r, 600));
    const view = await waitForJob(app, id);
    expect(view.status).toBe("cancelled");
    expect(view.result).toBeUndefined();
    const blobs = await tdb.db("analysis_job_blobs").where({ job_id: id }).count<{ count: string }[]>("* as count");
    expect(Number(blobs[0]!.count)).toBe(0);
    const row = await tdb.db("analysis_jobs").where({ id }).first();
    expect(row.result).toBeNull();
    expect((await request(app).delete(`/api/v1/jobs/${id}`)).status).toBe(409);
  });
});

const WORKER_NICE = 7;

/** The nice value of every thread of a process, from /proc (field 19 of stat, after the parenthesised name). */
function threadNices(pid: number): number[] {
  return readdirSync(`/proc/${pid}/task`).flatMap((tid) => {
    try {
      return [Number(readFileSync(`/proc/${pid}/task/${tid}/stat`, "utf8").split(") ")[1]?.split(" ")[16])];
    } catch {
      return []; // the thread ended meanwhile
    }
  });
}

describe("a worker process killed mid-job (running at the lower priority WORKER_NICE)", () => {
  let tdb: TestDatabase;
  let child: ChildProcess | undefined;
  const workers: RunningWorker[] = [];
  const apps: DragomanApp[] = [];

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
  });
  afterAll(async () => {
    child?.kill("SIGKILL");
    for (const w of workers) await w.stop();
    for (const a of apps) await a.locals.jobQueue.stop();
    await tdb?.drop();
  });

  /** A worker in its own process, the way `npm run worker` starts one, pausing halfway, at nice WORKER_NICE. */
  function spawnWorker(env: Record<string, string>): ChildProcess {
    return spawn(process.execPath, ["--import", "tsx", "server/jobs/worker-main.ts"], {
      env: { ...process.env, NODE_ENV: "test", LOG_LEVEL: "silent", DATABASE_URL: tdb.url, JOBS_TEST_PAUSE_MS: "60000", WORKER_NICE: String(WORKER_NICE), ...env },
      stdio: "ignore",
    });
  }

  async function killMidway(retryLimit: string): Promise<{ app: DragomanApp; id: string }> {
    const env = { JOBS_ANON_PER_HOUR: "1000", JOBS_EXPIRE_SECONDS: "2", JOBS_SWEEP_SECONDS: "1", JOBS_RETRY_LIMIT: retryLimit };
    const app = buildTestApp(tdb, env);
    apps.push(app);
    child = spawnWorker(env);
    const res = await submitSamples(app, csv, "killed.csv", settings);
    expect(res.status).toBe(202);
    const id = res.body.job.id as string;
    await waitForJob(app, id, midway);
    // Mid-job, so the process has set its priority long before: its main thread, and (Linux, where a
    // nice value is per thread) every thread it runs, are at WORKER_NICE; this test process is not.
    expect(getPriority(child.pid!)).toBe(WORKER_NICE);
    expect(getPriority()).not.toBe(WORKER_NICE);
    if (process.platform === "linux") expect(new Set(threadNices(child.pid!))).toEqual(new Set([WORKER_NICE]));
    child.kill("SIGKILL");
    await new Promise((r) => child!.once("exit", r));
    // A healthy worker (no pause) supervises the queue: it expires the dead worker's claim.
    const config = testConfig(tdb.url, env);
    workers.push(await startWorker({ config, db: tdb.db, logger: createLogger(config) }));
    return { app, id };
  }

  // Each starts a worker process (tsx compiles it at the lower priority) and waits out the queue's expiry: minutes on a loaded machine.
  it("when retries are left, then the job is retried by another worker and finishes", { timeout: 120_000 }, async () => {
    const { app, id } = await killMidway("1");
    const view = await waitForJob(app, id, (v) => v.status === "done" || v.status === "failed");
    expect(view.status).toBe("done");
    const row = await tdb.db("analysis_jobs").where({ id }).first();
    expect(row.attempts).toBe(2);
    await workers.pop()!.stop();
  });

  it("when no retry is left, then the job is failed with a message, never left running", { timeout: 120_000 }, async () => {
    const { app, id } = await killMidway("0");
    const view = await waitForJob(app, id, (v) => v.status !== "running" && v.status !== "queued");
    expect(view.status).toBe("failed");
    expect(view.error!.message).toMatch(/worker stopped/);
  });
});
