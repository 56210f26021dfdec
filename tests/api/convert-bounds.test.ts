import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eventsResponseSchema } from "../../common/convert-samples.ts";
import { convertResponseSchema, type ConvertResponse, type ConvertResult } from "../../common/convert.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * POST /api/v1/convert with the bound model: signed intervals and one-sided bounds, the per-binary sign
 * logic, the three verdicts, every coupling of every entry, and events with a lower-bounded coupling.
 * Every number is checked against a formula written here (source beside each).
 */

const KM_PER_MSUN = 1.3271244e20 / 299_792_458 ** 2 / 1000; // IAU 2015 B3 nominal (G M)_sun, exact c
const C_KM_S = 299_792.458;
const JULIAN_YEAR_S = 31_557_600; // IAU
const PER_KM_TO_PER_YEAR = C_KM_S * JULIAN_YEAR_S;
const rel = (a: number, b: number) => Math.abs(a / b - 1);

function masses(m1Msun: number, m2Msun: number) {
  const m1 = m1Msun * KM_PER_MSUN;
  const m2 = m2Msun * KM_PER_MSUN;
  const M = m1 + m2;
  const eta = (m1 * m2) / M ** 2;
  return { m1, m2, M, eta, Mc: eta ** 0.6 * M };
}

/** EdGB |beta| per unit alpha^2, non-spinning black holes: Yunes, Yagi & Pretorius 2016 Table I form (normalisation derived). */
function edgbK(m1Msun: number, m2Msun: number): number {
  const { m1, m2, M, eta } = masses(m1Msun, m2Msun);
  return ((5 / 7168) * (m1 ** 2 - m2 ** 2) ** 2 / (M ** 4 * eta ** 3.6)) * (16 * Math.PI) / M ** 4;
}

