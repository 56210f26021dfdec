import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { curveInfoSchema } from "../../common/forecasts.ts";
import { closeForecastPool } from "../../server/features/forecasts/pool.ts";
import { builtInCurve } from "../../server/physics/forecast/curves.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { ringdownCatalogueSeed } from "../../seeds/ringdown-catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * POST /api/v1/consistency/coupling with the test's widths forecast on any curve the forecasts take:
 * a space detector (a massive binary at LISA, with its observing window) and an uploaded curve (custom:<id>,
 * its owner only).
 */
describe("POST /api/v1/consistency/coupling (forecast widths on space and uploaded curves)", () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof buildTestApp>;
  const auth: Record<string, string> = {};

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction(async (trx) => {
      await catalogueSeed.run(trx);
      await ringdownCatalogueSeed.run(trx);
    });
    app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
    for (const login of ["t-cc-1", "t-cc-2"]) {
      await ensureUser(tdb.db, { login, roles: ["analyst"] });
      auth[login] = `Bearer ${await bearerFor(tdb.db, login)}`;
    }
  });
  afterAll(async () => {
    await closeForecastPool();
    await tdb?.drop();
  });

  const gw150914 = { theory: "ringdown-deviation", binary: { m1: 36, m2: 29, frame: "source", z: 0.09 } };

  it("when a massive binary is forecast at LISA, then the band opens 4 years before merger (Newtonian chirp) and the widths come from it", async () => {
    const res = await request(app)
      .post("/api/v1/consistency/coupling")
      .send({ theory: "ringdown-deviation", binary: { m1: 6e5, m2: 4e5, frame: "source", z: 1 }, test: { forecast: { curve: "lisa", ringdown_snr: 1000 } } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const f = res.body.widths.forecast;
    expect(f.curve).toBe("lisa");
    // Leading-order time to coalescence tau = (5/256) (pi f)^(-8/3) (G Mc_z / c^3)^(-5/3) (Peters 1964; common practice),
    // solved for the frequency 4 Julian years before merger, Mc_z = (1 + z) Mc of 6e5 + 4e5 M_sun.
    const mc = (6e5 * 4e5) ** 0.6 / (1e6) ** 0.2;
    const mcS = 2 * mc * 4.925490947641267e-6;
    const tau = 4 * 365.25 * 86400;
    expect(f.f_low).toBeCloseTo((1 / Math.PI) * (5 / (256 * tau)) ** (3 / 8) * mcS ** (-5 / 8), 9);
    // The band ends at the split frequency of the GR remnant, or the PhenomA merger frequency below it (said in high_cut).
    expect(f.f_high).toBeLessThanOrEqual(f.split_frequency_hz);
    expect(f.high_cut).toMatch(/split frequency|PhenomA merger/);
    // Millihertz: the split frequency of a 2e6 M_sun (detector-frame) remnant scales as 1/M from a few hundred Hz at 65 M_sun.
    expect(f.split_frequency_hz).toBeGreaterThan(1e-3);
    expect(f.split_frequency_hz).toBeLessThan(1e-2);
    expect(res.body.widths.inspiral.from).toBe("forecast");
    expect(res.body.cautions.join(" ")).toMatch(/Fisher forecast on LISA/);

    // Twice the distance: the SNR halves exactly (h proportional to 1/D) and the widths grow, by at most twice
    // (Fisher covariance proportional to 1/SNR^2, e.g. Vallisneri 2008, arXiv:gr-qc/0703086; the spin priors keep it below 2).
    const near = res.body.widths;
    const far = await request(app)
      .post("/api/v1/consistency/coupling")
      .send({ theory: "ringdown-deviation", binary: { m1: 6e5, m2: 4e5, frame: "source", z: 1 }, test: { forecast: { curve: "lisa", ringdown_snr: 1000, distance_mpc: 2 * 6791 } } });
    expect(far.status, JSON.stringify(far.body)).toBe(200);
    const nearSnr = (await request(app)
      .post("/api/v1/consistency/coupling")
      .send({ theory: "ringdown-deviation", binary: { m1: 6e5, m2: 4e5, frame: "source", z: 1 }, test: { forecast: { curve: "lisa", ringdown_snr: 1000, distance_mpc: 6791 } } })).body.widths;
    expect(far.body.widths.forecast.snr / nearSnr.forecast.snr).toBeCloseTo(0.5, 9);
    const growth = far.body.widths.inspiral.sigma_chi_f / nearSnr.inspiral.sigma_chi_f;
    expect(growth).toBeGreaterThan(1.2);
    expect(growth).toBeLessThanOrEqual(2);
    expect(near.inspiral.sigma_chi_f).toBeGreaterThan(0);

    // The observing window: one year ending at merger starts the band later (at the 1-year frequency), so the SNR drops.
    const short = await request(app)
      .post("/api/v1/consistency/coupling")
      .send({ theory: "ringdown-deviation", binary: { m1: 6e5, m2: 4e5, frame: "source", z: 1 }, test: { forecast: { curve: "lisa", ringdown_snr: 1000, years_observed: 1, years_before_merger: 1 } } });
    expect(short.status, JSON.stringify(short.body)).toBe(200);
    expect(short.body.widths.forecast.f_low / f.f_low).toBeCloseTo(4 ** (3 / 8), 6);
    expect(short.body.widths.forecast.snr).toBeLessThan(f.snr);
    // A window on a ground detector is refused, naming the field.
    const ground = await request(app)
      .post("/api/v1/consistency/coupling")
      .send({ ...gw150914, test: { forecast: { curve: "aligo-design", ringdown_snr: 20, years_observed: 1 } } });
    expect(ground.status).toBe(400);
    expect(Object.keys(ground.body.error.fields ?? {})).toContain("test.forecast.years_observed");
  });

  it("when the owner forecasts on an uploaded copy of a built-in curve, then the widths match the built-in's; others get 400 naming the curve", async () => {
    // The Advanced LIGO design PSD tabulated on 400 log-spaced points, 10 Hz to 4 kHz: interpolation error well below a per cent.
    const design = builtInCurve("aligo-design")!;
    const rows: string[] = [];
    for (let i = 0; i < 400; i++) {
      const f = 10 * 400 ** (i / 399);
      rows.push(`${f} ${design.psd(f, 4)}`);
    }
    const up = await request(app).post("/api/v1/forecasts/curves").set("Authorization", auth["t-cc-1"]!).send({ name: "Design, tabulated", kind: "psd", convention: "l_shaped", data: rows.join("\n") });
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    const id = curveInfoSchema.parse(up.body).id;
    const forecast = { f_low: 10, distance_mpc: 410, ringdown_snr: 21.9 };
    const builtIn = await request(app).post("/api/v1/consistency/coupling").send({ ...gw150914, test: { forecast: { ...forecast, curve: "aligo-design" } } });
    const custom = await request(app).post("/api/v1/consistency/coupling").set("Authorization", auth["t-cc-1"]!).send({ ...gw150914, test: { forecast: { ...forecast, curve: id } } });
    expect(builtIn.status, JSON.stringify(builtIn.body)).toBe(200);
    expect(custom.status, JSON.stringify(custom.body)).toBe(200);
    expect(custom.body.widths.forecast.curve).toBe(id);
    expect(custom.body.widths.forecast.snr / builtIn.body.widths.forecast.snr).toBeCloseTo(1, 2);
    expect(custom.body.widths.inspiral.sigma_chi_f / builtIn.body.widths.inspiral.sigma_chi_f).toBeCloseTo(1, 2);
    expect(custom.body.widths.inspiral.sigma_M_f / builtIn.body.widths.inspiral.sigma_M_f).toBeCloseTo(1, 2);
    // Anonymous callers and other users cannot use it: 400 naming the curve.
    for (const who of [undefined, auth["t-cc-2"]]) {
      let r = request(app).post("/api/v1/consistency/coupling");
      if (who) r = r.set("Authorization", who);
      const res = await r.send({ ...gw150914, test: { forecast: { ...forecast, curve: id } } });
      expect(res.status).toBe(400);
      expect(res.body.error.fields["test.forecast.curve"]).toMatch(who ? /you have no uploaded curve/ : /sign in/);
    }
    const mangled = await request(app).post("/api/v1/consistency/coupling").send({ ...gw150914, test: { forecast: { ...forecast, curve: "Custom:x" } } });
    expect(mangled.status).toBe(400);
    expect(Object.keys(mangled.body.error.fields ?? {})).toContain("test.forecast.curve");
  });
});
