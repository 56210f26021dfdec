import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eventsResponseSchema, type EventsResponse } from "../../common/convert-samples.ts";
import { convertResponseSchema, type ConvertResult } from "../../common/convert.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * POST /api/v1/convert/events: each event's limit against POST /convert, the combined limit against
 * its derived scaling and against a numeric integration of the product of Gaussian likelihoods
 * written here (events are invented: KV-… labels of the fictional Kestrel-Vireo network).
 */

const KM_PER_MSUN = 1.3271244e20 / 299_792_458 ** 2 / 1000; // IAU 2015 B3 nominal (G M)_sun, exact c
const rel = (a: number, b: number) => Math.abs(a / b - 1);

/** Composite Simpson rule (our own quadrature). */
function simpson(f: (x: number) => number, a: number, b: number, n = 20_000): number {
  const h = (b - a) / n;
  let s = f(a) + f(b);
  for (let i = 1; i < n; i++) s += f(a + i * h) * (i % 2 ? 4 : 2);
  return (s * h) / 3;
}

/** Smallest t with F(t) = target for an increasing F on [lo, hi], by bisection. */
function bisect(F: (t: number) => number, target: number, lo: number, hi: number): number {
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (F(mid) < target) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/** EdGB |beta| per unit alpha^2 (alpha in km^2), non-spinning BHs: Yunes, Yagi & Pretorius 2016 Table I form (normalisation derived). */
function edgbK(m1Msun: number, m2Msun: number): number {
  const m1 = m1Msun * KM_PER_MSUN;
  const m2 = m2Msun * KM_PER_MSUN;
  const M = m1 + m2;
  const eta = (m1 * m2) / M ** 2;
  return ((5 / 7168) * (m1 ** 2 - m2 ** 2) ** 2 / (M ** 4 * eta ** 3.6)) * (16 * Math.PI) / M ** 4;
}

describe("POST /api/v1/convert/events", () => {
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

  async function events(body: object): Promise<EventsResponse> {
    const res = await request(app).post("/api/v1/convert/events").send(body);
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(200);
    return eventsResponseSchema.parse(res.body);
  }
  async function single(theory: string, body: object): Promise<ConvertResult> {
    const res = await request(app).post("/api/v1/convert").send({ ...body, theories: [theory] });
    expect(res.status).toBe(200);
    const r = convertResponseSchema.parse(res.body).results[0];
    if (!r) throw new Error(`no /convert result for ${theory}`);
    return r;
  }
  const edgbEvent = (label: string, m1: number, m2: number, upper: number) => ({ label, binary: { m1, m2, frame: "source" }, upper });

  it("when one event is given, then its limit, the tightest and the combined limit all equal POST /convert", async () => {
    const r = await events({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, events: [edgbEvent("KV-231107a", 10, 5, 1e-5)] });
    const ref = await single("edgb", { bound: { parameter: "ppe_beta", b: -7, upper: 1e-5, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } });
    expect(r.events[0]).toMatchObject({ label: "KV-231107a", limit: ref.coupling.value, valid: ref.valid, beta_max: 1e-5 });
    expect(r.tightest).toEqual({ label: "KV-231107a", limit: ref.coupling.value });
    // Derived (events.ts): for one event y_c = U / K, so x_c = (U / K)^(1/p) is the closed-form /convert limit.
    expect(rel(r.combined!.limit, ref.coupling.value)).toBeLessThan(1e-12);
    expect(r.combined!.rule).toMatch(/Gaussian approximation/);
    expect(r.cautions.some((c) => c.code === "prior" && /Gaussian/.test(c.message))).toBe(true);
  });

  it("when N identical events are given, then the combined limit scales as N^(-1/(2p)) in the canonical coupling", async () => {
    const one = await events({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, events: [edgbEvent("KV-1", 20, 8, 1e-5)] });
    const N = 9;
    const many = await events({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, events: Array.from({ length: N }, (_, i) => edgbEvent(`KV-${i}`, 20, 8, 1e-5)) });
    // Derived: 1/sigma_y^2 grows N-fold, so y_c ∝ N^(-1/2) and x = y^(1/p) ∝ N^(-1/(2p)); p = 2 in alpha, and sqrt(alpha) ∝ N^(-1/(4p)) = N^(-1/8).
    expect(many.power).toBe(2);
    expect(rel(many.combined!.limit, one.combined!.limit * N ** (-1 / (4 * 2)))).toBeLessThan(1e-12);
    expect(many.tightest!.limit).toBe(one.tightest!.limit);
  });

  it("when identical massive-graviton events are given, then the lower limit on lambda_g grows as N^(1/4) (p = -2)", async () => {
    const ev = (label: string) => ({ label, binary: { m1: 30, m2: 25, frame: "source", z: 0.2 }, upper: 0.02 });
    const one = await events({ theory: "massive-graviton", parameter: "ppe_beta", b: -3, credibility: 0.9, events: [ev("KV-a")] });
    const four = await events({ theory: "massive-graviton", parameter: "ppe_beta", b: -3, credibility: 0.9, events: ["KV-a", "KV-b", "KV-c", "KV-d"].map(ev) });
    expect(four.coupling.side).toBe("lower");
    // Derived: x ∝ N^(-1/(2p)) with p = -2 gives N^(1/4).
    expect(rel(four.combined!.limit, one.combined!.limit * 4 ** 0.25)).toBeLessThan(1e-12);
  });

  it("when events differ, then the combined limit matches a numeric integration of the product of half-normal likelihoods with a flat prior in alpha^2", async () => {
    const list = [edgbEvent("KV-231107a", 10, 5, 1e-5), edgbEvent("KV-240322c", 35, 9, 4e-6), edgbEvent("KV-240815b", 18, 12, 2e-5)];
    const c = 0.9;
    const r = await events({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: c, events: list });
    // Half-normal quantile q: the integral of the standard normal density over [0, q] is c / 2 (common practice).
    const phi = (t: number) => Math.exp(-t * t / 2) / Math.sqrt(2 * Math.PI);
    const q = bisect((t) => simpson(phi, 0, t, 2000), c / 2, 0, 10);
    expect(q).toBeCloseTo(1.6449, 3); // standard normal table: Phi^-1(0.95) = 1.6449
    const terms = list.map((e) => ({ K: edgbK(e.binary.m1, e.binary.m2), sigma: e.upper / q }));
    const like = (y: number) => Math.exp(-terms.reduce((s, t) => s + (t.K * y) ** 2 / (2 * t.sigma ** 2), 0));
    const yMax = 20 / Math.sqrt(terms.reduce((s, t) => s + (t.K / t.sigma) ** 2, 0));
    const total = simpson(like, 0, yMax);
    const yC = bisect((y) => simpson(like, 0, y, 4000) / total, c, 0, yMax);
    // y = alpha^2 (km^4); the quoted coupling is sqrt(alpha) = y^(1/4).
    expect(rel(r.combined!.limit, yC ** 0.25)).toBeLessThan(1e-5);
    expect(r.combined!.events_used).toBe(3);
    // Tightest: the smallest upper limit, compared with each /convert answer.
    const singles = await Promise.all(list.map((e) => single("edgb", { bound: { parameter: "ppe_beta", b: -7, upper: e.upper, credibility: c }, binary: e.binary })));
    const best = Math.min(...singles.map((s) => s.coupling.value));
    expect(r.tightest!.limit).toBe(best);
    expect(r.tightest!.label).toBe(list[singles.findIndex((s) => s.coupling.value === best)]!.label);
    expect(r.combined!.limit).toBeLessThan(best);
  });

  it("when an event is equal-mass non-spinning, then it has no limit, its reason is given and it is left out of the combination", async () => {
    const r = await events({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, events: [edgbEvent("KV-x", 10, 5, 1e-5), edgbEvent("KV-y", 8, 8, 1e-5)] });
    expect(r.events[1]).toMatchObject({ label: "KV-y", limit: null, reason: expect.stringMatching(/constrains nothing|vanish/) });
    expect(r.combined!.events_used).toBe(1);
    expect(r.cautions.some((c) => /left out of the combination/.test(c.message))).toBe(true);
  });

  it("when an event, the theory or b is wrong, then the 400 names that field", async () => {
    const bad = await request(app).post("/api/v1/convert/events").send({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, events: [edgbEvent("KV-1", 10, 5, 1e-3), edgbEvent("KV-2", -3, 5, 1e-3)] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields["events.1.binary.m1"]).toMatch(/positive/);
    const noUpper = await request(app).post("/api/v1/convert/events").send({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, events: [{ label: "KV-1", binary: { m1: 10, m2: 5, frame: "source" } }] });
    expect(noUpper.status).toBe(400);
    expect(noUpper.body.error.fields["events.0.upper"]).toMatch(/required/);
    const unknown = await request(app).post("/api/v1/convert/events").send({ theory: "nope", parameter: "ppe_beta", b: -7, credibility: 0.9, events: [edgbEvent("KV-1", 10, 5, 1e-3)] });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields.theory).toMatch(/unknown theory/);
    const wrongB = await request(app).post("/api/v1/convert/events").send({ theory: "edgb", parameter: "ppe_beta", b: 1, credibility: 0.9, events: [edgbEvent("KV-1", 10, 5, 1e-3)] });
    expect(wrongB.status).toBe(400);
    expect(wrongB.body.error.fields.b).toMatch(/b = -7/);
  });
});
