import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { forecastGridResultSchema, forecastResponseSchema } from "../../common/forecasts.ts";
import type { DragomanApp } from "../../server/app.ts";
import { closeForecastPool } from "../../server/features/forecasts/pool.ts";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp, testConfig } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { waitForJob } from "../helpers/jobs.ts";

/**
 * POST /api/v1/jobs/forecast: a forecast grid (several sources, many b) on the job queue, with a worker
 * in this process. The worker pauses once past half-way (JOBS_TEST_PAUSE_MS, tests only), so a cancel
 * "mid-job" is a state the test waits for, not a race.
 */

const OVERRIDES = { JOBS_ANON_PER_HOUR: "1000", JOBS_TEST_PAUSE_MS: "4000", RATE_LIMIT_PER_MINUTE: "1000" };
const SOURCE = { m1: 36, m2: 29, chi1: 0, chi2: 0, frame: "source", distance_mpc: 410, z: 0.09 };
const SETTINGS = { detectors: [{ curve: "aligo-design" }, { curve: "lisa" }], networks: [[0], [0, 1]] };

describe("POST /api/v1/jobs/forecast", () => {
  let tdb: TestDatabase;
  let app: DragomanApp;
  let worker: RunningWorker;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb, OVERRIDES);
    const config = testConfig(tdb.url, OVERRIDES);
    worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
  });
  afterAll(async () => {
    await worker?.stop();
    await app?.locals.jobQueue.stop();
    await closeForecastPool();
    await tdb?.drop();
  });

  it("when a grid of two sources and 60 values of b is sent, then 202 with a job id, and the finished job holds one forecast per source equal to POST /forecasts for that source", async () => {
    const bs = Array.from({ length: 60 }, (_, i) => -15 + i * 0.25).filter((b) => b !== 0 && b !== 3);
    const heavy = { ...SOURCE, m1: 60, m2: 50 };
    const res = await request(app).post("/api/v1/jobs/forecast").send({ ...SETTINGS, sources: [SOURCE, heavy], b: bs, coalescence: "phi_c_per_detector" });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(202);
    expect(res.headers.location).toBe(`/api/v1/jobs/${res.body.job.id}`);
    const view = await waitForJob(app, res.body.job.id);
    expect(view.status, JSON.stringify(view.error)).toBe("done");
    expect(view.kind).toBe("forecast");
    const grid = forecastGridResultSchema.parse(view.result);
    expect(grid.forecasts).toHaveLength(2);
    expect(grid.forecasts[1]!.source.m1).toBe(60);
    expect(grid.forecasts[0]!.networks[1]!.rows.map((r) => r.b)).toEqual(bs);
    // the same computation as a single synchronous forecast, number for number
    const single = await request(app).post("/api/v1/forecasts").send({ ...SETTINGS, source: heavy, b: bs.slice(0, 40), coalescence: "phi_c_per_detector" });
    expect(single.status).toBe(200);
    const one = forecastResponseSchema.parse(single.body);
    one.networks.forEach((n, ni) => n.rows.forEach((r, i) => expect(grid.forecasts[1]!.networks[ni]!.rows[i]!.sigma_beta).toBe(r.sigma_beta)));
    // translated in the worker too: EdGB at b = -7 for the multi-band network
    const edgb = grid.forecasts[0]!.translations.filter((t) => t.b === -7 && t.network === 1).flatMap((t) => t.results).find((r) => r.theory === "edgb");
    expect(edgb?.coupling.value).toBeGreaterThan(0);
    expect(grid.forecasts[0]!.coalescence).toBe("phi_c_per_detector");
  });

  it("when the job is cancelled mid-way, then it is cancelled with no result and stays so", async () => {
    const res = await request(app).post("/api/v1/jobs/forecast").send({ ...SETTINGS, sources: [SOURCE, { ...SOURCE, m1: 40 }], b: [-7, -5, -3] });
    expect(res.status).toBe(202);
    const id = res.body.job.id as string;
    await waitForJob(app, id, (v) => (v.status === "running" && v.progress >= 0.5) || v.status === "done");
    const del = await request(app).delete(`/api/v1/jobs/${id}`);
    expect(del.status, JSON.stringify(del.body)).toBe(200);
    expect(del.body.status).toBe("cancelled");
    await new Promise((r) => setTimeout(r, 300));
    const view = await request(app).get(`/api/v1/jobs/${id}`);
    expect(view.body.status).toBe("cancelled");
    expect(view.body.result).toBeUndefined();
  });

  it("when a source cannot be forecast (a band that ends before it starts), then 400 naming the source and the field, and no job is made", async () => {
    const before = await tdb.db("analysis_jobs").count<{ count: string }[]>("id as count");
    const res = await request(app)
      .post("/api/v1/jobs/forecast")
      .send({ ...SETTINGS, sources: [SOURCE, { ...SOURCE, m1: 3000, m2: 2000 }], b: [-7] });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/sources\.1/);
    expect(Object.keys(res.body.error.fields)).toEqual(["detectors.0.f_low"]);
    const after = await tdb.db("analysis_jobs").count<{ count: string }[]>("id as count");
    expect(after[0]!.count).toBe(before[0]!.count);
  });

  it("when a source's mass is negative or a field is unknown, then 400 naming sources.N.m1 or the field", async () => {
    const bad = await request(app).post("/api/v1/jobs/forecast").send({ ...SETTINGS, sources: [SOURCE, { ...SOURCE, m1: -1 }], b: [-7] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty(["sources.1.m1"]);
    const unknown = await request(app).post("/api/v1/jobs/forecast").send({ ...SETTINGS, source: SOURCE, sources: [SOURCE], b: [-7] });
    expect(unknown.status).toBe(400);
    expect(JSON.stringify(unknown.body.error)).toMatch(/source/);
  });
});
