import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ringdownConvertResponseSchema, type RingdownConvertResponse } from "../../common/ringdown.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { ringdownCatalogueSeed } from "../../seeds/ringdown-catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * POST /api/v1/convert/ringdown against the seeded catalogue. The spacetime entries' ringdown
 * mappings are checked against the light-ring correspondence computed here numerically from the
 * metric functions (Cardoso et al. 2009: omega = Omega_c l - i (n + 1/2) |lambda|), independently of
 * the catalogue's closed forms.
 */

/** Light-ring frequency and Lyapunov exponent of ds^2 = -A dt^2 + B dr^2 + C dOmega^2 (M = 1), by finite differences. */
function lightRing(A: (r: number) => number, B: (r: number) => number, C: (r: number) => number) {
  const g = (r: number) => A(r) / C(r);
  const dg = (r: number, h = 1e-5) => (g(r + h) - g(r - h)) / (2 * h);
  let lo = 2.5;
  let hi = 3.5;
  // g rises then falls: the light ring is where dg changes sign.
  for (let k = 0; k < 200; k += 1) {
    const mid = (lo + hi) / 2;
    if (dg(mid) > 0) lo = mid;
    else hi = mid;
  }
  const rc = (lo + hi) / 2;
  const h = 1e-4;
  const d2 = (g(rc + h) - 2 * g(rc) + g(rc - h)) / (h * h);
  return { rc, Omega: Math.sqrt(g(rc)), lambda: Math.sqrt((-C(rc) * d2) / (2 * B(rc))) };
}

const schwarzschild = lightRing(
  (r) => 1 - 2 / r,
  (r) => 1 / (1 - 2 / r),
  (r) => r * r,
);

