import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { convertResponseSchema, type ConvertResponse, type ConvertResult } from "../../common/convert.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * POST /api/v1/convert against the seeded catalogue. Every number is checked against an independent
 * computation written here from the published formula (source named beside each check), with the
 * constants typed in again rather than imported from the engine.
 */

// Constants (IAU 2015 Resolution B3; CODATA exact SI constants): IAU 2015 B3 nominal (G M)_sun, exact c, exact h, IAU parsec.
const C_M_S = 299_792_458;
const KM_PER_MSUN = 1.3271244e20 / C_M_S ** 2 / 1000;
const HC_EV_M = 6.62607015e-34 * C_M_S / 1.602176634e-19;
const MPC_KM = (648_000 / Math.PI) * 149_597_870_700 * 1e6 / 1000;
const YEAR_S = 31_557_600;

function masses(m1: number, m2: number) {
  const M = m1 + m2;
  const eta = (m1 * m2) / (M * M);
  return { M, eta, Mc: eta ** 0.6 * M, dm: (m1 - m2) / M };
}

/** EdGB charge factor as printed in the Yagi 2012 form, not the engine's rewritten one. */
const sOf = (chi: number) => (chi === 0 ? 1 : (2 * (Math.sqrt(1 - chi * chi) - 1 + chi * chi)) / (chi * chi));

/** Composite Simpson rule with n (even) panels: our own quadrature for the distance integral. */
function simpson(f: (x: number) => number, a: number, b: number, n = 4000): number {
  const h = (b - a) / n;
  let s = f(a) + f(b);
  for (let i = 1; i < n; i++) s += f(a + i * h) * (i % 2 ? 4 : 2);
  return (s * h) / 3;
}

