import { mkdtemp, readFile, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { gunzipSync } from "node:zlib";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { samplesJobResultSchema, stackJobResultSchema, type SamplesJobResult } from "../../common/jobs.ts";
import type { DragomanApp } from "../../server/app.ts";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp, testConfig } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { submitSamples, waitForJob } from "../helpers/jobs.ts";
import { filled, gaussian, toCsv, writeHdf5 } from "../helpers/samples-data.ts";

/**
 * POST /api/v1/jobs/samples, GET and DELETE /api/v1/jobs/:id with a worker running in this process
 * (the same code `npm run worker` runs): the same posterior as CSV and HDF5, detector frame with
 * distances, bad input naming the file, column and row, limits, cancellation.
 */

const OVERRIDES = { JOBS_ANON_PER_HOUR: "10000", JOBS_SWEEP_SECONDS: "1" };

describe("POST /api/v1/jobs/samples and /api/v1/jobs/stack", () => {
  let tdb: TestDatabase;
  let app: DragomanApp;
  let worker: RunningWorker;
  let dir: string;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb, OVERRIDES);
    const config = testConfig(tdb.url, OVERRIDES);
    worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
    dir = await mkdtemp(path.join(tmpdir(), "dragoman-jobs-test-"));
  });
  afterAll(async () => {
    await worker?.stop();
    await app?.locals.jobQueue.stop();
    await rm(dir, { recursive: true, force: true });
    await tdb?.drop();
  });

  const n = 20_000;
  // EdGB at b = -7 for a fixed 10 + 5 Msun binary: beta < 0 for every coupling, so half of a posterior centred on 0 is reachable.
  const beta = gaussian(11, n, 0, 2e-3);
  const settings = { theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", columns: { deviation: "beta", m1: "m1", m2: "m2" } };

  async function done(res: request.Response): Promise<SamplesJobResult> {
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(202);
    const view = await waitForJob(app, res.body.job.id as string);
    expect(view.status, JSON.stringify(view.error ?? {})).toBe("done");
    return samplesJobResultSchema.parse(view.result);
  }

  it("when a CSV posterior is submitted, then 202 with an unguessable id, and the worker's result carries the bound, verdict, samples and effective size", async () => {
    const res = await submitSamples(app, toCsv({ beta, m1: filled(n, 10), m2: filled(n, 5) }), "edgb.csv", settings);
    expect(res.body.job.id).toMatch(/^[A-Za-z0-9_-]{24}$/);
    expect(res.body.job.status).toBe("queued");
    const r = await done(res);
    expect(r.coupling.side).toBe("upper");
    expect(r.coupling.value).toBeGreaterThan(0);
    expect(r.samples.read).toBe(n);
    // About half of a zero-centred Gaussian lies on the reachable (negative) side (derived: symmetry).
    expect(Math.abs(r.samples.used / n - 0.5)).toBeLessThan(0.02);
    expect(r.effective_sample_size).toBe(r.samples.used);
    expect(["valid", "outside_validity"]).toContain(r.verdict);
    expect(r.file).toMatchObject({ name: "edgb.csv", format: "text" });
    expect(r.file.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(r.cautions.some((c) => c.code === "one_signed")).toBe(true);
  });

  it("when the same samples come as CSV and as HDF5 (written here with h5wasm), then the results agree", async () => {
    const m1 = gaussian(3, n, 12, 0.5);
    const m2 = gaussian(4, n, 6, 0.3);
    const csv = await done(await submitSamples(app, toCsv({ beta, m1, m2 }), "post.csv", settings));
    const h5 = path.join(dir, "post.h5");
    await writeHdf5(h5, "posterior", { beta, m1, m2 });
    const hdf = await done(await submitSamples(app, await readFile(h5), "post.h5", { ...settings, table: "/posterior" }));
    expect(hdf.file.format).toBe("hdf5");
    // String(x) round-trips doubles exactly (ECMAScript Number::toString), so the two are the same numbers.
    expect(hdf.coupling.value).toBe(csv.coupling.value);
    expect(hdf.samples).toEqual(csv.samples);
    expect(hdf.fraction_outside).toBe(csv.fraction_outside);
  });

  it("when masses are in the detector frame with luminosity distances, then the answer is the source-frame one", async () => {
    const z = 0.2;
    // D_L(z = 0.2) under Planck 2018 (H0 = 67.66, Omega_m = 0.3111), from our own integral, then read back as z.
    const { luminosityDistanceMpc } = await import("../../server/physics/cosmology.ts");
    const dl = luminosityDistanceMpc(z);
    const m1 = gaussian(5, n, 12, 0.5);
    const m2 = gaussian(6, n, 6, 0.3);
    const source = await done(await submitSamples(app, toCsv({ beta, m1, m2 }), "source.csv", settings));
    const det = await done(
      await submitSamples(app, toCsv({ beta, m1: m1.map((m) => m * (1 + z)), m2: m2.map((m) => m * (1 + z)), dl: filled(n, dl) }), "detector.csv", {
        ...settings,
        frame: "detector",
        columns: { ...settings.columns, distance_mpc: "dl" },
      }),
    );
    // The redshift comes back from a distance table (linear interpolation): agreement to 1e-6 relative.
    expect(Math.abs(det.coupling.value! / source.coupling.value! - 1)).toBeLessThan(1e-6);
    expect(det.cautions.some((c) => /1 \+ z/.test(c.message))).toBe(true);
  });

  it("when the job is done, then GET /jobs/:id/samples.csv gives one line per kept sample", async () => {
    const res = await submitSamples(app, toCsv({ beta, m1: filled(n, 10), m2: filled(n, 5) }), "edgb.csv", settings);
    const r = await done(res);
    const csv = await request(app).get(`/api/v1/jobs/${res.body.job.id}/samples.csv`).buffer(true).parse((resp, cb) => {
      const parts: Buffer[] = [];
      resp.on("data", (c: Buffer) => parts.push(c));
      resp.on("end", () => cb(null, Buffer.concat(parts)));
    });
    expect(csv.status).toBe(200);
    const text = Buffer.isBuffer(csv.body) ? csv.body.toString("utf8") : gunzipSync(csv.body as Buffer).toString("utf8");
    const lines = text.trim().split("\n");
    expect(lines[0]).toBe("row,deviation,beta,alpha,sqrt_alpha,weight");
    expect(lines.length - 1).toBe(r.samples.used);
  });

  it("when a column is not numeric, then the job fails naming the file, column and first bad row", async () => {
    const text = toCsv({ beta: beta.subarray(0, 50), m1: filled(50, 10), m2: filled(50, 5) }).replace(/\n([^\n]*)\n/, (_m, first: string) => `\n${first}\n`);
    const lines = text.split("\n");
    lines[8] = lines[8]!.replace(/,10,/, ",ten,");
    const res = await submitSamples(app, lines.join("\n"), "bad.csv", settings);
    const view = await waitForJob(app, res.body.job.id as string);
    expect(view.status).toBe("failed");
    expect(view.error).toMatchObject({ file: "bad.csv", column: "m1", row: 7, line: 9 });
    expect(view.error!.message).toMatch(/bad\.csv.*"m1".*row 7.*ten/);
  });

  it("when NaN values are few they are skipped with a note, and above the threshold the job fails naming the column", async () => {
    const few = Float64Array.from(beta.subarray(0, 2000));
    few[5] = Number.NaN;
    const ok = await done(await submitSamples(app, toCsv({ beta: few, m1: filled(2000, 10), m2: filled(2000, 5) }).replace("NaN", "nan"), "few.csv", settings));
    expect(ok.cautions.some((c) => /NaN or infinite "beta".*row 5/.test(c.message))).toBe(true);
    const many = Float64Array.from(few, (v, i) => (i % 10 === 3 ? Infinity : v));
    const res = await submitSamples(app, toCsv({ beta: many, m1: filled(2000, 10), m2: filled(2000, 5) }), "many.csv", settings);
    const view = await waitForJob(app, res.body.job.id as string);
    expect(view.status).toBe("failed");
    expect(view.error).toMatchObject({ file: "many.csv", column: "beta", row: 3 });
  });

  it("when masses or spins are out of range, then the job fails naming the column and row", async () => {
    const m2 = filled(100, 5);
    m2[42] = -1;
    let view = await waitForJob(app, (await submitSamples(app, toCsv({ beta: beta.subarray(0, 100), m1: filled(100, 10), m2 }), "m.csv", settings)).body.job.id as string);
    expect(view.error).toMatchObject({ column: "m2", row: 42 });
    const chi = filled(100, 0);
    chi[17] = 1.2;
    view = await waitForJob(app, (await submitSamples(app, toCsv({ beta: beta.subarray(0, 100), m1: filled(100, 10), m2: filled(100, 5), a1: chi }), "s.csv", { ...settings, columns: { ...settings.columns, chi1: "a1" } })).body.job.id as string);
    expect(view.error).toMatchObject({ column: "a1", row: 17 });
  });

  it("when an HDF5 path does not exist or the file is truncated, then the job fails naming the file and path", async () => {
    const h5 = path.join(dir, "p.h5");
    await writeHdf5(h5, "posterior", { beta: beta.subarray(0, 100), m1: filled(100, 10), m2: filled(100, 5) });
    const bytes = await readFile(h5);
    let view = await waitForJob(app, (await submitSamples(app, bytes, "p.h5", { ...settings, table: "/nowhere" })).body.job.id as string);
    expect(view.status).toBe("failed");
    expect(view.error).toMatchObject({ file: "p.h5", path: "/nowhere" });
    expect(view.error!.message).toMatch(/\/posterior/);
    view = await waitForJob(app, (await submitSamples(app, bytes.subarray(0, Math.floor(bytes.length / 2)), "cut.h5", { ...settings, table: "/posterior" })).body.job.id as string);
    expect(view.status).toBe("failed");
    expect(view.error!.file).toBe("cut.h5");
  });

  it("when the request names an unknown field, a missing mass pair or an unknown theory, then 400 names it and nothing is stored", async () => {
    const csv = toCsv({ beta: beta.subarray(0, 10), m1: filled(10, 10), m2: filled(10, 5) });
    const count = async () => Number((await tdb.db("analysis_jobs").count<{ count: string }[]>("* as count"))[0]!.count);
    const before = await count();
    let res = await submitSamples(app, csv, "a.csv", { ...settings, colour: "red" });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/colour/);
    res = await submitSamples(app, csv, "a.csv", { ...settings, columns: { deviation: "beta", m1: "m1" } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields as object)).toContain("columns.m1");
    res = await submitSamples(app, csv, "a.csv", { ...settings, theory: "no-such" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("theory");
    res = await request(app).post("/api/v1/jobs/samples").field("request", JSON.stringify(settings));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("file");
    expect(await count()).toBe(before);
  });

  it("when the file is larger than a JSON body may be (over 2 MiB), then the upload is still accepted and translated", async () => {
    const big = 100_000;
    const csv = toCsv({ beta: gaussian(13, big, 0, 2e-3), m1: filled(big, 10), m2: filled(big, 5) });
    expect(csv.length).toBeGreaterThan(2 * 1024 * 1024);
    const r = await done(await submitSamples(app, csv, "big.csv", settings));
    expect(r.samples.read).toBe(big);
  });

  it("when an anonymous upload is over the anonymous limit, then 413 names the limit", async () => {
    const small = buildTestApp(tdb, { ...OVERRIDES, JOBS_ANON_MAX_BYTES: "1000" });
    try {
      const res = await submitSamples(small, toCsv({ beta: beta.subarray(0, 200), m1: filled(200, 10), m2: filled(200, 5) }), "big.csv", settings);
      expect(res.status).toBe(413);
      expect(res.body.error.message).toMatch(/1000 bytes|977 KiB|limit/);
      expect(res.body.error.fields).toHaveProperty("file");
    } finally {
      await small.locals.jobQueue.stop();
    }
  });

  it("when two finished samples jobs are stacked (POST /jobs/stack), then the combined bound is tighter than each event's and carries a verdict", async () => {
    const a = await submitSamples(app, toCsv({ beta, m1: filled(n, 10), m2: filled(n, 5) }), "a.csv", settings);
    const b = await submitSamples(app, toCsv({ beta: gaussian(12, n, 0, 3e-3), m1: filled(n, 8), m2: filled(n, 3) }), "b.csv", settings);
    await done(a);
    await done(b);
    const body = { theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, prior: { kind: "uniform" }, include_outside_validity: true, events: [{ label: "A", job: a.body.job.id }, { label: "B", job: b.body.job.id }] };
    const res = await request(app).post("/api/v1/jobs/stack").send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const view = await waitForJob(app, res.body.job.id as string);
    expect(view.status, JSON.stringify(view.error ?? {})).toBe("done");
    const r = stackJobResultSchema.parse(view.result);
    expect(r.events.map((e) => e.label)).toEqual(["A", "B"]);
    // Both likelihoods fall with the coupling, so their product is at least as tight as the tighter event (up to the
    // grid's histogram noise, 1%) and tighter than the weaker one (derived).
    const bounds = r.events.map((e) => e.bound!);
    expect(r.coupling.value!).toBeLessThan(Math.min(...bounds) * 1.01);
    expect(r.coupling.value!).toBeLessThan(Math.max(...bounds));
    expect(["valid", "outside_validity", "not_assessed"]).toContain(r.verdict);
    // A job that is not a finished samples job is refused, naming the event.
    const bad = await request(app).post("/api/v1/jobs/stack").send({ ...body, events: [{ label: "X", job: "AAAAAAAAAAAAAAAAAAAAAAAA" }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty("events.0.job");
  });

  it("when a job is unknown, then GET and DELETE answer 404; a malformed id 400", async () => {
    expect((await request(app).get("/api/v1/jobs/AAAAAAAAAAAAAAAAAAAAAAAA")).status).toBe(404);
    expect((await request(app).delete("/api/v1/jobs/AAAAAAAAAAAAAAAAAAAAAAAA")).status).toBe(404);
    expect((await request(app).get("/api/v1/jobs/short")).status).toBe(400);
  });
});
