import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { consistencyResultSchema } from "../../common/consistency.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * POST /api/v1/consistency: every number is recomputed here from the published definition (Ghosh et al.
 * 2016, 2018: deviations normalised by the mean of the two estimates) with a first-order propagation
 * written out again in the test (derived), and the chi-square(2) credible level 1 - exp(-d^2/2).
 */

const inspiral = { M_f: 62.0, chi_f: 0.67, sigma_M_f: 4.3, sigma_chi_f: 0.028, rho: -0.83 };
const ringdown = { M_f: 66.0, chi_f: 0.72, sigma_M_f: 3.8, sigma_chi_f: 0.078, rho: 0.97 };

/** Independent delta-method propagation and Mahalanobis distance (derived). */
function expected(I: typeof inspiral, R: typeof ringdown) {
  const sM = I.M_f + R.M_f;
  const sC = I.chi_f + R.chi_f;
  const mu = [(2 * (I.M_f - R.M_f)) / sM, (2 * (I.chi_f - R.chi_f)) / sC];
  const a = [(4 * R.M_f) / sM ** 2, (4 * R.chi_f) / sC ** 2];
  const b = [(-4 * I.M_f) / sM ** 2, (-4 * I.chi_f) / sC ** 2];
  const cov = (s: typeof inspiral, j: number[]) => [
    [j[0]! ** 2 * s.sigma_M_f ** 2, j[0]! * j[1]! * s.rho * s.sigma_M_f * s.sigma_chi_f],
    [j[0]! * j[1]! * s.rho * s.sigma_M_f * s.sigma_chi_f, j[1]! ** 2 * s.sigma_chi_f ** 2],
  ];
  const ci = cov(I, a);
  const cr = cov(R, b);
  const S = [0, 1].map((r) => [0, 1].map((c) => ci[r]![c]! + cr[r]![c]!));
  const det = S[0]![0]! * S[1]![1]! - S[0]![1]! ** 2;
  const d2 = (S[1]![1]! * mu[0]! ** 2 - 2 * S[0]![1]! * mu[0]! * mu[1]! + S[0]![0]! * mu[1]! ** 2) / det;
  return { mu, S, d2 };
}