/** D_0 = (1+z) (c/H0) int_0^z dz' / ((1+z')^2 E(z')), flat Lambda-CDM (Will 1998, Phys. Rev. D 57, 2061, Eq. 2.5 form). */
function d0Km(z: number, H0: number, Om: number): number {
  const E = (x: number) => Math.sqrt(Om * (1 + x) ** 3 + 1 - Om);
  return (1 + z) * ((C_M_S / 1000 / H0) * MPC_KM) * simpson((x) => 1 / ((1 + x) ** 2 * E(x)), 0, z);
}

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe("POST /api/v1/convert", () => {
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

  async function convert(body: object): Promise<ConvertResponse> {
    const res = await request(app).post("/api/v1/convert").send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return convertResponseSchema.parse(res.body);
  }
  const resultFor = (r: ConvertResponse, theory: string): ConvertResult => {
    const found = r.results.find((x) => x.theory === theory);
    if (!found) throw new Error(`no result for ${theory}; not applicable: ${JSON.stringify(r.not_applicable.find((n) => n.theory === theory))}`);
    return found;
  };

  it("when a -1PN bound is given for a 10 + 5 solar-mass black-hole binary, then EdGB's sqrt(alpha) follows the published beta and fails the small-coupling condition", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, chi1: 0, chi2: 0, bodies: ["bh", "bh"], frame: "source" } });
    const edgb = resultFor(r, "edgb");
    // Yunes, Yagi & Pretorius 2016 (Table I form; normalisation derived from the dipole flux):
    // beta = -(5/7168) zeta (m1^2 s2 - m2^2 s1)^2 / (M^4 eta^(18/5)), zeta = 16 pi alpha^2 / M^4.
    const m1 = 10 * KM_PER_MSUN;
    const m2 = 5 * KM_PER_MSUN;
    const { M, eta } = masses(m1, m2);
    const perZeta = (5 / 7168) * (m1 ** 2 - m2 ** 2) ** 2 / (M ** 4 * eta ** 3.6);
    const alpha = Math.sqrt(((1e-3 / perZeta) * M ** 4) / (16 * Math.PI));
    expect(edgb.coupling.symbol).toBe("sqrt_alpha");
    expect(edgb.coupling.unit).toBe("km");
    expect(edgb.coupling.side).toBe("upper");
    expect(rel(edgb.coupling.value, Math.sqrt(alpha))).toBeLessThan(1e-9);
    expect(edgb.coupling.value).toBeCloseTo(4.07, 2);
    // Small-coupling condition on each black hole with its own mass (derived: the mapping is a small-coupling
    // expansion; 1/6 as the regular-horizon limit is a value from memory): 16 pi alpha^2 / m_i^4 < 1/6.
    expect(edgb.valid).toBe(false);
    expect(edgb.verdict).toBe("outside_validity");
    // The worst failure is body 2 (the lighter hole): factor = value / (1/6).
    expect(edgb.failing?.label).toMatch(/body 2/);
    expect(rel(edgb.failing!.factor!, ((16 * Math.PI * alpha ** 2) / m2 ** 4) * 6)).toBeLessThan(1e-9);
    const body2 = edgb.validity.find((v) => /body 2/.test(v.label));
    expect(body2?.ok).toBe(false);
    expect(rel(body2!.value!, (16 * Math.PI * alpha ** 2) / m2 ** 4)).toBeLessThan(1e-9);
    expect(edgb.cautions.some((c) => c.code === "validity" && /body 2/.test(c.message))).toBe(true);
    // One-signed (EdGB gives beta < 0 at every coupling, derived from the formula above) and the prior caution sit beside the number.
    expect(edgb.cautions.map((c) => c.code)).toEqual(expect.arrayContaining(["leading_pn", "prior", "one_signed"]));
    expect(edgb.theory_sign).toBe("negative");
    expect(edgb.side_used).toBe("lower");
    // No comparison for a limit outside validity; the published bound (Lyu, Jiang & Yagi 2022, 90% credible) is listed, not compared.
    const lyu = edgb.reference_bounds.find((b) => b.reference.citation.startsWith("Lyu"));
    expect(edgb.reference_bounds.every((b) => b.verdict === "not_compared" && b.ratio === null)).toBe(true);
    expect(lyu?.credibility).toBe(0.9);
    expect(lyu?.sentence).toMatch(/^not compared with Lyu et al\. 2022 \(√α ≤ 1\.33 km, 90% credibility\): this limit is outside the validity/);
    expect(r.bibliography.map((b) => b.key)).toEqual(expect.arrayContaining(edgb.references.map((c) => c.key)));
  });

  it("when the black holes spin, then EdGB uses each hole's charge factor s(chi) as published", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -7, upper: 2e-3, credibility: 0.9 }, binary: { m1: 12, m2: 7, chi1: 0.6, chi2: -0.3, frame: "source" } });
    const m1 = 12 * KM_PER_MSUN;
    const m2 = 7 * KM_PER_MSUN;
    const { M, eta } = masses(m1, m2);
    // s = 2 (sqrt(1 - chi^2) - 1 + chi^2) / chi^2 (Yagi 2012).
    const perZeta = (5 / 7168) * (m1 ** 2 * sOf(-0.3) - m2 ** 2 * sOf(0.6)) ** 2 / (M ** 4 * eta ** 3.6);
    const alpha = Math.sqrt(((2e-3 / perZeta) * M ** 4) / (16 * Math.PI));
    expect(rel(resultFor(r, "edgb").coupling.value, Math.sqrt(alpha))).toBeLessThan(1e-9);
  });

  it("when equal-mass non-spinning black holes are given, then EdGB is not applicable and says why", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 20, m2: 20, frame: "source" } });
    expect(r.results.find((x) => x.theory === "edgb")).toBeUndefined();
    const na = r.not_applicable.find((n) => n.theory === "edgb");
    // Common practice: equal masses and spins emit no scalar dipole, beta = 0.
    expect(na).toMatchObject({ code: "vanishing_mapping", b: [-7] });
    expect(na?.reason).toMatch(/vanishes|constrains nothing/);
  });

  it("when a 2PN bound is given for spinning black holes, then dCS follows Yagi, Stein, Yunes & Tanaka 2012", async () => {
    const chi1 = 0.6;
    const chi2 = 0.3;
    const r = await convert({ bound: { parameter: "ppe_beta", b: -1, upper: 0.5, credibility: 0.9 }, binary: { m1: 10, m2: 8, chi1, chi2, frame: "source" } });
    const dcs = resultFor(r, "dcs");
    // Yagi, Stein, Yunes & Tanaka 2012, Phys. Rev. D 85, 064022 (and erratum):
    // beta = (1549225/11812864) (zeta / eta^(14/5)) [(1 - 231808 eta/61969) chi_s^2 + (1 - 16068 eta/61969) chi_a^2 - 2 dm chi_s chi_a].
    const m1 = 10 * KM_PER_MSUN;
    const m2 = 8 * KM_PER_MSUN;
    const { M, eta, dm } = masses(m1, m2);
    const cs = (chi1 + chi2) / 2;
    const ca = (chi1 - chi2) / 2;
    const bracket = (1 - (231808 * eta) / 61969) * cs ** 2 + (1 - (16068 * eta) / 61969) * ca ** 2 - 2 * dm * cs * ca;
    const perZeta = Math.abs(((1549225 / 11812864) / eta ** 2.8) * bracket);
    const alpha = Math.sqrt(((0.5 / perZeta) * M ** 4) / (16 * Math.PI));
    expect(rel(dcs.coupling.value, Math.sqrt(alpha))).toBeLessThan(1e-9);
    expect(dcs.b).toBe(-1);
  });

  it("when a 1PN bound and a redshift are given, then the massive graviton's lambda_g uses D_0 (Will 1998) and m_g is quoted beside it", async () => {
    const z = 0.2;
    const r = await convert({
      bound: { parameter: "ppe_beta", b: -3, upper: 0.02, credibility: 0.9 },
      binary: { m1: 30, m2: 25, frame: "source", z },
      cosmology: { H0: 67.66, Omega_m: 0.3111 },
    });
    const mg = resultFor(r, "massive-graviton");
    // Will 1998, Phys. Rev. D 57, 2061: beta = -pi^2 D_0 Mc / lambda_g^2 (source-frame Mc), so lambda_g >= sqrt(pi^2 D_0 Mc / beta_max).
    const { Mc } = masses(30 * KM_PER_MSUN, 25 * KM_PER_MSUN);
    const lambda = Math.sqrt((Math.PI ** 2 * d0Km(z, 67.66, 0.3111) * Mc) / 0.02);
    expect(mg.coupling.symbol).toBe("lambda_g");
    expect(mg.coupling.side).toBe("lower");
    expect(rel(mg.coupling.value, lambda)).toBeLessThan(1e-7);
    // m_g c^2 = h c / lambda_g (derived): an upper bound on the mass.
    const also = mg.also.find((a) => a.symbol === "m_g");
    expect(also).toMatchObject({ unit: "eV", side: "upper" });
    expect(rel(also!.value, HC_EV_M / (lambda * 1000))).toBeLessThan(1e-7);
    expect(mg.cautions.some((c) => c.code === "frame" && /D_0/.test(c.message))).toBe(true);
  });

  it("when lambda_g is bounded at 1.03e13 km, then m_g is the 1.2e-22 eV quoted with it by LIGO-Virgo 2016", async () => {
    // LIGO-Virgo 2016, Phys. Rev. Lett. 116, 221101 (arXiv:1602.03841) quotes m_g <= 1.2e-22 eV with lambda_g > 1.03e13 km.
    const z = 0.09;
    const { Mc } = masses(36 * KM_PER_MSUN, 29 * KM_PER_MSUN);
    const betaMax = (Math.PI ** 2 * d0Km(z, 67.66, 0.3111) * Mc) / 1.03e13 ** 2;
    const r = await convert({ bound: { parameter: "ppe_beta", b: -3, upper: betaMax, credibility: 0.9 }, binary: { m1: 36, m2: 29, frame: "source", z } });
    const mg = resultFor(r, "massive-graviton");
    expect(rel(mg.coupling.value, 1.03e13)).toBeLessThan(1e-6);
    // The paper's pair is rounded to 2-3 figures: agreement to 1 %.
    expect(rel(mg.also.find((a) => a.symbol === "m_g")!.value, 1.2e-22)).toBeLessThan(0.01);
  });

  it("when a -4PN bound is given, then Gdot/G follows beta = -(275/851968)(Gdot/G) Mc", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -13, upper: 1e-5, credibility: 0.9 }, binary: { m1: 1.4, m2: 1.3, bodies: ["ns", "ns"], frame: "source" } });
    const g = resultFor(r, "varying-g");
    // Derived; general form with sensitivities: Tahura & Yagi 2018 (Phys. Rev. D 98, 084042).
    const { Mc } = masses(1.4 * KM_PER_MSUN, 1.3 * KM_PER_MSUN);
    const perKm = (1e-5 * 851968) / (275 * Mc);
    expect(g.coupling.unit).toBe("1/yr");
    expect(rel(g.coupling.value, perKm * (C_M_S / 1000) * YEAR_S)).toBeLessThan(1e-9);
  });

  it("when the same deviation is given as gIMR dphi_-2 and as beta, then the limits agree (beta = (3/128) eta^(2/5) dphi_-2)", async () => {
    const binary = { m1: 10, m2: 5, frame: "source" };
    const dphi = 0.05;
    const { eta } = masses(10, 5);
    // Derived (gIMR/ppE relation, Yunes & Pretorius 2009; Agathos et al. 2014): for the absolute k = -2, beta = (3/128) eta^(-k/5) dphi_k.
    const beta = (3 / 128) * eta ** 0.4 * dphi;
    const viaGimr = await convert({ bound: { parameter: "gimr_dphi", k: -2, upper: dphi, credibility: 0.9 }, binary });
    const viaBeta = await convert({ bound: { parameter: "ppe_beta", b: -7, upper: beta, credibility: 0.9 }, binary });
    expect(viaGimr.bound.b).toBe(-7);
    expect(rel(viaGimr.bound.beta_max!, beta)).toBeLessThan(1e-12);
    expect(rel(resultFor(viaGimr, "edgb").coupling.value, resultFor(viaBeta, "edgb").coupling.value)).toBeLessThan(1e-12);
  });

  it("when dphi_2 is given, then it maps through the TaylorF2 phi_2 of Buonanno et al. 2009 to the massive-graviton beta", async () => {
    const binary = { m1: 30, m2: 25, frame: "source", z: 0.3 };
    const dphi = 0.1;
    const { eta } = masses(30, 25);
    // Buonanno, Iyer, Ochsner, Pan & Sathyaprakash 2009 (Phys. Rev. D 80, 084043, Eq. 3.18): phi_2 = 3715/756 + 55 eta / 9;
    // Derived (gIMR/ppE relation): beta = (3/128) phi_k eta^(-k/5) dphi_k at b = k - 5.
    const beta = (3 / 128) * (3715 / 756 + (55 / 9) * eta) * eta ** -0.4 * dphi;
    const viaGimr = await convert({ bound: { parameter: "gimr_dphi", k: 2, upper: dphi, credibility: 0.9 }, binary });
    const viaBeta = await convert({ bound: { parameter: "ppe_beta", b: -3, upper: beta, credibility: 0.9 }, binary });
    expect(rel(resultFor(viaGimr, "massive-graviton").coupling.value, resultFor(viaBeta, "massive-graviton").coupling.value)).toBeLessThan(1e-12);
  });

  it("when detector-frame masses come with their z, then every limit equals the one from the source-frame masses", async () => {
    const z = 0.25;
    for (const [b, theory] of [
      [-7, "edgb"],
      [-3, "massive-graviton"],
    ] as const) {
      const source = await convert({ bound: { parameter: "ppe_beta", b, upper: 1e-2, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source", z } });
      const detector = await convert({ bound: { parameter: "ppe_beta", b, upper: 1e-2, credibility: 0.9 }, binary: { m1: 10 * (1 + z), m2: 5 * (1 + z), frame: "detector", z } });
      // Common practice: generation effects scale with source-frame lengths; m_detector = (1 + z) m_source.
      expect(rel(resultFor(detector, theory).coupling.value, resultFor(source, theory).coupling.value)).toBeLessThan(1e-12);
      expect(detector.cautions.some((c) => c.code === "frame")).toBe(true);
    }
  });

  it("when EdGB is asked for in convention JB, then sqrt(alpha) scales by (16 pi)^(1/4), the factor behind Sanger et al. 2024's pair", async () => {
    const body = { bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" }, theories: ["edgb"] };
    const a = resultFor(await convert(body), "edgb");
    const jb = resultFor(await convert({ ...body, conventions: { edgb: "JB" } }), "edgb");
    expect(a.convention).toBe("A");
    expect(jb.convention).toBe("JB");
    expect(jb.conventions_available).toEqual(["A", "SZ", "JB"]);
    // EdGB normalisations: alpha_A = alpha_JB / sqrt(16 pi); Sanger et al. 2024 (arXiv:2406.03568) quote l_GB = 0.51 M_sun (JB) with sqrt(alpha_A) = 0.28 km.
    expect(rel(jb.coupling.value / a.coupling.value, (16 * Math.PI) ** 0.25)).toBeLessThan(1e-12);
    expect(rel(jb.coupling.value / a.coupling.value, (0.51 * KM_PER_MSUN) / 0.28)).toBeLessThan(0.02);
  });

  it("when theories is given, then only those are answered", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" }, theories: ["edgb", "dcs"] });
    expect([...r.results.map((x) => x.theory), ...r.not_applicable.map((x) => x.theory)].sort()).toEqual(["dcs", "edgb"]);
    expect(r.not_applicable).toEqual([expect.objectContaining({ theory: "dcs", code: "different_b", b: [-1] })]);
  });

  it("when a propagation effect has no redshift, then it is not applicable because the bound needs a distance", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -3, upper: 0.02, credibility: 0.9 }, binary: { m1: 30, m2: 25, frame: "source" } });
    expect(r.not_applicable.find((n) => n.theory === "massive-graviton")).toMatchObject({ code: "needs_distance", reason: expect.stringMatching(/redshift z/) });
  });

  it.each([0, 3])("when b = %i, then every theory is not applicable because b is degenerate", async (b) => {
    const r = await convert({ bound: { parameter: "ppe_beta", b, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } });
    expect(r.results).toEqual([]);
    expect(r.not_applicable.length).toBeGreaterThan(5);
    expect(r.not_applicable.every((n) => n.code === "degenerate_b" && /degenerate/.test(n.reason))).toBe(true);
  });

  it("when dphi_5l is given, then nothing is translated and the log-term caution says why", async () => {
    const r = await convert({ bound: { parameter: "gimr_dphi", k: "5l", upper: 0.1, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } });
    expect(r.results).toEqual([]);
    expect(r.bound.b).toBeNull();
    expect(r.cautions.map((c) => c.code)).toContain("log_term");
    expect(r.not_applicable.length).toBeGreaterThan(0);
    expect(r.not_applicable.every((n) => n.code === "no_ppe_equivalent")).toBe(true);
  });

  it("when the analysis used exp(-i Psi), then the limit of a symmetric bound is unchanged and the normalisation is stated", async () => {
    const base = { binary: { m1: 10, m2: 5, frame: "source" }, theories: ["edgb"] };
    const plus = await convert({ ...base, bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9, sign_convention: "plus" } });
    const minus = await convert({ ...base, bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9, sign_convention: "minus" } });
    expect(resultFor(minus, "edgb").coupling.value).toBe(resultFor(plus, "edgb").coupling.value);
    expect(minus.cautions.map((c) => c.code)).toContain("sign_convention");
    expect(resultFor(minus, "edgb").cautions.map((c) => c.code)).toContain("sign_convention");
    expect(plus.cautions.map((c) => c.code)).not.toContain("sign_convention");
  });

  const good = { bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } };
  it.each([
    ["m1 is zero", { ...good, binary: { ...good.binary, m1: 0 } }, "binary.m1"],
    ["m2 is negative", { ...good, binary: { ...good.binary, m2: -3 } }, "binary.m2"],
    ["m1 is missing", { ...good, binary: { m2: 5, frame: "source" } }, "binary.m1"],
    ["|chi1| = 1", { ...good, binary: { ...good.binary, chi1: 1 } }, "binary.chi1"],
    ["chi2 = -1.2", { ...good, binary: { ...good.binary, chi2: -1.2 } }, "binary.chi2"],
    ["upper is zero", { ...good, bound: { ...good.bound, upper: 0 } }, "bound.upper"],
    ["upper is negative", { ...good, bound: { ...good.bound, upper: -1e-3 } }, "bound.upper"],
    ["the theory slug is unknown", { ...good, theories: ["edgb", "no-such-theory"] }, "theories.1"],
    ["b is not a number", { ...good, bound: { ...good.bound, b: "minus seven" } }, "bound.b"],
    ["k is not a number", { ...good, bound: { parameter: "gimr_dphi", k: "two", upper: 0.1, credibility: 0.9 } }, "bound.k"],
    ["z is negative", { ...good, binary: { ...good.binary, z: -0.1 } }, "binary.z"],
    ["credibility is 1", { ...good, bound: { ...good.bound, credibility: 1 } }, "bound.credibility"],
    ["credibility is 0", { ...good, bound: { ...good.bound, credibility: 0 } }, "bound.credibility"],
    ["detector-frame masses have no z", { ...good, binary: { m1: 10, m2: 5, frame: "detector" } }, "binary.z"],
    ["the convention is unknown", { ...good, conventions: { edgb: "XYZ" } }, "conventions.edgb"],
  ])("when %s, then 400 names %s", async (_what, body, field) => {
    const res = await request(app).post("/api/v1/convert").send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("validation_failed");
    expect(Object.keys(res.body.error.fields)).toContain(field);
    expect(res.body.error.message).toContain(field);
  });

  it("when a client exceeds RATE_LIMIT_PER_MINUTE, then 429 in the standard error shape", async () => {
    const limited = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "2" });
    for (let i = 0; i < 2; i++) expect((await request(limited).post("/api/v1/convert").send(good)).status).toBe(200);
    const res = await request(limited).post("/api/v1/convert").send(good);
    expect(res.status).toBe(429);
    expect(res.body.error).toMatchObject({ code: "rate_limited", message: expect.stringMatching(/wait a minute/) });
  });

  it("when the catalogue gains a revision, then the next translation uses it without a restart", async () => {
    const before = await convert(good);
    await tdb.db("theories").where({ slug: "edgb" }).update({ updated_at: tdb.db.raw("now() + interval '1 second'") });
    const after = await convert(good);
    expect(after.catalogue_revision).not.toBe(before.catalogue_revision);
    expect(resultFor(after, "edgb").coupling.value).toBe(resultFor(before, "edgb").coupling.value);
  });
});
