import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { couplingExclusionResponseSchema } from "../../common/consistency.ts";
import { closeForecastPool } from "../../server/features/forecasts/pool.ts";
import { inspiralRemnantWidths } from "../../server/physics/ringdown/forecast-widths.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { ringdownCatalogueSeed } from "../../seeds/ringdown-catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * POST /api/v1/consistency/coupling with the inspiral side of a theory's shift: the linear bias of the
 * inspiral estimate from the theory's ppE term (Cutler & Vallisneri 2007, arXiv:0707.2982; applied to
 * the IMR test as in Carson & Yagi 2020, arXiv:2002.08559, our reconstruction). The Johannsen 2013
 * entry has a 2PN term beta = (75/64)(eps3 - 2 alpha13) eta^(-4/5) (b = -1) beside its light-ring shifts
 * df = -alpha13/27, dtau = +alpha13/27.
 */
describe("POST /api/v1/consistency/coupling (inspiral bias)", () => {
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
    await closeForecastPool();
    await tdb?.drop();
  });

  const given = { inspiral: { sigma_M_f: 4.34, sigma_chi_f: 0.028, rho: -0.83 }, merger_ringdown: { sigma_M_f: 3.84, sigma_chi_f: 0.078, rho: 0.97 } };
  const binary = { m1: 39, m2: 32, frame: "detector", z: 0.09 };
  const post = (body: object) => request(app).post("/api/v1/consistency/coupling").send(body);

  it("when the widths are given and the theory has a ppE term, then the inspiral bias enters with the default curve, and the bound follows the closed form", async () => {
    const res = await post({ theory: "johannsen", binary, test: given });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const body = couplingExclusionResponseSchema.parse(res.body);
    expect(body.model).toEqual({ qnm_frequency: true, qnm_damping: true, remnant_mass: false, remnant_spin: false, inspiral_bias: true });
    expect(body.inspiral_bias).toMatchObject({ curve: "aligo-design", curve_from: "default" });
    expect(body.inspiral_bias!.terms.map((t) => t.b)).toEqual([-1]);
    // The bias per unit beta is the engine's for the source-frame binary at z (distance from z), on the same curve.
    const engine = inspiralRemnantWidths({ m1: 39 / 1.09, m2: 32 / 1.09, chi1: 0, chi2: 0, z: 0.09, detector: { curve: "aligo-design" }, bias_b: [-1] });
    const term = body.inspiral_bias!.terms[0]!;
    expect(term.d_ln_M_f_per_beta).toBeCloseTo(engine.bias[0]!.remnant[0], 10);
    expect(term.d_chi_f_per_beta).toBeCloseTo(engine.bias[0]!.remnant[1], 10);

    // Closed form written here (derived): beta = -(75/32) a eta^(-4/5); inspiral estimate (M e^{beta g_M}, chi + beta g_chi);
    // ringdown estimate from the exact inversion of the Berti et al. (2,2,0) fit at df = -a/27, dtau = a/27.
    const Mf = body.remnant.M_f;
    const chi = body.remnant.chi_f;
    const eta = (39 * 32) / 71 ** 2;
    const F = (j: number) => 1.5251 - 1.1568 * (1 - j) ** 0.1292;
    const Q = (j: number) => 0.7 + 1.4187 * (1 - j) ** -0.499;
    const ringdown = (a: number) => {
      const df = -a / 27;
      const target = Q(chi) * (1 + df) * (1 + a / 27);
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
      const beta = (-75 / 32) * a * eta ** -0.8;
      const MI = Mf * Math.exp(beta * term.d_ln_M_f_per_beta);
      const cI = chi + beta * term.d_chi_f_per_beta;
      const r = ringdown(a);
      const x = (2 * (MI - r.M)) / (MI + r.M);
      const y = (2 * (cI - r.chi)) / (cI + r.chi);
      return 1 - Math.exp(-((cov[1][1] * x * x - 2 * cov[0][1] * x * y + cov[0][0] * y * y) / det) / 2);
    };
    const without = await post({ theory: "johannsen", binary, test: { ...given, inspiral_bias: { include: false } } });
    expect(without.status).toBe(200);
    expect(without.body.model.inspiral_bias).toBe(false);
    expect(without.body.inspiral_bias).toBeNull();
    for (const side of body.sides) {
      expect(side.x).not.toBeNull();
      expect(quantile(side.x!)).toBeCloseTo(0.9, 3);
      // The 2PN term adds to the light-ring shifts' deviation on both sides here: a smaller bound (our own computation: about half).
      const other = without.body.sides.find((s: { side: string }) => s.side === side.side);
      expect(Math.abs(side.x!)).toBeLessThan(0.8 * Math.abs(other.x));
      expect(side.bias_sigmas_at_bound).not.toBeNull();
      expect(other.bias_sigmas_at_bound).toBeNull();
    }
    const text = body.cautions.join(" ");
    expect(text).toMatch(/linear bias of a GR template fitted to the theory's ppE term at b = -1/);
    expect(text).toMatch(/about one standard deviation/);
    expect(text).toMatch(/default curve/);
    expect(text).not.toMatch(/not modelled/);
  });

  it("when the widths are forecast, then the bias uses the forecast's detector and band", async () => {
    const forecast = { curve: "aligo-design", f_low: 10, distance_mpc: 410, ringdown_snr: 21.9 };
    const res = await post({ theory: "johannsen", binary: { m1: 36, m2: 29, frame: "source", z: 0.09 }, test: { forecast } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const body = couplingExclusionResponseSchema.parse(res.body);
    expect(body.inspiral_bias).toMatchObject({ curve: "aligo-design", curve_from: "test.forecast", f_low: 10 });
    expect(body.inspiral_bias!.f_high).toBe(body.widths.forecast!.f_high);
    expect(body.inspiral_bias!.snr).toBe(body.widths.forecast!.snr);
    const engine = inspiralRemnantWidths({ m1: 36, m2: 29, chi1: 0, chi2: 0, z: 0.09, distance_mpc: 410, detector: { curve: "aligo-design", f_low: 10 }, bias_b: [-1] });
    expect(body.inspiral_bias!.terms[0]!.d_ln_M_f_per_beta).toBeCloseTo(engine.bias[0]!.remnant[0], 10);
    // Where the bias passes one standard deviation of the inspiral estimate, it is reported below the bound.
    for (const side of body.sides) {
      if (side.bias_exceeds_sigma_at !== null) expect(Math.abs(side.bias_exceeds_sigma_at)).toBeLessThanOrEqual(Math.abs(side.x!));
    }
  });

  it("when a theory has no ppE term for the coupling, then no bias enters and the caution says why", async () => {
    const res = await post({ theory: "ringdown-deviation", binary, test: given });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.model.inspiral_bias).toBe(false);
    expect(res.body.inspiral_bias).toBeNull();
    expect(res.body.cautions.join(" ")).toMatch(/no inspiral-phase mapping/);
    expect(res.body.sides.every((s: { bias_exceeds_sigma_at: number | null }) => s.bias_exceeds_sigma_at === null)).toBe(true);
  });

  it("when the bias's detector is named, then it is used; a bad one is a 400 naming the field", async () => {
    const et = await post({ theory: "johannsen", binary, test: { ...given, inspiral_bias: { curve: "et-b", f_low: 5 } } });
    expect(et.status, JSON.stringify(et.body)).toBe(200);
    expect(et.body.inspiral_bias).toMatchObject({ curve: "et-b", curve_from: "test.inspiral_bias", f_low: 5 });
    expect(et.body.cautions.join(" ")).not.toMatch(/default curve/);
    const bad: [object, string][] = [
      [{ theory: "johannsen", binary, test: { ...given, inspiral_bias: { curve: "nope" } } }, "test.inspiral_bias.curve"],
      [{ theory: "johannsen", binary, test: { ...given, inspiral_bias: { f_low: 1 } } }, "test.inspiral_bias.f_low"],
      [{ theory: "johannsen", binary, test: { ...given, inspiral_bias: { include: "yes" } } }, "test.inspiral_bias.include"],
      [{ theory: "johannsen", binary, test: { ...given, inspiral_bias: { curve: "aligo-design", extra: 1 } } }, "test.inspiral_bias.extra"],
      [{ theory: "johannsen", binary: { m1: 36, m2: 29, frame: "source", z: 0.09 }, test: { forecast: { curve: "aligo-design", ringdown_snr: 20 }, inspiral_bias: { curve: "et-b" } } }, "test.inspiral_bias.curve"],
      [{ theory: "johannsen", binary: { m1: 36, m2: 29, frame: "source" }, test: given }, "binary.z"],
    ];
    for (const [body, field] of bad) {
      const r = await post(body);
      expect(r.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(r.body.error.fields ?? {}), JSON.stringify(r.body)).toContain(field);
    }
    // Without z the request goes through when the bias is left out.
    const noZ = await post({ theory: "johannsen", binary: { m1: 36, m2: 29, frame: "source" }, test: { ...given, inspiral_bias: { include: false } } });
    expect(noZ.status, JSON.stringify(noZ.body)).toBe(200);
  });
});