describe("POST /api/v1/consistency", () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof buildTestApp>;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
  });
  afterAll(async () => {
    await tdb?.drop();
  });

  it("when two Gaussian summaries are sent, then the deviation, its covariance and Q_GR = 1 - exp(-d^2/2) come back", async () => {
    const res = await request(app).post("/api/v1/consistency").send({ inspiral, merger_ringdown: ringdown, frame: "detector" });
    expect(res.status).toBe(200);
    const body = consistencyResultSchema.parse(res.body);
    const e = expected(inspiral, ringdown);
    expect(body.method).toBe("gaussian");
    expect(body.deviation.mean[0]).toBeCloseTo(e.mu[0]!, 12);
    expect(body.deviation.mean[1]).toBeCloseTo(e.mu[1]!, 12);
    expect(body.deviation.covariance[0][1]).toBeCloseTo(e.S[0]![1]!, 12);
    expect(body.gr_quantile).toBeCloseTo(1 - Math.exp(-e.d2 / 2), 10);
    expect(body.contours.map((c) => c.level)).toEqual([0.68, 0.9, 0.95]);
    // The 90 % ellipse: every vertex at d^2 = 4.605 from the mean (chi-square, 2 dof, common practice).
    const ring = body.contours[1]!.paths[0]!;
    const [m0, m1] = body.deviation.mean;
    const S = e.S;
    const det = S[0]![0]! * S[1]![1]! - S[0]![1]! ** 2;
    for (const [x, y] of ring.slice(0, 10)) {
      const dx = x - m0;
      const dy = y - m1;
      expect((S[1]![1]! * dx * dx - 2 * S[0]![1]! * dx * dy + S[0]![0]! * dy * dy) / det).toBeCloseTo(4.605, 2);
    }
    // Split frequency from the inspiral estimate's remnant, no full-signal remnant being given (the choice is
    // stated): f_c = 1/(pi M (r_ISCO^1.5 + chi)) in the detector frame (Ghosh et al. 2016, 2018; Bardeen, Press &
    // Teukolsky 1972 ISCO written out here).
    const fc = (M: number, chi: number) => {
      const z1 = 1 + Math.cbrt(1 - chi * chi) * (Math.cbrt(1 + chi) + Math.cbrt(1 - chi));
      const z2 = Math.sqrt(3 * chi * chi + z1 * z1);
      const r = 3 + z2 - Math.sqrt((3 - z1) * (3 + z1 + 2 * z2));
      return 1 / (Math.PI * M * 4.925490947641267e-6 * (r ** 1.5 + chi));
    };
    expect(body.split_frequency_hz).toBeCloseTo(fc(inspiral.M_f, inspiral.chi_f), 3);
    expect(body.split).toEqual({ frequency_hz: body.split_frequency_hz, from: "inspiral", M_f: inspiral.M_f, chi_f: inspiral.chi_f });
    expect(body.cautions.join(" ")).toMatch(/inspiral estimate's remnant, since no full-signal remnant was given/);
    // With the full-signal remnant, the split is at its ISCO (Ghosh et al. 2016, 2018).
    const full = await request(app).post("/api/v1/consistency").send({ inspiral, merger_ringdown: ringdown, frame: "source", z: 0.1, full_signal: { M_f: 62, chi_f: 0.69 } });
    expect(full.status).toBe(200);
    expect(full.body.split.from).toBe("full_signal");
    expect(full.body.split.M_f).toBeCloseTo(62 * 1.1, 12);
    expect(full.body.split_frequency_hz).toBeCloseTo(fc(62 * 1.1, 0.69), 3);
    const bad = await request(app).post("/api/v1/consistency").send({ inspiral, merger_ringdown: ringdown, frame: "detector", full_signal: { M_f: 62, chi_f: 1.2 } });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toContain("full_signal.chi_f");
    expect(body.cautions.join(" ")).toMatch(/Gaussian approximation/);
  });

  it("when the two estimates are identical (a GR injection), then the quantile is 0", async () => {
    const res = await request(app).post("/api/v1/consistency").send({ inspiral, merger_ringdown: inspiral, frame: "source", levels: [0.9] });
    expect(res.status).toBe(200);
    expect(res.body.gr_quantile).toBe(0);
    expect(res.body.split_frequency_hz).toBeUndefined();
    expect(res.body.cautions.join(" ")).toMatch(/source-frame masses without a redshift/);
  });

  it("when the merger-ringdown mass is shifted by a known amount, then the quantile is the analytic value", async () => {
    // Equal, uncorrelated widths; only the mass differs: d^2 = mu_M^2 / Sigma_MM, Q = 1 - exp(-d^2/2) (derived).
    const I = { M_f: 60, chi_f: 0.7, sigma_M_f: 2, sigma_chi_f: 0.05, rho: 0 };
    const R = { ...I, M_f: 66 };
    const res = await request(app).post("/api/v1/consistency").send({ inspiral: I, merger_ringdown: R, frame: "source", z: 0.1 });
    expect(res.status).toBe(200);
    const mu = (2 * (60 - 66)) / 126;
    const varM = ((4 * 66) / 126 ** 2) ** 2 * 4 + ((4 * 60) / 126 ** 2) ** 2 * 4;
    expect(res.body.gr_quantile).toBeCloseTo(1 - Math.exp(-(mu * mu) / varM / 2), 10);
    expect(res.body.split_frequency_hz).toBeGreaterThan(0);
  });

  it("when an estimate is unphysical or a field is unknown, then 400 names the field", async () => {
    const cases: [object, string][] = [
      [{ inspiral: { ...inspiral, chi_f: 1 }, merger_ringdown: ringdown, frame: "detector" }, "inspiral.chi_f"],
      [{ inspiral, merger_ringdown: { ...ringdown, M_f: -2 }, frame: "detector" }, "merger_ringdown.M_f"],
      [{ inspiral: { ...inspiral, rho: 1.2 }, merger_ringdown: ringdown, frame: "detector" }, "inspiral.rho"],
      [{ inspiral, merger_ringdown: ringdown, frame: "detector", levels: [0.9, 1] }, "levels.1"],
      // Unknown fields are named by their own path (strict request schemas).
      [{ inspiral, merger_ringdown: ringdown, frame: "detector", extra: 1 }, "extra"],
      [{ inspiral: { ...inspiral, sigma: 1 }, merger_ringdown: ringdown, frame: "detector" }, "inspiral.sigma"],
      [{ inspiral: { ...inspiral, chi_f: 0.02 }, merger_ringdown: { ...ringdown, chi_f: -0.01 }, frame: "detector" }, "merger_ringdown.chi_f"],
    ];
    for (const [body, field] of cases) {
      const res = await request(app).post("/api/v1/consistency").send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(res.body.error.fields ?? {}), JSON.stringify(res.body)).toContain(field);
    }
    const spin = await request(app)
      .post("/api/v1/consistency")
      .send({ inspiral: { ...inspiral, chi_f: 0.02 }, merger_ringdown: { ...ringdown, chi_f: -0.01 }, frame: "detector" });
    expect(spin.body.error.message).toMatch(/ill-defined/);
  });
});