describe("POST /api/v1/convert: the bound model", () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof buildTestApp>;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb);
  });
  afterAll(async () => {
    await tdb?.drop();
  });

  async function convert(body: object): Promise<ConvertResponse> {
    const res = await request(app).post("/api/v1/convert").send(body);
    expect(res.status, JSON.stringify(res.body).slice(0, 600)).toBe(200);
    return convertResponseSchema.parse(res.body);
  }
  const rows = (r: ConvertResponse, theory: string): ConvertResult[] => r.results.filter((x) => x.theory === theory);
  const one = (r: ConvertResponse, theory: string): ConvertResult => {
    const found = rows(r, theory);
    if (found.length !== 1) throw new Error(`${found.length} results for ${theory}; not applicable: ${JSON.stringify(r.not_applicable.filter((n) => n.theory === theory))}`);
    return found[0]!;
  };
  const bbh = { m1: 30, m2: 10, chi1: 0, chi2: 0, bodies: ["bh", "bh"], frame: "source" };

  it("when EdGB gets an interval, then only its lower end bounds alpha (beta < 0 always), and a bound open below says nothing", async () => {
    const lo = -2e-6;
    const hi = 5e-5;
    const r = await convert({ bound: { parameter: "ppe_beta", b: -7, interval: [lo, hi], credibility: 0.9 }, binary: bbh, theories: ["edgb"] });
    const edgb = one(r, "edgb");
    // beta = -K alpha^2 (formula above): alpha = sqrt(|lo| / K), quoted as sqrt(alpha).
    expect(rel(edgb.coupling.value, Math.sqrt(Math.sqrt(-lo / edgbK(30, 10))))).toBeLessThan(1e-9);
    expect(edgb).toMatchObject({ theory_sign: "negative", side_used: "lower", signed_interval: null, beta_interval: [lo, hi] });
    expect(edgb.cautions.find((c) => c.code === "one_signed")?.message).toMatch(/only the lower end of the interval was used/);
    // One-sided on the reachable side: the same limit.
    const lower = await convert({ bound: { parameter: "ppe_beta", b: -7, interval: [lo, null], credibility: 0.9 }, binary: bbh, theories: ["edgb"] });
    expect(one(lower, "edgb").coupling.value).toBeCloseTo(edgb.coupling.value, 12);
    // One-sided on the other side: the theory's side is open, so it is not applicable, with the reason.
    const upperOnly = await convert({ bound: { parameter: "ppe_beta", b: -7, interval: [null, hi], credibility: 0.9 }, binary: bbh, theories: ["edgb"] });
    expect(upperOnly.results).toEqual([]);
    expect(upperOnly.not_applicable[0]).toMatchObject({ theory: "edgb", code: "unreachable_side", reason: expect.stringMatching(/β < 0.*no lower end/) });
    // exp(-i Psi): [lo, hi] becomes [-hi, -lo], so -hi is the end that bounds alpha (derived).
    const minus = await convert({ bound: { parameter: "ppe_beta", b: -7, interval: [lo, hi], credibility: 0.9, sign_convention: "minus" }, binary: bbh, theories: ["edgb"] });
    expect(rel(one(minus, "edgb").coupling.value, Math.sqrt(Math.sqrt(hi / edgbK(30, 10))))).toBeLessThan(1e-9);
  });

  it("when the massive graviton gets an interval, then the lower end bounds lambda_g from below (beta < 0), scaling as |lo|^(-1/2)", async () => {
    const binary = { m1: 30, m2: 25, frame: "source", z: 0.2 };
    const interval = await convert({ bound: { parameter: "ppe_beta", b: -3, interval: [-0.01, 0.04], credibility: 0.9 }, binary, theories: ["massive-graviton"] });
    const symmetric = await convert({ bound: { parameter: "ppe_beta", b: -3, upper: 0.04, credibility: 0.9 }, binary, theories: ["massive-graviton"] });
    const a = one(interval, "massive-graviton");
    const s = one(symmetric, "massive-graviton");
    expect(a).toMatchObject({ theory_sign: "negative", side_used: "lower" });
    expect(a.coupling.side).toBe("lower");
    // beta = -pi^2 D_0 Mc / lambda_g^2 (Will 1998): lambda_g ∝ |beta|^(-1/2), so the ratio is sqrt(0.04 / 0.01) = 2.
    expect(a.coupling.value / s.coupling.value).toBeCloseTo(2, 10);
    const open = await convert({ bound: { parameter: "ppe_beta", b: -3, interval: [null, 0.04], credibility: 0.9 }, binary, theories: ["massive-graviton"] });
    expect(open.not_applicable[0]?.code).toBe("unreachable_side");
  });

  it("when Gdot/G gets an interval, then it maps to a signed interval [-hi/K, -lo/K], with no one-signed advice", async () => {
    const binary = { m1: 1.4, m2: 1.3, bodies: ["ns", "ns"], frame: "source" };
    const lo = -3e-4;
    const hi = 1e-4;
    const r = await convert({ bound: { parameter: "ppe_beta", b: -13, interval: [lo, hi], credibility: 0.9 }, binary, theories: ["varying-g"] });
    const g = one(r, "varying-g");
    // beta = -(275/851968) (Gdot/G) Mc (derived; Tahura & Yagi 2018 with Gdot_C = Gdot_D): Gdot/G = -beta / K.
    const K = (275 / 851968) * masses(1.4, 1.3).Mc;
    expect(g.signed_interval).not.toBeNull();
    expect(rel(g.signed_interval!.lower!, (-hi / K) * PER_KM_TO_PER_YEAR)).toBeLessThan(1e-9);
    expect(rel(g.signed_interval!.upper!, (-lo / K) * PER_KM_TO_PER_YEAR)).toBeLessThan(1e-9);
    expect(g.signed_interval!.unit).toBe("1/yr");
    // The magnitude bound beside it comes from the wider side.
    expect(rel(g.coupling.value, (3e-4 / K) * PER_KM_TO_PER_YEAR)).toBeLessThan(1e-9);
    expect(g).toMatchObject({ theory_sign: "either", side_used: "both" });
    expect(g.cautions.some((c) => c.code === "one_signed")).toBe(false);
    expect(g.cautions.some((c) => c.code === "signed_interval")).toBe(true);
    // One-sided: only one end of the signed interval; the magnitude is not bounded.
    const half = await convert({ bound: { parameter: "ppe_beta", b: -13, interval: [lo, null], credibility: 0.9 }, binary, theories: ["varying-g"] });
    const h = one(half, "varying-g");
    expect(h.signed_interval).toMatchObject({ lower: null });
    expect(rel(h.signed_interval!.upper!, (-lo / K) * PER_KM_TO_PER_YEAR)).toBeLessThan(1e-9);
    expect(h.coupling).toMatchObject({ side: "upper" });
    expect(rel(h.coupling.value, (-lo / K) * PER_KM_TO_PER_YEAR)).toBeLessThan(1e-9);
  });

  it("when a dispersion entry (alpha = 0.5) gets an interval, then the signed interval is on A, linear in beta, and its larger end is the |A| beside lambda_A", async () => {
    const binary = { m1: 30, m2: 25, frame: "source", z: 0.3 };
    const lo = -0.02;
    const hi = 0.05;
    const r = await convert({ bound: { parameter: "ppe_beta", b: -1.5, interval: [lo, hi], credibility: 0.9 }, binary, theories: ["dispersion-a0p5"] });
    const d = one(r, "dispersion-a0p5");
    // beta = pi^(3/2) D_alpha Mc^(-1/2) A / ((alpha - 1) h^(3/2)) (Mirshekari, Yunes & Will 2012, derived): beta = C A with
    // C < 0 at alpha = 0.5, so A runs over [hi / C, lo / C]: lower end negative, and lower / upper = hi / lo.
    const s = d.signed_interval!;
    expect(s.symbol).toBe("A");
    expect(s.lower!).toBeLessThan(0);
    expect(s.upper!).toBeGreaterThan(0);
    expect(s.lower! / s.upper!).toBeCloseTo(hi / lo, 10);
    // |A| = (h c / lambda_A)^(3/2): the magnitude headline (lambda_A from the wider side) gives the larger |A|.
    const absA = d.also.find((a) => a.symbol === "abs_A")!;
    expect(rel(absA.value, Math.max(-s.lower!, s.upper!))).toBeLessThan(1e-9);
    expect(d.coupling.side).toBe("lower");
    expect(d.cautions.some((c) => c.code === "one_signed")).toBe(false);
  });

  it("when an interval is malformed or excludes zero, then 400 names the field and nothing is translated", async () => {
    const binary = bbh;
    const cases: [object, string, RegExp][] = [
      [{ parameter: "ppe_beta", b: -7, interval: [1e-3, -1e-3], credibility: 0.9 }, "bound.interval", /lo < hi/],
      [{ parameter: "ppe_beta", b: -7, interval: [1e-4, 1e-3], credibility: 0.9 }, "bound.interval", /GR itself is outside the interval/],
      [{ parameter: "ppe_beta", b: -7, interval: [null, -1e-4], credibility: 0.9 }, "bound.interval", /GR itself is outside/],
      [{ parameter: "ppe_beta", b: -7, interval: [null, null], credibility: 0.9 }, "bound.interval", /one-sided bound needs its finite side/],
      [{ parameter: "ppe_beta", b: -7, upper: 1e-3, interval: [-1e-3, 1e-3], credibility: 0.9 }, "bound.interval", /not both/],
      [{ parameter: "ppe_beta", b: -7, credibility: 0.9 }, "bound.upper", /required/],
      [{ parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9, f_low: 0 }, "bound.f_low", /positive/],
      [{ parameter: "gimr_dphi", k: -2, interval: [0.1, 0.2], credibility: 0.9 }, "bound.interval", /GR itself/],
    ];
    for (const [bound, field, message] of cases) {
      const res = await request(app).post("/api/v1/convert").send({ bound, binary });
      expect(res.status, JSON.stringify(bound)).toBe(400);
      expect(res.body.error.fields[field], JSON.stringify(res.body)).toMatch(message);
      expect(res.body.results).toBeUndefined();
    }
  });

  it("when dCS reaches sqrt(alpha) = 22.6 km for 14 + 7.5 Msun with chi = 0.5, 0.3, then it is outside validity: 16 pi alpha^2 / m2^4 is about 875", async () => {
    const chi1 = 0.5;
    const chi2 = 0.3;
    const { m1, m2, M, eta } = masses(14, 7.5);
    const chiS = (chi1 + chi2) / 2;
    const chiA = (chi1 - chi2) / 2;
    const dm = (m1 - m2) / M;
    const alpha = 22.6 ** 2;
    // Yagi, Stein, Yunes & Tanaka 2012 (with erratum): beta(alpha) for this binary, so the limit lands at 22.6 km.
    const zeta = (16 * Math.PI * alpha ** 2) / M ** 4;
    const beta =
      (1549225 / 11812864) * (zeta / eta ** 2.8) * ((1 - (231808 * eta) / 61969) * chiS ** 2 + (1 - (16068 * eta) / 61969) * chiA ** 2 - 2 * dm * chiS * chiA);
    const r = await convert({ bound: { parameter: "ppe_beta", b: -1, upper: Math.abs(beta), credibility: 0.9 }, binary: { m1: 14, m2: 7.5, chi1, chi2, frame: "source" }, theories: ["dcs"] });
    const d = one(r, "dcs");
    expect(d.coupling.value).toBeCloseTo(22.6, 8);
    expect(d.verdict).toBe("outside_validity");
    expect(d.valid).toBe(false);
    // The worst condition is the lighter hole's small coupling: 16 pi alpha^2 / m2^4 (the audit's 875), a factor 8700 above 0.1.
    const coupling2 = (16 * Math.PI * alpha ** 2) / m2 ** 4;
    expect(coupling2).toBeGreaterThan(860);
    expect(coupling2).toBeLessThan(890);
    expect(d.failing).toMatchObject({ kind: "hard", label: expect.stringMatching(/body 2/) });
    expect(rel(d.failing!.value!, coupling2)).toBeLessThan(1e-9);
    expect(rel(d.failing!.factor!, coupling2 / 0.1)).toBeLessThan(1e-9);
    // Slow rotation (rule of thumb 0.5): chi1 = 0.5 holds exactly at the threshold.
    expect(d.validity.find((v) => /slow rotation of body 1/.test(v.label))?.status).toBe("ok");
  });

  it("when Gdot/G and mass loss reach absurd limits, then they are outside validity through the in-band time, and mass loss answers only for black holes", async () => {
    // A wide -4PN bound gives |Gdot/G| ~ 1e13 /yr; tau = (5/256) Mc (pi Mc f_low)^(-8/3) (common practice) is minutes.
    const bns = { m1: 1.4, m2: 1.3, bodies: ["ns", "ns"], frame: "source" };
    const r = await convert({ bound: { parameter: "ppe_beta", b: -13, upper: 1e-2, credibility: 0.9 }, binary: bns, theories: ["varying-g", "extra-dimension"] });
    const g = one(r, "varying-g");
    const { Mc } = masses(1.4, 1.3);
    const tau = (5 / 256) * Mc * (Math.PI * Mc * (20 / C_KM_S)) ** (-8 / 3);
    const gdot = g.canonical.value;
    expect(g.verdict).toBe("outside_validity");
    expect(rel(g.failing!.value!, gdot * tau)).toBeLessThan(1e-9);
    expect(g.failing!.label).toMatch(/in band/);
    // Two neutron stars do not lose mass into the bulk: both RS-II couplings are not applicable.
    const na = r.not_applicable.filter((n) => n.theory === "extra-dimension");
    expect(na.length).toBe(2);
    expect(na.every((n) => n.code === "bodies_not_covered" && /black holes only/.test(n.reason))).toBe(true);
    // f_low moves tau as f_low^(-8/3): at 40 Hz the condition's value is 2^(-8/3) times smaller (derived).
    const at40 = await convert({ bound: { parameter: "ppe_beta", b: -13, upper: 1e-2, credibility: 0.9, f_low: 40 }, binary: bns, theories: ["varying-g"] });
    expect(one(at40, "varying-g").failing!.value! / g.failing!.value!).toBeCloseTo(2 ** (-8 / 3), 10);
    expect(at40.bound.f_low).toBe(40);
  });

  it("when several bounds are translated, then no result is valid without a condition, and no invalid limit is compared with a published bound", async () => {
    const bounds = [
      { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 },
      { parameter: "ppe_beta", b: -7, upper: 1e-8, credibility: 0.9 },
      { parameter: "ppe_beta", b: -1, upper: 0.5, credibility: 0.9 },
      { parameter: "ppe_beta", b: -13, upper: 1e-2, credibility: 0.9 },
      { parameter: "ppe_beta", b: -3, upper: 0.04, credibility: 0.9 },
    ];
    let seen = 0;
    for (const bound of bounds) {
      const r = await convert({ bound, binary: { m1: 12, m2: 1.4, chi1: 0.3, bodies: ["bh", "ns"], frame: "source", z: 0.1, scalar_sensitivities: [null, 0.2] } });
      for (const x of r.results) {
        seen++;
        if (x.verdict === "valid") {
          expect(x.validity.length, x.theory).toBeGreaterThan(0);
          expect(x.validity.every((v) => v.status !== "fails"), x.theory).toBe(true);
        }
        if (x.validity.length === 0) expect(x.verdict, x.theory).toBe("not_assessed");
        expect(x.valid).toBe(x.verdict === "valid");
        if (x.verdict !== "valid") expect(x.reference_bounds.every((c) => c.verdict === "not_compared" && c.ratio === null), x.theory).toBe(true);
        // Sentences name quantities as people write them (√α, λ_g, ω_BD), never by identifier.
        for (const c of x.reference_bounds) expect(c.sentence, x.theory).not.toMatch(/sqrt_|lambda|omega|alpha|Gdot|\d\.\d{5,}/);
      }
    }
    expect(seen).toBeGreaterThan(8);
  });

  it("when a valid EdGB limit meets a published bound in another convention, then it is compared in the headline's convention with the published credibility", async () => {
    // 60 + 20 Msun and a tight bound: sqrt(alpha) well inside the small-coupling region.
    const r = await convert({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-7, credibility: 0.9 }, binary: { m1: 60, m2: 20, frame: "source" }, theories: ["edgb"], conventions: { edgb: "JB" } });
    const e = one(r, "edgb");
    expect(e.verdict).toBe("valid");
    expect(e.convention).toBe("JB");
    const lyu = e.reference_bounds.find((c) => c.reference.citation.startsWith("Lyu"))!;
    // Lyu, Jiang & Yagi 2022: sqrt(alpha) < 1.33 km (convention A, 90% credible). In JB, sqrt(alpha) scales by (16 pi)^(1/4) (derived).
    const inJB = 1.33 * (16 * Math.PI) ** 0.25;
    expect(rel(lyu.ratio!, inJB / e.coupling.value)).toBeLessThan(1e-9);
    expect(lyu.sentence).toMatch(/^[0-9.]+ times (tighter|weaker) than Lyu et al\. 2022 \(√α ≤ 1\.33 km in convention A, [0-9.]+ km in JB, 90% credibility\)$/);
  });

  it("when a Johannsen or RS-II bound is translated, then each coupling has its own row; l follows the per-hole law", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -1, interval: [-0.02, 0.01], credibility: 0.9 }, binary: { m1: 20, m2: 12, frame: "source" }, theories: ["johannsen"] });
    const j = rows(r, "johannsen");
    expect(j.map((x) => x.coupling_symbol).sort()).toEqual(["alpha13", "eps3"]);
    const { eta } = masses(20, 12);
    // beta = (75/64) (eps3 - 2 alpha13) eta^(-4/5) (derived test-body estimate), one coupling at a time, the other at 0 (GR).
    const K = (75 / 64) * eta ** -0.8;
    const eps3 = j.find((x) => x.coupling_symbol === "eps3")!;
    const alpha13 = j.find((x) => x.coupling_symbol === "alpha13")!;
    expect(rel(eps3.signed_interval!.lower!, -0.02 / K)).toBeLessThan(1e-9);
    expect(rel(eps3.signed_interval!.upper!, 0.01 / K)).toBeLessThan(1e-9);
    expect(rel(alpha13.signed_interval!.lower!, -0.01 / (2 * K))).toBeLessThan(1e-9);
    expect(rel(alpha13.signed_interval!.upper!, 0.02 / (2 * K))).toBeLessThan(1e-9);
    expect(eps3.cautions.some((c) => c.code === "couplings" && /α₁₃ = 0/.test(c.message))).toBe(true);

    const rs = await convert({ bound: { parameter: "ppe_beta", b: -13, upper: 1e-6, credibility: 0.9 }, binary: { m1: 20, m2: 12, frame: "source" }, theories: ["extra-dimension"] });
    const byCoupling = new Map(rows(rs, "extra-dimension").map((x) => [x.coupling_symbol, x]));
    const mdot = byCoupling.get("Mdot_loss")!;
    const ell = byCoupling.get("ell")!;
    expect(mdot.coupling.unit).toBe("M_sun/yr");
    expect(ell.coupling.unit).toBe("um");
    // Per-hole law mdot_i = -C(l) / m_i^2 with C = 2.8e-7 M_sun^3/yr (l / 10 um)^2 (Emparan, Garcia-Bellido & Kaloper 2003,
    // value from memory): Mdot = C (1/m1^2 + 1/m2^2), so l = 10 um sqrt(Mdot / (2.8e-7 (1/m1^2 + 1/m2^2))) with masses in M_sun (derived).
    const expected = 10 * Math.sqrt(mdot.coupling.value / (2.8e-7 * (1 / 20 ** 2 + 1 / 12 ** 2)));
    expect(rel(ell.coupling.value, expected)).toBeLessThan(1e-8);
    // The total-mass law would give l larger by sqrt((1/M^2) / (1/m1^2 + 1/m2^2))^-1 = sqrt((1 - 2 eta) / eta^2) >= 2.8 (derived).
    expect(Math.sqrt((1 - 2 * eta) / eta ** 2)).toBeGreaterThan(2.8);
  });

  it("when Brans-Dicke events are combined, then omega_BD is a lower bound, the tightest is the largest and the combination is larger still", async () => {
    const ev = (label: string, m1: number, upper: number) => ({ label, binary: { m1, m2: 1.4, bodies: ["bh", "ns"], frame: "source", scalar_sensitivities: [null, 0.2] }, upper });
    const list = [ev("KV-250101a", 8, 1e-6), ev("KV-250214b", 6, 4e-7), ev("KV-250330c", 10, 2e-6)];
    const res = await request(app).post("/api/v1/convert/events").send({ theory: "brans-dicke", parameter: "ppe_beta", b: -7, credibility: 0.9, events: list });
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(200);
    const r = eventsResponseSchema.parse(res.body);
    expect(r.coupling.side).toBe("lower");
    // beta = -(5/3584) eta^(2/5) (s1 - s2)^2 / (2 + omega_BD) (Will 1994 form, value from memory): omega = K / U - 2 per event.
    const omegas = list.map((e) => {
      const { eta } = masses(e.binary.m1, 1.4);
      return ((5 / 3584) * eta ** 0.4 * (0.5 - 0.2) ** 2) / e.upper - 2;
    });
    r.events.forEach((e, i) => expect(rel(e.limit!, omegas[i]!)).toBeLessThan(1e-9));
    const best = Math.max(...omegas);
    expect(r.tightest).toEqual({ label: list[omegas.indexOf(best)]!.label, limit: r.events[omegas.indexOf(best)]!.limit });
    // Combined (flat prior in y = 1/(2 + omega)): y_c = (Σ (K_i / U_i)^2)^(-1/2) with K_i = (5/3584) eta_i^(2/5) 0.09 (derived in events.ts).
    const yC = 1 / Math.sqrt(list.reduce((s, e) => s + (((5 / 3584) * masses(e.binary.m1, 1.4).eta ** 0.4 * 0.09) / e.upper) ** 2, 0));
    expect(rel(r.combined!.limit, 1 / yC - 2)).toBeLessThan(1e-8);
    expect(r.combined!.limit).toBeGreaterThan(best);
  });
});