describe("POST /api/v1/convert with a ringdown bound (and /convert/ringdown, which delegates)", () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof buildTestApp>;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction(async (trx) => {
      await catalogueSeed.run(trx);
      await ringdownCatalogueSeed.run(trx);
    });
    app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
  });
  afterAll(async () => {
    await tdb?.drop();
  });

  async function convert(body: object): Promise<RingdownConvertResponse> {
    const res = await request(app).post("/api/v1/convert").send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return ringdownConvertResponseSchema.parse(res.body);
  }

  it("when the metric is Schwarzschild, then the light ring sits at 3M with M Omega_c = M lambda = 1/(3 sqrt 3)", () => {
    // Standard result (Cardoso et al. 2009): 0.19245.
    expect(schwarzschild.rc).toBeCloseTo(3, 6);
    expect(schwarzschild.Omega).toBeCloseTo(1 / (3 * Math.sqrt(3)), 6);
    expect(schwarzschild.lambda).toBeCloseTo(1 / (3 * Math.sqrt(3)), 4);
  });

  it("when the spacetime entries' ringdown mappings are compared with the light ring of their metrics, then the first-order shifts agree", () => {
    const a = 1e-4;
    // Johannsen 2013, static, eps3 = alpha52 = 0: -g_tt = (1 - 2x)/(1 + alpha13 x^3)^2, g_rr = 1/(1 - 2x), x = M/r.
    const j = lightRing(
      (r) => (1 - 2 / r) / (1 + a / r ** 3) ** 2,
      (r) => 1 / (1 - 2 / r),
      (r) => r * r,
    );
    expect((j.Omega / schwarzschild.Omega - 1) / a).toBeCloseTo(-1 / 27, 3);
    // tau ~ 1/lambda: d tau / tau = -d lambda / lambda.
    expect(-(j.lambda / schwarzschild.lambda - 1) / a).toBeCloseTo(1 / 27, 2);
    // Johannsen & Psaltis 2011, static: -g_tt = (1 - 2x)(1 + eps3 x^3), g_rr = (1 + eps3 x^3)/(1 - 2x).
    const jp = lightRing(
      (r) => (1 - 2 / r) * (1 + a / r ** 3),
      (r) => (1 + a / r ** 3) / (1 - 2 / r),
      (r) => r * r,
    );
    expect((jp.Omega / schwarzschild.Omega - 1) / a).toBeCloseTo(1 / 54, 3);
    expect(Math.abs(jp.lambda / schwarzschild.lambda - 1) / a).toBeLessThan(2e-3);
    // Johannsen 2013 eps3 alone: it multiplies A and C alike and cancels from A/C (the naming trap).
    const e = lightRing(
      (r) => (1 + a / r ** 3) * (1 - 2 / r),
      (r) => (1 + a / r ** 3) / (1 - 2 / r),
      (r) => r * r * (1 + a / r ** 3),
    );
    expect(Math.abs(e.Omega / schwarzschild.Omega - 1)).toBeLessThan(1e-9);
  });

  it("when a bound on |df_220| is given with a remnant, then alpha13 and eps3 are limited at 27 U and 54 U with verdicts", async () => {
    const U = 0.02;
    const body = await convert({ bound: { parameter: "qnm_dfreq", mode: "220", upper: U, credibility: 0.9 }, remnant: { M_f: 67.5, chi_f: 0.68, frame: "detector", z: 0.09 } });
    const johannsen = body.results.find((r) => r.slug === "johannsen");
    // df = -alpha13/27 (light ring above): |alpha13| <= 27 U = 0.54, inside |alpha13| < 1.
    expect(johannsen?.status).toBe("bounded");
    expect(johannsen?.upper?.value).toBeCloseTo(27 * U, 8);
    expect(johannsen?.lower?.value).toBeCloseTo(-27 * U, 8);
    expect(johannsen?.verdict).toBe("valid");
    // df = +eps3/54: |eps3| <= 54 U = 1.08, above the rule of thumb |eps3| < 1 by a factor 1.08: the
    // translator's rule (a rule of thumb failing by 10 times or less stays valid, with a caution) applies.
    const jp = body.results.find((r) => r.slug === "johannsen-psaltis");
    expect(jp?.upper?.value).toBeCloseTo(54 * U, 8);
    expect(jp?.verdict).toBe("valid");
    expect(jp?.upper?.validity[0]?.factor).toBeCloseTo(1.08, 6);
    expect(jp?.upper?.validity[0]?.status).toBe("stretched");
    expect(jp?.upper?.failing).toBeNull();
    expect(jp?.cautions.find((c) => c.code === "validity")?.message).toMatch(/Stretched approximation/);
    // The theory-agnostic entry returns the bound itself.
    const generic = body.results.find((r) => r.slug === "ringdown-deviation");
    expect(generic?.upper?.value).toBeCloseTo(U, 10);
    // The Kerr mode at the remnant: detector-frame 67.5 M_sun, chi 0.68 (Berti, Cardoso & Will 2006 fit, F = 1.5251 - 1.1568 (0.32)^0.1292).
    const F = 1.5251 - 1.1568 * 0.32 ** 0.1292;
    expect(body.qnm.frequency_hz).toBeCloseTo(F / (2 * Math.PI * 67.5 * 4.925490947641267e-6), 6);
    expect(body.remnant.M_f_source).toBeCloseTo(67.5 / 1.09, 10);
  });

  it("when the rule of thumb fails by more than 10 times at the limit, then the limit is outside validity with the failing condition named", async () => {
    // eps3 = 54 U = 16.2 for U = 0.3: |eps3| < 1 exceeded 16.2 times (derived from df = eps3/54).
    const body = await convert({ bound: { parameter: "qnm_dfreq", upper: 0.3, credibility: 0.9 }, remnant: { M_f: 62, chi_f: 0.68, frame: "source" }, theories: ["johannsen-psaltis"] });
    const jp = body.results[0]!;
    expect(jp.verdict).toBe("outside_validity");
    expect(jp.upper?.failing?.factor).toBeCloseTo(16.2, 6);
    expect(jp.upper?.validity[0]?.status).toBe("fails");
    expect(jp.cautions.find((c) => c.code === "validity")?.message).toMatch(/more than 10 times/);
  });

  it("when the same ringdown body goes to /convert/ringdown, then the answer is the same as from /convert", async () => {
    const body = { bound: { parameter: "qnm_dtau", upper: 0.04, credibility: 0.9 }, binary: { m1: 36, m2: 29, frame: "source" } };
    const a = await request(app).post("/api/v1/convert").send(body);
    const b = await request(app).post("/api/v1/convert/ringdown").send(body);
    expect(a.status).toBe(200);
    expect(b.status).toBe(200);
    expect(b.body).toEqual(a.body);
    expect(a.body.kind).toBe("ringdown");
    expect(a.body.bound).toEqual({ parameter: "qnm_dtau", mode: "220", interval: [-0.04, 0.04], credibility: 0.9 });
  });

  it("when an inspiral bound names an unknown parameter, then the 400 lists the ringdown kinds too", async () => {
    const res = await request(app).post("/api/v1/convert").send({ bound: { parameter: "qnm_dphase", upper: 0.1, credibility: 0.9 }, binary: { m1: 36, m2: 29, frame: "source" } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields["bound.parameter"]).toMatch(/qnm_dfreq/);
  });

  it("when an interval on df is given, then a signed coupling gets a signed interval", async () => {
    // df = -alpha13/27 in [-0.01, 0.03] => alpha13 in [-0.81, 0.27] (derived).
    const body = await convert({ bound: { parameter: "qnm_dfreq", interval: [-0.01, 0.03], credibility: 0.9 }, remnant: { M_f: 62, chi_f: 0.68, frame: "source" }, theories: ["johannsen"] });
    const j = body.results[0]!;
    expect(j.lower?.value).toBeCloseTo(-0.81, 8);
    expect(j.upper?.value).toBeCloseTo(0.27, 8);
    expect(body.qnm.frame).toBe("source");
  });

  it("when a one-sided interval is given, then only the side the theory can reach is limited", async () => {
    // df = eps3/54 <= 0.02 (hi only): eps3 <= 1.08; for eps3 < 0 the shift is negative and never leaves [-inf, 0.02] (derived).
    const body = await convert({ bound: { parameter: "qnm_dfreq", interval: [null, 0.02], credibility: 0.9 }, remnant: { M_f: 62, chi_f: 0.68, frame: "source" }, theories: ["johannsen-psaltis"] });
    const r = body.results[0]!;
    expect(r.upper?.value).toBeCloseTo(1.08, 8);
    expect(r.lower).toBeNull();
    expect(r.unconstrained[0]?.side).toBe("negative");
  });

  it("when a bound on the damping time is given with a binary, then the remnant comes from the fits and the mapping dtau = alpha13/27 applies", async () => {
    const body = await convert({ bound: { parameter: "qnm_dtau", upper: 0.03, credibility: 0.9 }, binary: { m1: 36, m2: 29, frame: "source" } });
    // Husa et al. 2016: chi_f = 0.6800 for 36 + 29 non-spinning (our own computation).
    expect(body.remnant.from).toBe("fit");
    expect(body.remnant.chi_f).toBeCloseTo(0.68, 4);
    expect(body.remnant.chi_f_fit_spread).toBeLessThan(2e-4);
    const j = body.results.find((r) => r.slug === "johannsen");
    expect(j?.upper?.value).toBeCloseTo(27 * 0.03, 8);
    // The Johannsen-Psaltis entry has no damping mapping (lambda unchanged at first order): not listed.
    expect(body.results.find((r) => r.slug === "johannsen-psaltis")).toBeUndefined();
  });

  it("when a theory without a ringdown mapping is asked for, then it is not applicable with the reason", async () => {
    const body = await convert({ bound: { parameter: "qnm_dfreq", upper: 0.1, credibility: 0.9 }, remnant: { M_f: 62, chi_f: 0.68, frame: "source" }, theories: ["dcs"] });
    expect(body.results[0]?.status).toBe("not_applicable");
    expect(body.results[0]?.reason).toMatch(/no ringdown mapping/);
  });

  it("when the input is bad, then 400 names the field", async () => {
    const cases: [object, string][] = [
      [{ bound: { parameter: "qnm_dfreq", upper: 0.1, credibility: 0.9 }, remnant: { M_f: 62, chi_f: 1, frame: "source" } }, "remnant.chi_f"],
      [{ bound: { parameter: "qnm_dfreq", upper: 0.1, credibility: 0.9 }, remnant: { M_f: 62, chi_f: 0.7, frame: "detector" } }, "remnant.z"],
      [{ bound: { parameter: "qnm_dfreq", upper: 0.1, interval: [-1, 1], credibility: 0.9 }, remnant: { M_f: 62, chi_f: 0.7, frame: "source" } }, "bound.interval"],
      [{ bound: { parameter: "qnm_dfreq", credibility: 0.9 }, remnant: { M_f: 62, chi_f: 0.7, frame: "source" } }, "bound.upper"],
      [{ bound: { parameter: "qnm_dfreq", interval: [0.1, 0.2], credibility: 0.9 }, remnant: { M_f: 62, chi_f: 0.7, frame: "source" } }, "bound.interval"],
      [{ bound: { parameter: "qnm_dfreq", mode: "550", upper: 0.1, credibility: 0.9 }, remnant: { M_f: 62, chi_f: 0.7, frame: "source" } }, "bound.mode"],
      [{ bound: { parameter: "qnm_dfreq", upper: 0.1, credibility: 0.9 } }, "remnant"],
      [{ bound: { parameter: "qnm_dfreq", upper: 0.1, credibility: 0.9 }, remnant: { M_f: 62, chi_f: 0.7, frame: "source" }, theories: ["nope"] }, "theories"],
    ];
    for (const [body, field] of cases) {
      const res = await request(app).post("/api/v1/convert").send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(res.body.error.fields ?? {}), JSON.stringify(res.body)).toContain(field);
    }
  });

  it("POST /api/v1/consistency/coupling: when the Johannsen entry's light-ring shifts meet a test's widths, then the excluded alpha13 follows the same closed form", async () => {
    // The entry's inspiral term (b = -1) is left out here, so the ringdown side alone is checked (tests/api/consistency-coupling-bias.test.ts adds it).
    const test = { inspiral: { sigma_M_f: 4.34, sigma_chi_f: 0.028, rho: -0.83 }, merger_ringdown: { sigma_M_f: 3.84, sigma_chi_f: 0.078, rho: 0.97 }, inspiral_bias: { include: false } };
    const res = await request(app).post("/api/v1/consistency/coupling").send({ theory: "johannsen", binary: { m1: 39, m2: 32, frame: "detector", z: 0.09 }, test });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const body = res.body;
    expect(body.coupling.symbol).toBe("alpha13");
    // df = -a/27, dtau = +a/27 (light ring); the remnant from Husa et al. 2016 in the detector frame.
    const Mf = body.remnant.M_f;
    const chi = body.remnant.chi_f;
    const F = (j: number) => 1.5251 - 1.1568 * (1 - j) ** 0.1292;
    const Q = (j: number) => 0.7 + 1.4187 * (1 - j) ** -0.499;
    // Exact inversion written out here (derived): Q(chi') = Q(chi)(1 + df)(1 + dtau), M' = M F(chi')/(F(chi)(1 + df)).
    const inferred = (a: number) => {
      const df = -a / 27;
      const dt = a / 27;
      const target = Q(chi) * (1 + df) * (1 + dt);
      let lo = 0;
      let hi = 0.99;
      for (let k = 0; k < 80; k += 1) {
        const mid = (lo + hi) / 2;
        if (Q(mid) < target) lo = mid;
        else hi = mid;
      }
      return { M: (Mf * F(lo)) / (F(chi) * (1 + df)), chi: lo };
    };
    const cov = body.covariance;
    const det = cov[0][0] * cov[1][1] - cov[0][1] ** 2;
    const quantile = (a: number) => {
      const r = inferred(a);
      const x = (2 * (Mf - r.M)) / (Mf + r.M);
      const y = (2 * (chi - r.chi)) / (chi + r.chi);
      return 1 - Math.exp(-((cov[1][1] * x * x - 2 * cov[0][1] * x * y + cov[0][0] * y * y) / det) / 2);
    };
    for (const side of body.sides) {
      expect(side.x).not.toBeNull();
      expect(quantile(side.x)).toBeCloseTo(0.9, 3);
      // |alpha13| < 1 is a rule of thumb: exceeded by at most 10 times it stays valid (the translator's rule).
      expect(side.verdict).toBe(Math.abs(side.x) <= 10 ? "valid" : "outside_validity");
    }
    expect(body.track.length).toBeGreaterThan(50);
    expect(body.cautions.join(" ")).toMatch(/inspiral bias/);
    const bad = await request(app).post("/api/v1/consistency/coupling").send({ theory: "dcs", binary: { m1: 39, m2: 32, frame: "source" }, test });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.theory).toMatch(/no ringdown mapping/);
    const badRho = await request(app)
      .post("/api/v1/consistency/coupling")
      .send({ theory: "johannsen", binary: { m1: 39, m2: 32, frame: "source" }, test: { ...test, inspiral: { ...test.inspiral, rho: -1 } } });
    expect(badRho.status).toBe(400);
    expect(Object.keys(badRho.body.error.fields)).toContain("test.inspiral.rho");
  });
  it("POST /api/v1/consistency/coupling: when a theory shifts only the remnant, then the excluded shift follows from the deviation variables alone", async () => {
    const test = { inspiral: { sigma_M_f: 4.34, sigma_chi_f: 0.028, rho: -0.83 }, merger_ringdown: { sigma_M_f: 3.84, sigma_chi_f: 0.078, rho: 0.97 } };
    const res = await request(app).post("/api/v1/consistency/coupling").send({ theory: "remnant-deviation", binary: { m1: 39, m2: 32, frame: "detector", z: 0.09 }, test, credibility: 0.9 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const body = res.body;
    expect(body.coupling.symbol).toBe("dMf_rem");
    expect(body.model).toEqual({ qnm_frequency: false, qnm_damping: false, remnant_mass: true, remnant_spin: false, inspiral_bias: false });
    // With unshifted modes the ringdown reads the shifted remnant exactly: M_R = M (1 + x), chi_R = chi, and the
    // deviation is dM = 2 (M - M_R)/(M + M_R) = -2x/(2 + x), dchi = 0 (Ghosh et al. 2016 variables; derived).
    // With mu = (dM, 0): d^2 = dM^2 (Sigma^-1)_MM = dM^2 Sigma_chichi / det Sigma, and Q_GR = 1 - exp(-d^2/2) = 0.9
    // gives |dM| = sqrt(-2 ln 0.1 det Sigma / Sigma_chichi).
    const cov = body.covariance;
    const det = cov[0][0] * cov[1][1] - cov[0][1] ** 2;
    const edge = Math.sqrt((-2 * Math.log(0.1) * det) / cov[1][1]);
    const up = body.sides.find((s: { side: string }) => s.side === "positive");
    const down = body.sides.find((s: { side: string }) => s.side === "negative");
    // -2x/(2 + x) = -edge  =>  x = 2 edge/(2 - edge); and 2x/(2 + x) = edge for x < 0  =>  x = -2 edge/(2 + edge).
    expect(up.x).toBeCloseTo((2 * edge) / (2 - edge), 5);
    expect(down.x).toBeCloseTo((-2 * edge) / (2 + edge), 5);
    expect(up.validity[0].label).toMatch(/remnant mass/);
    expect(body.cautions.join(" ")).toMatch(/no remnant-spin mapping/);
  });
  it("POST /api/v1/consistency/coupling: when the test's widths are forecast for a detector, then they are the forecast's and the bound follows", async () => {
    const forecast = { curve: "aligo-design", f_low: 10, distance_mpc: 410, ringdown_snr: 21.9 };
    const res = await request(app).post("/api/v1/consistency/coupling").send({ theory: "ringdown-deviation", binary: { m1: 36, m2: 29, frame: "source", z: 0.09 }, test: { forecast } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const body = res.body;
    expect(body.widths.inspiral.from).toBe("forecast");
    expect(body.widths.merger_ringdown.from).toBe("forecast");
    // The worked GW150914-like case (our own computation): inspiral sigma(chi_f) = 0.028, correlation -0.83; ringdown
    // sigma(chi_f) = 0.078, correlation +0.97 (tests/physics/ringdown-forecast-widths.test.ts checks the engine closely).
    expect(body.widths.inspiral.sigma_chi_f).toBeCloseTo(0.028, 2);
    expect(body.widths.merger_ringdown.rho).toBeCloseTo(0.97, 1);
    expect(body.widths.forecast.snr).toBeCloseTo(44.9, 0);
    expect(body.widths.forecast.ringdown_snr).toBe(21.9);
    // The test's covariance is the sum of the two, each divided by the remnant (derived: J_I = -J_R = diag(1/M, 1/chi) at GR).
    const M = body.remnant.M_f;
    const chi = body.remnant.chi_f;
    const w = body.widths;
    expect(body.covariance[0][0]).toBeCloseTo((w.inspiral.sigma_M_f ** 2 + w.merger_ringdown.sigma_M_f ** 2) / M ** 2, 10);
    expect(body.covariance[1][1]).toBeCloseTo((w.inspiral.sigma_chi_f ** 2 + w.merger_ringdown.sigma_chi_f ** 2) / chi ** 2, 10);
    expect(body.sides.every((s: { x: number | null }) => s.x !== null)).toBe(true);
    expect(body.cautions.join(" ")).toMatch(/Fisher forecast on Advanced LIGO design/);
    // Mixed: given inspiral widths, forecast ringdown widths.
    const mixed = await request(app)
      .post("/api/v1/consistency/coupling")
      .send({ theory: "ringdown-deviation", binary: { m1: 36, m2: 29, frame: "source", z: 0.09 }, test: { inspiral: { sigma_M_f: 4, sigma_chi_f: 0.03 }, forecast: { curve: "aligo-design", ringdown_snr: 20 } } });
    expect(mixed.status, JSON.stringify(mixed.body)).toBe(200);
    expect(mixed.body.widths.inspiral).toMatchObject({ from: "given", sigma_M_f: 4 });
    expect(mixed.body.widths.merger_ringdown.from).toBe("forecast");
    // Bad input names the field.
    const bad: [object, string][] = [
      [{ theory: "ringdown-deviation", binary: { m1: 36, m2: 29, frame: "source", z: 0.09 }, test: {} }, "test.inspiral"],
      [{ theory: "ringdown-deviation", binary: { m1: 36, m2: 29, frame: "source", z: 0.09 }, test: { forecast: { curve: "aligo-design" } } }, "test.merger_ringdown"],
      [{ theory: "ringdown-deviation", binary: { m1: 36, m2: 29, frame: "source" }, test: { forecast } }, "binary.z"],
      [{ theory: "ringdown-deviation", binary: { m1: 36, m2: 29, frame: "source", z: 0.09 }, test: { forecast: { ...forecast, curve: "nope" } } }, "test.forecast.curve"],
      [{ theory: "ringdown-deviation", binary: { m1: 36, m2: 29, frame: "source", z: 0.09 }, test: { forecast: { ...forecast, f_low: 1 } } }, "test.forecast.f_low"],
    ];
    for (const [b, field] of bad) {
      const r = await request(app).post("/api/v1/consistency/coupling").send(b);
      expect(r.status, JSON.stringify(r.body)).toBe(400);
      expect(Object.keys(r.body.error.fields ?? {}), JSON.stringify(r.body)).toContain(field);
    }
  });
  it("when EdGB's ringdown mappings are compared with the light ring of the small-coupling metric, then the shifts agree, and a bound at a slowly spinning remnant limits alpha", async () => {
    // Small-coupling static EdGB metric of Yunes & Stein 2011 (coefficients from memory, as the entry says), M = 1:
    // -g_tt = f (1 + h), g_rr = (1 + k)/f; the light-ring shifts are computed here numerically, independently of the entry's closed form.
    const zeta = 1e-4;
    const f = (r: number) => 1 - 2 / r;
    const h = (r: number) => (zeta / (3 * f(r))) * r ** -3 * (1 + 26 / r + 66 / 5 / r ** 2 + 96 / 5 / r ** 3 - 80 / r ** 4);
    const k = (r: number) => (-zeta / f(r)) * r ** -2 * (1 + 1 / r + 52 / 3 / r ** 2 + 2 / r ** 3 + 16 / 5 / r ** 4 - 368 / 3 / r ** 5);
    const e = lightRing(
      (r) => f(r) * (1 + h(r)),
      (r) => (1 + k(r)) / f(r),
      (r) => r * r,
    );
    expect((e.Omega / schwarzschild.Omega - 1) / zeta).toBeCloseTo(4397 / 21870, 3);
    expect(-(e.lambda / schwarzschild.lambda - 1) / zeta).toBeCloseTo(0.0843, 2);

    // |df| <= U at a slowly spinning remnant: (4397/21870) 16 pi alpha^2 / M_f^4 = U, M_f in km (derived).
    const U = 0.01;
    const Mf = 20;
    const MfKm = Mf * 1.4766250385;
    const body = await convert({ bound: { parameter: "qnm_dfreq", upper: U, credibility: 0.9 }, remnant: { M_f: Mf, chi_f: 0.1, frame: "source" }, theories: ["edgb"] });
    const r = body.results[0]!;
    expect(r.status).toBe("bounded");
    expect(r.mapping?.source_status).toBe("memory");
    expect(r.upper?.value).toBeCloseTo(Math.sqrt((U * MfKm ** 4) / ((4397 / 21870) * 16 * Math.PI)), 3);
    expect(r.lower).toBeNull();
    // zeta_f = U / 0.201 = 0.050 < 0.1 and chi_f = 0.1 < 0.3: valid, with the from-memory caution.
    expect(r.verdict).toBe("valid");
    expect(r.cautions.map((c) => c.message).join(" ")).toMatch(/recalled from memory/);
    // A typical remnant spin breaks the non-rotating computation: outside validity (hard condition).
    const spinning = await convert({ bound: { parameter: "qnm_dfreq", upper: U, credibility: 0.9 }, remnant: { M_f: Mf, chi_f: 0.68, frame: "source" }, theories: ["edgb"] });
    expect(spinning.results[0]?.verdict).toBe("outside_validity");
    expect(spinning.results[0]?.upper?.failing?.label).toMatch(/non-rotating/);
  });

  it("when a ringdown bound limits EdGB validly, then the limit is quoted as sqrt(alpha) in km and compared with the entry's published bounds", async () => {
    // |df| <= U at a slowly spinning remnant: alpha^2 = U M_f^4 / ((4397/21870) 16 pi) with M_f in km (the mapping's own form, derived).
    const U = 0.01;
    const MfKm = 20 * 1.4766250385;
    const body = await convert({ bound: { parameter: "qnm_dfreq", upper: U, credibility: 0.9 }, remnant: { M_f: 20, chi_f: 0.1, frame: "source" }, theories: ["edgb"] });
    const r = body.results[0]!;
    const alpha = Math.sqrt((U * MfKm ** 4) / ((4397 / 21870) * 16 * Math.PI));
    expect(r.verdict).toBe("valid");
    expect(r.limit).toMatchObject({ symbol: "sqrt_alpha", unit: "km", side: "upper" });
    expect(r.limit?.value).toBeCloseTo(Math.sqrt(alpha), 3);
    // Lyu, Jiang & Yagi 2022: sqrt(alpha) <= 1.33 km at 90 % in convention A (the entry's published bound).
    const lyu = r.reference_bounds.find((c) => c.reference.key === "lyu-jiang-yagi-2022");
    expect(lyu?.value).toBe(1.33);
    expect(lyu?.ratio).toBeCloseTo(1.33 / Math.sqrt(alpha), 3);
    expect(lyu?.verdict).toBe(1.33 / Math.sqrt(alpha) > 1 ? "tighter" : "weaker");
    expect(lyu?.sentence).toMatch(/Lyu et al\. 2022/);
    // Only bounds on this coupling; the references are the mapping's and the bounds' sources, each in the bibliography.
    expect(r.reference_bounds.every((c) => c.symbol === "sqrt_alpha")).toBe(true);
    const keys = r.references.map((c) => c.key);
    expect(keys).toContain("cardoso-et-al-2009");
    expect(keys).toContain("lyu-jiang-yagi-2022");
    for (const k of keys) expect(body.bibliography.find((b) => b.key === k)?.title.length).toBeGreaterThan(0);
    expect(body.catalogue_revision).toMatch(/^\d+\.\d+\./);
  });

  it("when the ringdown limit is outside validity, then the published bounds are listed but not compared", async () => {
    // chi_f = 0.68 breaks the non-rotating condition chi_f <= 0.3 (hard): no comparison may be made.
    const body = await convert({ bound: { parameter: "qnm_dfreq", upper: 0.01, credibility: 0.9 }, remnant: { M_f: 20, chi_f: 0.68, frame: "source" }, theories: ["edgb"] });
    const r = body.results[0]!;
    expect(r.verdict).toBe("outside_validity");
    expect(r.reference_bounds.length).toBeGreaterThan(0);
    for (const c of r.reference_bounds) {
      expect(c.verdict).toBe("not_compared");
      expect(c.ratio).toBeNull();
      expect(c.sentence).toMatch(/outside the validity/);
    }
  });

  it("when a signed coupling is limited on both sides, then its magnitude limit is max(|lower|, |upper|); on one side only, there is none", async () => {
    const both = await convert({ bound: { parameter: "qnm_dfreq", interval: [-0.02, 0.05], credibility: 0.9 }, remnant: { M_f: 67.5, chi_f: 0.68, frame: "detector", z: 0.09 }, theories: ["ringdown-deviation"] });
    // Identity mapping: dfreq220 in [-0.02, 0.05], so |dfreq220| <= 0.05.
    expect(both.results[0]?.limit?.value).toBeCloseTo(0.05, 12);
    expect(both.results[0]?.references.map((c) => c.key)).toEqual(["gossan-veitch-sathyaprakash-2012", "berti-cardoso-will-2006"]);
    expect(both.bibliography.map((b) => b.key).sort()).toEqual(["berti-cardoso-will-2006", "gossan-veitch-sathyaprakash-2012"]);
    const one = await convert({ bound: { parameter: "qnm_dfreq", interval: [null, 0.05], credibility: 0.9 }, remnant: { M_f: 67.5, chi_f: 0.68, frame: "detector", z: 0.09 }, theories: ["ringdown-deviation"] });
    expect(one.results[0]?.upper?.value).toBeCloseTo(0.05, 12);
    expect(one.results[0]?.limit).toBeNull();
  });
});
