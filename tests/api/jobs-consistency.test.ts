import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { consistencyResultSchema } from "../../common/consistency.ts";
import type { DragomanApp } from "../../server/app.ts";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { buildTestApp, testConfig } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { waitForJob } from "../helpers/jobs.ts";

/**
 * POST /api/v1/jobs/consistency with a worker running in this process: two sample files drawn here
 * from Gaussians, the quantile against 1 - exp(-d^2/2) of the pairs' own mean and covariance (derived;
 * Monte-Carlo tolerance stated below), component masses through the remnant fit, and bad files failing
 * the job with the file, column and line named.
 */

const OVERRIDES = { JOBS_ANON_PER_HOUR: "10000", JOBS_SWEEP_SECONDS: "1", RATE_LIMIT_PER_MINUTE: "1000" };

function normals(seed: number): () => number {
  let s = seed;
  const u = () => {
    s = (s * 16807) % 2147483647;
    return s / 2147483647;
  };
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

function table(M0: number, c0: number, sM: number, sc: number, n: number, seed: number): string {
  const g = normals(seed);
  const rows = ["M_f,chi_f"];
  for (let i = 0; i < n; i += 1) rows.push(`${(M0 + sM * g()).toFixed(5)},${(c0 + sc * g()).toFixed(6)}`);
  return rows.join("\n");
}

describe("POST /api/v1/jobs/consistency", () => {
  let tdb: TestDatabase;
  let app: DragomanApp;
  let worker: RunningWorker;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    app = buildTestApp(tdb, OVERRIDES);
    const config = testConfig(tdb.url, OVERRIDES);
    worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
  });
  afterAll(async () => {
    await worker?.stop();
    await app?.locals.jobQueue.stop();
    await tdb?.drop();
  });

  const submit = (files: Record<string, string>, settings: object) => {
    let r = request(app).post("/api/v1/jobs/consistency").field("request", JSON.stringify(settings));
    for (const [name, text] of Object.entries(files)) r = r.attach(name, Buffer.from(text), `${name}.csv`);
    return r;
  };

  it("when two sample files are drawn from Gaussians, then the job's quantile matches 1 - exp(-d^2/2) within the Monte-Carlo tolerance", async () => {
    const res = await submit({ inspiral: table(62, 0.68, 2, 0.03, 20_000, 11), merger_ringdown: table(66, 0.72, 2.5, 0.04, 20_000, 29) }, { frame: "detector" });
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const view = await waitForJob(app, res.body.job.id as string);
    expect(view.status, JSON.stringify(view.error ?? {})).toBe("done");
    expect(view.kind).toBe("consistency");
    const r = consistencyResultSchema.parse(view.result);
    expect(r.method).toBe("samples");
    const c = r.deviation.covariance;
    const [a, b] = r.deviation.mean;
    const d2 = (c[1][1] * a * a - 2 * c[0][1] * a * b + c[0][0] * b * b) / (c[0][0] * c[1][1] - c[0][1] ** 2);
    // Tolerance 0.05: the density at (0, 0) comes from the few hundred pairs under the kernel there (our own estimate; tests/physics/ringdown-consistency.test.ts).
    expect(Math.abs(r.gr_quantile - (1 - Math.exp(-d2 / 2)))).toBeLessThan(0.05);
    expect(r.contours.map((k) => k.level)).toEqual([0.68, 0.9, 0.95]);
    expect(r.contours.every((k) => k.paths.length > 0)).toBe(true);
    expect(r.split_frequency_hz).toBeGreaterThan(100);
    // Each estimate's sample moments, for the coupling question's widths: the drawn Gaussians back within
    // four standard errors (mean sigma/sqrt(n), standard deviation sigma/sqrt(2n), correlation 1/sqrt(n); common practice).
    const n = 20_000;
    const e = r.estimates!;
    expect(e.frame).toBe("detector");
    for (const [got, M, chi, sM, sC] of [
      [e.inspiral, 62, 0.68, 2, 0.03],
      [e.merger_ringdown, 66, 0.72, 2.5, 0.04],
    ] as const) {
      expect(Math.abs(got.M_f - M)).toBeLessThan((4 * sM) / Math.sqrt(n));
      expect(Math.abs(got.chi_f - chi)).toBeLessThan((4 * sC) / Math.sqrt(n));
      expect(Math.abs(got.sigma_M_f - sM)).toBeLessThan((4 * sM) / Math.sqrt(2 * n));
      expect(Math.abs(got.sigma_chi_f - sC)).toBeLessThan((4 * sC) / Math.sqrt(2 * n));
      expect(Math.abs(got.rho)).toBeLessThan(4 / Math.sqrt(n));
    }
  });

  it("when the files are larger than a JSON body may be (over 2 MiB together), then the upload is accepted, not refused after being read", async () => {
    const inspiral = table(62, 0.68, 2, 0.03, 90_000, 5);
    const ringdown = table(66, 0.72, 2.5, 0.04, 90_000, 7);
    expect(inspiral.length + ringdown.length).toBeGreaterThan(2 * 1024 * 1024);
    const res = await submit({ inspiral, merger_ringdown: ringdown }, { frame: "detector", levels: [0.9] });
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const view = await waitForJob(app, res.body.job.id as string);
    expect(view.status, JSON.stringify(view.error ?? {})).toBe("done");
  });

  it("when the files give component masses, then each sample goes through the remnant fit", async () => {
    // 36 + 29 non-spinning: chi_f = 0.6800 (Husa et al. 2016, our own computation), identical in both files: a GR injection.
    const rows = (n: number, seed: number) => {
      const g = normals(seed);
      const out = ["m1 m2 chi1 chi2"];
      for (let i = 0; i < n; i += 1) out.push(`${(36 + 0.5 * g()).toFixed(4)} ${(29 + 0.5 * g()).toFixed(4)} 0 0`);
      return out.join("\n");
    };
    const res = await submit({ inspiral: rows(5000, 3), merger_ringdown: rows(5000, 5) }, { frame: "source", levels: [0.9] });
    const view = await waitForJob(app, res.body.job.id as string);
    expect(view.status, JSON.stringify(view.error ?? {})).toBe("done");
    const r = consistencyResultSchema.parse(view.result);
    expect(r.gr_quantile).toBeLessThan(0.1);
    expect(r.cautions.join(" ")).toMatch(/Husa et al. 2016 fits sample by sample/);
  });

  it("when a file is bad, then the job fails naming the file, column and line; a missing file is a 400", async () => {
    const bad = "M_f,chi_f\n" + Array.from({ length: 300 }, (_, i) => (i === 41 ? "63,abc" : "63,0.7")).join("\n");
    const res = await submit({ inspiral: bad, merger_ringdown: table(66, 0.72, 2.5, 0.04, 300, 2) }, { frame: "detector" });
    const view = await waitForJob(app, res.body.job.id as string);
    expect(view.status).toBe("failed");
    expect(view.error).toMatchObject({ file: "inspiral", column: "chi_f", line: 43 });
    const short = "M_f,chi_f\n" + Array.from({ length: 300 }, (_, i) => (i === 9 ? "63" : "63,0.7")).join("\n");
    const res2 = await submit({ inspiral: table(62, 0.68, 2, 0.03, 300, 1), merger_ringdown: short }, { frame: "detector" });
    const view2 = await waitForJob(app, res2.body.job.id as string);
    expect(view2.error?.message).toMatch(/merger_ringdown: line 11 has 1 values but the header names 2 columns/);
    const missing = await submit({ inspiral: table(62, 0.68, 2, 0.03, 300, 1) }, { frame: "detector" });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields.merger_ringdown).toMatch(/attach/);
    const badSettings = await submit({ inspiral: "x", merger_ringdown: "y" }, { frame: "sideways" });
    expect(badSettings.status).toBe(400);
    expect(Object.keys(badSettings.body.error.fields)).toContain("frame");
  });
});
