import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { samplesRequestSchema, samplesResponseSchema, type SamplesResponse } from "../../common/convert-samples.ts";
import { convertSamples } from "../../server/features/convert/samples.ts";
import { seedCatalogue } from "./convert-fixture.ts";
import { convertResponseSchema, type ConvertResult } from "../../common/convert.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * POST /api/v1/convert/samples against the seeded catalogue: degenerate posteriors against
 * POST /convert, a synthetic posterior against a quantile worked out here from the published
 * mapping, validity fractions, and every refusal naming its column and row.
 */

// IAU 2015 B3 nominal (G M)_sun and the exact c (IAU 2015 Resolution B3; CODATA exact SI constants).
const KM_PER_MSUN = 1.3271244e20 / 299_792_458 ** 2 / 1000;
const rel = (a: number, b: number) => Math.abs(a / b - 1);
const repeat = <T,>(v: T, n: number): T[] => Array.from({ length: n }, () => v);

describe("POST /api/v1/convert/samples", () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof buildTestApp>;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
  });
  afterAll(async () => {
    await tdb?.drop();
  });

  async function samples(body: object): Promise<SamplesResponse> {
    const res = await request(app).post("/api/v1/convert/samples").send(body);
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(200);
    return samplesResponseSchema.parse(res.body);
  }
  async function single(theory: string, body: object): Promise<ConvertResult> {
    const res = await request(app).post("/api/v1/convert").send({ ...body, theories: [theory] });
    expect(res.status).toBe(200);
    const r = convertResponseSchema.parse(res.body).results[0];
    if (!r) throw new Error(`no /convert result for ${theory}`);
    return r;
  }

  it("when a large posterior is being translated, then the event loop gets turns meanwhile (other requests are answered)", async () => {
    const n = 20_000;
    const req = samplesRequestSchema.parse({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", columns: { beta: repeat(1e-3, n), m1: repeat(10, n), m2: repeat(5, n) } });
    let turns = 0;
    const tick = () => {
      turns++;
      if (!done) setImmediate(tick);
    };
    let done = false;
    const pending = convertSamples(seedCatalogue(), req).finally(() => {
      done = true;
    });
    setImmediate(tick);
    const out = await pending;
    expect(out.coupling.value).toBeGreaterThan(0);
    // Without yields the whole conversion runs before any other callback: zero turns.
    expect(turns).toBeGreaterThan(3);
  });

  it("when every sample has the same binary and the same |beta|, then the bound is exactly the /convert limit (EdGB)", async () => {
    const n = 500;
    const r = await samples({
      theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, bodies: ["bh", "bh"], frame: "source",
      // Signs alternate: each sample is translated through |beta|.
      columns: { beta: Array.from({ length: n }, (_, i) => (i % 2 ? -1e-3 : 1e-3)), m1: repeat(10, n), m2: repeat(5, n) },
    });
    const ref = await single("edgb", { bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } });
    expect(r.coupling).toMatchObject({ symbol: ref.coupling.symbol, unit: ref.coupling.unit, side: "upper" });
    expect(rel(r.coupling.value, ref.coupling.value)).toBeLessThan(1e-12);
    expect(r.samples).toMatchObject({ total: n, used: n, dropped: 0 });
    expect(r.histogram.counts.reduce((a, b) => a + b, 0)).toBe(n);
    expect(r.cautions.some((c) => c.code === "prior" && /not flat/.test(c.message))).toBe(true);
    expect(r.meaning).toMatch(/not reweighted for the prior/);
  });

  it("when beta is uniform on [0, B] for a fixed binary, then the bound is the EdGB inversion at the credibility quantile of beta", async () => {
    const n = 20_000;
    const B = 2e-3;
    const c = 0.9;
    // Stratified uniform samples: beta_i = B (i + 1/2) / n.
    const beta = Array.from({ length: n }, (_, i) => (B * (i + 0.5)) / n);
    const r = await samples({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: c, frame: "source", columns: { beta, m1: repeat(10, n), m2: repeat(5, n) } });
    // Yagi 2012 form: |beta| = (5/7168) zeta (m1^2 - m2^2)^2 / (M^4 eta^(18/5)) for non-spinning BHs,
    // zeta = 16 pi alpha^2 / M^4, so sqrt(alpha) grows as |beta|^(1/4) and its c-quantile is the inversion at beta = c B.
    const m1 = 10 * KM_PER_MSUN;
    const m2 = 5 * KM_PER_MSUN;
    const M = m1 + m2;
    const eta = (m1 * m2) / M ** 2;
    const perZeta = ((5 / 7168) * (m1 ** 2 - m2 ** 2) ** 2) / (M ** 4 * eta ** 3.6);
    const sqrtAlpha = (((c * B) / perZeta) * M ** 4 / (16 * Math.PI)) ** 0.25;
    expect(r.power).toBe(2);
    expect(rel(r.coupling.value, sqrtAlpha)).toBeLessThan(1e-4);
  });

  it("when beta follows a spread for the massive graviton, then lambda_g's lower bound is the inversion at the credibility quantile of |beta|", async () => {
    const n = 4000;
    const beta = Array.from({ length: n }, (_, i) => (0.04 * (i + 0.5)) / n);
    const r = await samples({ theory: "massive-graviton", parameter: "ppe_beta", b: -3, credibility: 0.9, frame: "source", columns: { beta, m1: repeat(30, n), m2: repeat(25, n), z: repeat(0.2, n) } });
    // beta = -pi^2 D_0 Mc / lambda_g^2 (Will 1998, Phys. Rev. D 57, 2061) falls as lambda_g grows: the large-|beta| tail sets the
    // lower limit, so lambda_min is the inversion at the 0.9 quantile of |beta| (0.036 here, up to the stratification).
    const ref = await single("massive-graviton", { bound: { parameter: "ppe_beta", b: -3, upper: 0.036, credibility: 0.9 }, binary: { m1: 30, m2: 25, frame: "source", z: 0.2 } });
    expect(r.coupling.side).toBe("lower");
    expect(r.power).toBe(-2);
    expect(rel(r.coupling.value, ref.coupling.value)).toBeLessThan(1e-3);
  });

  it("when half the samples violate EdGB's small-coupling condition, then its fraction is one half and a validity caution says so", async () => {
    // At 10 + 5 Msun, |beta| = 1e-3 fails the body-2 condition (see POST /convert tests) and 1e-7 passes: checked here through /convert.
    const binary = { m1: 10, m2: 5, frame: "source" };
    const bad = await single("edgb", { bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary });
    const good = await single("edgb", { bound: { parameter: "ppe_beta", b: -7, upper: 1e-7, credibility: 0.9 }, binary });
    const failing = bad.validity.filter((v) => !v.ok).map((v) => v.label);
    expect(failing.length).toBeGreaterThan(0);
    expect(good.validity.every((v) => v.ok)).toBe(true);
    const n = 1000;
    const r = await samples({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", columns: { beta: Array.from({ length: n }, (_, i) => (i < n / 2 ? 1e-3 : 1e-7)), m1: repeat(10, n), m2: repeat(5, n) } });
    for (const label of failing) {
      const v = r.validity.find((x) => x.label === label);
      expect(v).toMatchObject({ fraction_ok: 0.5, evaluated: n });
    }
    expect(r.cautions.some((c) => c.code === "validity" && /50\.0% of the samples fail/.test(c.message))).toBe(true);
  });

  it("when some samples are equal-mass non-spinning black holes, then they are dropped with the reason and the rest are translated", async () => {
    const r = await samples({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", columns: { beta: [1e-3, 1e-3, 1e-3, 1e-3], m1: [10, 8, 10, 8], m2: [5, 8, 5, 8] } });
    expect(r.samples).toMatchObject({ total: 4, used: 2, dropped: 2 });
    expect(r.samples.dropped_reasons[0]).toMatchObject({ count: 2, reason: expect.stringMatching(/vanishes/) });
    expect(r.cautions.some((c) => /2 of 4 samples were dropped/.test(c.message))).toBe(true);
  });

  it("when the posterior is uploaded as CSV, then it gives the same bound as the same columns in JSON", async () => {
    const csv = "beta,m1,m2,chi1\n1e-3,10,5,0\n5e-4,12,6,0.1\n2e-3,9,4,0\n";
    const res = await request(app)
      .post("/api/v1/convert/samples")
      .field("theory", "edgb").field("parameter", "ppe_beta").field("b", "-7").field("credibility", "0.5").field("frame", "source")
      .attach("file", Buffer.from(csv), { filename: "samples.csv", contentType: "text/csv" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const json = await samples({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.5, frame: "source", columns: { beta: [1e-3, 5e-4, 2e-3], m1: [10, 12, 9], m2: [5, 6, 4], chi1: [0, 0.1, 0] } });
    expect(samplesResponseSchema.parse(res.body).coupling.value).toBe(json.coupling.value);
  });

  it("when a CSV cell is not a number, then the 400 names the column, the row and the CSV line", async () => {
    const res = await request(app)
      .post("/api/v1/convert/samples")
      .field("theory", "edgb").field("parameter", "ppe_beta").field("b", "-7").field("credibility", "0.9").field("frame", "source")
      .attach("file", Buffer.from("beta,m1,m2\n1e-3,10,5\n1e-3,ten,5\n"), { filename: "s.csv", contentType: "text/csv" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields["columns.m1.1"]).toMatch(/row 1.*CSV line 3/);
  });

  it("when the CSV is larger than CONVERT_SAMPLES_MAX_BYTES, then the 400 names file", async () => {
    const small = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000", CONVERT_SAMPLES_MAX_BYTES: "200" });
    const csv = `beta,m1,m2\n${"1e-3,10,5\n".repeat(40)}`;
    const res = await request(small)
      .post("/api/v1/convert/samples")
      .field("theory", "edgb").field("parameter", "ppe_beta").field("b", "-7").field("credibility", "0.9").field("frame", "source")
      .attach("file", Buffer.from(csv), { filename: "s.csv", contentType: "text/csv" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.file).toMatch(/too large/);
  });

  it("when a JSON column holds a bad value, then the 400 names the column and its first bad row", async () => {
    const base = { theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source" };
    const notNumber = await request(app).post("/api/v1/convert/samples").send({ ...base, columns: { beta: [1e-3, 1e-3, 1e-3], m1: [10, 10, "x"], m2: [5, 5, 5] } });
    expect(notNumber.status).toBe(400);
    expect(Object.keys(notNumber.body.error.fields)).toEqual(["columns.m1.2"]);
    const mismatch = await request(app).post("/api/v1/convert/samples").send({ ...base, columns: { beta: [1e-3, 1e-3], m1: [10, 10], m2: [5] } });
    expect(mismatch.status).toBe(400);
    expect(mismatch.body.error.fields["columns.m2"]).toMatch(/same length/);
    const negative = await request(app).post("/api/v1/convert/samples").send({ ...base, columns: { beta: [1e-3, 1e-3], m1: [10, 10], m2: [5, -5] } });
    expect(negative.status).toBe(400);
    expect(negative.body.error.fields["columns.m2.1"]).toMatch(/row 1/);
    const spin = await request(app).post("/api/v1/convert/samples").send({ ...base, columns: { beta: [1e-3], m1: [10], m2: [5], chi2: [1.5] } });
    expect(spin.status).toBe(400);
    expect(Object.keys(spin.body.error.fields)).toEqual(["columns.chi2.0"]);
  });

  it("when the theory, b or redshift column is wrong, then the 400 names that field", async () => {
    const columns = { beta: [1e-3], m1: [10], m2: [5] };
    const unknown = await request(app).post("/api/v1/convert/samples").send({ theory: "no-such", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", columns });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields.theory).toMatch(/unknown theory/);
    const wrongB = await request(app).post("/api/v1/convert/samples").send({ theory: "edgb", parameter: "ppe_beta", b: -5, credibility: 0.9, frame: "source", columns });
    expect(wrongB.status).toBe(400);
    expect(wrongB.body.error.fields.b).toMatch(/b = -7/);
    const detector = await request(app).post("/api/v1/convert/samples").send({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "detector", columns });
    expect(detector.status).toBe(400);
    expect(detector.body.error.fields["columns.z"]).toMatch(/z column/);
    const noZ = await request(app).post("/api/v1/convert/samples").send({ theory: "massive-graviton", parameter: "ppe_beta", b: -3, credibility: 0.9, frame: "source", columns });
    expect(noZ.status).toBe(400);
    expect(noZ.body.error.fields["columns.z"]).toMatch(/redshift.*add a z column/);
    // Black-hole mass loss answers only for black holes (a neutron star does not lose mass into the bulk), as for a single bound.
    const ns = await request(app)
      .post("/api/v1/convert/samples")
      .send({ theory: "extra-dimension", coupling: "Mdot_loss", parameter: "ppe_beta", b: -13, credibility: 0.9, frame: "source", bodies: ["ns", "ns"], columns: { beta: [1e-3], m1: [1.4], m2: [1.3] } });
    expect(ns.status, JSON.stringify(ns.body)).toBe(400);
    expect(ns.body.error.fields.bodies).toMatch(/only for bh bodies/);
  });
});
