import request from "supertest";
import { describe, expect, it } from "vitest";
import { amplitudeCatalogueSeed } from "../../seeds/amplitude-catalogue.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { convertSuite, KM_PER_MSUN, rel } from "../helpers/convert.ts";

/**
 * POST /api/v1/convert with amplitude bounds: ppe_alpha at an exponent a, and the distance ratio
 * d_L^GW / d_L^EM. Each limit against a formula written here, with its source or derivation, and the
 * distances integrated here independently of the server's cosmology code.
 */

const C_KM_S = 299_792.458;
const GPC_KM = 3.085677581491367e22;
const F_REF_PER_KM = 100 / C_KM_S;
// Planck 2018 defaults of the API (value from memory), flat Lambda-CDM.
const H0 = 67.66;
const OM = 0.3111;
const E2 = (x: number) => OM * (1 + x) ** 3 + 1 - OM;

/** Comoving distance in km by Simpson's rule (our own computation): (c/H0) int_0^z dz'/E(z'). */
function comovingKm(z: number): number {
  const n = 4000;
  const h = z / n;
  const f = (x: number) => 1 / Math.sqrt(E2(x));
  let sum = f(0) + f(z);
  for (let i = 1; i < n; i++) sum += (i % 2 ? 4 : 2) * f(i * h);
  return (C_KM_S / H0) * 3.085677581491367e19 * ((sum * h) / 3);
}

describe("POST /api/v1/convert with amplitude bounds", () => {
  const { app, convert, resultFor, refused } = convertSuite([catalogueSeed, amplitudeCatalogueSeed]);

  const m1 = 36 * KM_PER_MSUN;
  const m2 = 29 * KM_PER_MSUN;
  const M = m1 + m2;
  const eta = (m1 * m2) / M ** 2;
  const Mc = eta ** 0.6 * M;
  const heavy = { m1: 36, m2: 29, frame: "source", z: 0.09 };

  it("when |alpha| <= U at a = 3 is given, then the birefringence opacity follows |kappa| <= U pi Mc f_ref Gpc / D_2, D_2 = d_C/(1+z)", async () => {
    const r = await convert({ bound: { parameter: "ppe_alpha", a: 3, upper: 4, credibility: 0.9 }, binary: heavy });
    expect(r.bound).toMatchObject({ channel: "amplitude", a: 3, b: null, deviation_interval: [-4, 4] });
    const k = resultFor(r, "amplitude-birefringence");
    // Derived: alpha = kappa D_2 / (Gpc pi Mc f_ref) is linear in kappa, so |kappa| <= U Gpc pi Mc f_ref / D_2.
    const D2 = comovingKm(0.09) / 1.09;
    expect(rel(k.coupling.value, (4 * GPC_KM * Math.PI * Mc * F_REF_PER_KM) / D2)).toBeLessThan(1e-6);
    expect(k.channel).toBe("amplitude");
    expect(k.coupling.unit).toBe("1/Gpc");
    // kappa takes either sign: a signed interval, symmetric here.
    expect(k.signed_interval?.lower).toBeCloseTo(-k.coupling.value, 8);
    expect(k.closed_form_latex).toContain("\\alpha");
    // Verdict from its validity condition, |kappa| D_2 / (Gpc pi M f_ref 6^(3/2)) <= 0.1 (project choice), evaluated here.
    const condition = (k.coupling.value * D2) / (GPC_KM * Math.PI * M * F_REF_PER_KM * 6 ** 1.5);
    expect(rel(k.validity[0]?.value as number, condition)).toBeLessThan(1e-6);
    expect(k.verdict).toBe(condition <= 0.1 ? "valid" : condition <= 1 ? "valid" : "outside_validity");
    expect(k.cautions.map((c) => c.code)).toEqual(expect.arrayContaining(["amplitude", "source_status", "prior"]));
    // The phase entries say why they are not translated, and the amplitude entries at other a are named.
    expect(r.not_applicable.find((n) => n.theory === "edgb")?.code).toBe("different_channel");
    expect(r.not_applicable.find((n) => n.theory === "dipole-amplitude")).toMatchObject({ code: "different_a", reason: expect.stringMatching(/a = -2, not at a = 3/) });
  });

  it("when a valid birefringence limit is translated, then it is compared with the published GWTC-3 bound with its credibility", async () => {
    // |alpha| <= 0.05 at a = 3 for a nearby heavy binary keeps kappa d_C f / f_ref small: the rule of thumb holds.
    const r = await convert({ bound: { parameter: "ppe_alpha", a: 3, upper: 0.05, credibility: 0.9 }, binary: heavy, theories: ["amplitude-birefringence"] });
    const k = resultFor(r, "amplitude-birefringence");
    expect(k.verdict).toBe("valid");
    const ng = k.reference_bounds.find((b) => b.reference.key === "ng-isi-wong-farr-2023");
    expect(ng).toMatchObject({ credibility: 0.9, verdict: expect.stringMatching(/tighter|weaker/) });
    expect(rel(ng?.ratio as number, 0.048 / k.coupling.value)).toBeLessThan(1e-9);
  });

  it("when a one-sided alpha bound is given at a = -2, then the dipole flux uses the side the theory reaches: B <= 2 |lo| / eta^(2/5)", async () => {
    const binary = { m1: 10, m2: 5, frame: "source" };
    const m1s = 10 * KM_PER_MSUN;
    const m2s = 5 * KM_PER_MSUN;
    const eta2 = (m1s * m2s) / (m1s + m2s) ** 2;
    const r = await convert({ bound: { parameter: "ppe_alpha", a: -2, interval: [-1e-3, null], credibility: 0.9 }, binary });
    const d = resultFor(r, "dipole-amplitude");
    // Derived: alpha = -(1/2) eta^(2/5) B < 0 for B > 0.
    expect(rel(d.coupling.value, (2 * 1e-3) / eta2 ** 0.4)).toBeLessThan(1e-9);
    expect(d).toMatchObject({ side_used: "lower", theory_sign: "negative", method: "closed_form" });
    expect(d.cautions.find((c) => c.code === "engine" || c.code === "amplitude")).toBeTruthy();
    expect(d.cautions.some((c) => /Drift piece only/.test(c.message))).toBe(true);
    // The other side alone says nothing about a theory with alpha < 0.
    const wrong = await convert({ bound: { parameter: "ppe_alpha", a: -2, interval: [null, 1e-3], credibility: 0.9 }, binary, theories: ["dipole-amplitude"] });
    expect(wrong.results).toEqual([]);
    expect(wrong.not_applicable[0]).toMatchObject({ code: "unreachable_side", reason: expect.stringMatching(/α < 0/) });
  });

  it("when a distance ratio is given, then c_M follows r = [(1+z)^3/E^2]^(c_M/(6 Omega_L)) at each end, and Xi_0 - 1 follows r = 1 + (Xi_0 - 1)(1 - (1+z)^(-5/2))", async () => {
    const z = 0.3;
    const r = await convert({ bound: { parameter: "distance_ratio", interval: [0.8, 1.3], z, credibility: 0.683 }, binary: { m1: 1.4, m2: 1.3, bodies: ["ns", "ns"], frame: "source" } });
    // alpha = 1/r - 1 (derived): [1/1.3 - 1, 1/0.8 - 1].
    expect(r.bound).toMatchObject({ channel: "distance_ratio", a: 0, z });
    expect(r.bound.deviation_interval?.[0]).toBeCloseTo(1 / 1.3 - 1, 12);
    expect(r.bound.deviation_interval?.[1]).toBeCloseTo(0.25, 12);
    const OL = 1 - OM;
    const lnK = Math.log((1 + z) ** 3 / E2(z));
    // Lagos et al. 2019 form (from memory), integral derived: c_M = 6 Omega_L ln r / ln K at r = lo and r = hi.
    const cm = resultFor(r, "modified-friction", "c_M");
    expect(cm.signed_interval?.lower as number).toBeCloseTo((6 * OL * Math.log(0.8)) / lnK, 6);
    expect(cm.signed_interval?.upper as number).toBeCloseTo((6 * OL * Math.log(1.3)) / lnK, 6);
    // The magnitude is the end of larger size (|ln 1.3| > |ln 0.8| here; computed, not assumed).
    const widest = Math.max(Math.abs(Math.log(0.8)), Math.abs(Math.log(1.3))) * ((6 * OL) / lnK);
    expect(rel(cm.coupling.value, widest)).toBeLessThan(1e-6);
    expect(cm.verdict).toBe("not_assessed");
    expect(cm.reference_bounds[0]).toMatchObject({ verdict: "not_compared", credibility: 0.683 });
    // Belgacem et al. 2018 form with n = 5/2 (from memory): Xi_0 - 1 = (r - 1) / (1 - (1+z)^(-5/2)).
    const g = 1 - (1 + z) ** -2.5;
    const xi = resultFor(r, "modified-friction", "dXi0");
    expect(xi.signed_interval?.lower as number).toBeCloseTo(-0.2 / g, 6);
    expect(xi.signed_interval?.upper as number).toBeCloseTo(0.3 / g, 6);
    expect(xi.verdict).toBe("valid");
    expect(xi.cautions.map((c) => c.code)).toEqual(expect.arrayContaining(["amplitude", "couplings"]));
    expect(r.cautions.some((c) => c.code === "amplitude" && /a = 0/.test(c.message))).toBe(true);
  });

  it("when the ratio's interval is one-sided, then only that end bounds each coupling", async () => {
    const r = await convert({ bound: { parameter: "distance_ratio", interval: [0.9, null], z: 0.1, credibility: 0.9 }, binary: { m1: 1.4, m2: 1.3, frame: "source" }, theories: ["modified-friction"] });
    const cm = resultFor(r, "modified-friction", "c_M");
    const lnK = Math.log(1.1 ** 3 / E2(0.1));
    // r >= 0.9 bounds c_M from below only (r grows with c_M): c_M >= 6 Omega_L ln 0.9 / ln K.
    expect(cm.signed_interval?.upper).toBeNull();
    expect(cm.signed_interval?.lower as number).toBeCloseTo((6 * (1 - OM) * Math.log(0.9)) / lnK, 6);
    expect(cm.coupling.side).toBe("lower");
  });

  it("when an amplitude bound is malformed, then a 400 names the field", async () => {
    const binary = { m1: 10, m2: 5, frame: "source" };
    expect(await refused({ bound: { parameter: "distance_ratio", interval: [1.1, 1.4], z: 0.1, credibility: 0.9 }, binary })).toHaveProperty(["bound.interval"], expect.stringMatching(/GR itself .* is outside/));
    expect(await refused({ bound: { parameter: "distance_ratio", interval: [0, 1.4], z: 0.1, credibility: 0.9 }, binary })).toHaveProperty(["bound.interval.0"], expect.stringMatching(/positive/));
    expect(await refused({ bound: { parameter: "distance_ratio", interval: [0.9, 1.4], credibility: 0.9 }, binary })).toHaveProperty(["bound.z"]);
    expect(await refused({ bound: { parameter: "distance_ratio", upper: 1.2, interval: [0.9, 1.4], z: 0.1, credibility: 0.9 }, binary })).toHaveProperty(["bound.upper"]);
    expect(await refused({ bound: { parameter: "distance_ratio", interval: [0.9, 1.4], z: 0.1, credibility: 0.9 }, binary: { ...binary, z: 0.2 } })).toHaveProperty(["bound.z"], expect.stringMatching(/binary.z is 0.2/));
    expect(await refused({ bound: { parameter: "ppe_alpha", a: 3, upper: 1, credibility: 0.9, sign_convention: "minus" }, binary })).toHaveProperty(["bound.sign_convention"]);
    expect(await refused({ bound: { parameter: "ppe_alpha", upper: 1, credibility: 0.9 }, binary })).toHaveProperty(["bound.a"]);
    expect(await refused({ bound: { parameter: "ppe_alpha", a: 3, interval: [0.1, 1], credibility: 0.9 }, binary })).toHaveProperty(["bound.interval"], expect.stringMatching(/excludes 0/));
    expect(await refused({ bound: { parameter: "ppe_gamma", a: 3, upper: 1, credibility: 0.9 }, binary })).toHaveProperty(["bound.parameter"]);
  });

  it("when a phase bound is given, then the amplitude entries are listed as not applicable, not silently missing", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } });
    expect(r.bound.channel).toBe("phase");
    for (const slug of ["amplitude-birefringence", "modified-friction", "dipole-amplitude"]) {
      expect(r.not_applicable.find((n) => n.theory === slug)?.code, slug).toBe("different_b");
    }
    expect(r.results.every((x) => x.channel === "phase")).toBe(true);
  });

  it("POST /convert/events: when two identical events bound alpha at a = 3, then each equals /convert and the combination is 1/sqrt(2) of one (linear mapping, p = 1)", async () => {
    const event = { label: "ev", binary: heavy, upper: 0.05 };
    const res = await request(app())
      .post("/api/v1/convert/events")
      .send({ theory: "amplitude-birefringence", parameter: "ppe_alpha", a: 3, credibility: 0.9, events: [event, { ...event, label: "ev2" }] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const single = resultFor(await convert({ bound: { parameter: "ppe_alpha", a: 3, upper: 0.05, credibility: 0.9 }, binary: heavy, theories: ["amplitude-birefringence"] }), "amplitude-birefringence");
    expect(res.body.channel).toBe("amplitude");
    expect(rel(res.body.events[0].limit, single.coupling.value)).toBeLessThan(1e-12);
    // Half-normal product (the events route's rule): y_c = (sum (K_i/U_i)^2)^(-1/2), so N identical events scale x by N^(-1/(2p)), p = 1 (derived).
    expect(rel(res.body.combined.limit, single.coupling.value / Math.SQRT2)).toBeLessThan(1e-9);
    expect(res.body.cautions.some((c: { code: string }) => c.code === "amplitude")).toBe(true);
    // a is required, and a theory without an amplitude term at a is named.
    const noA = await request(app()).post("/api/v1/convert/events").send({ theory: "amplitude-birefringence", parameter: "ppe_alpha", credibility: 0.9, events: [event] });
    expect(noA.status).toBe(400);
    expect(noA.body.error.fields).toHaveProperty("a");
    const wrongA = await request(app()).post("/api/v1/convert/events").send({ theory: "edgb", parameter: "ppe_alpha", a: 3, credibility: 0.9, events: [event] });
    expect(wrongA.status).toBe(400);
    expect(wrongA.body.error.fields.a).toMatch(/no amplitude mapping at a = 3/);
  });

  it("POST /expressions/derive: when a -1PN flux change is given, then the amplitude's drift piece comes back at a = -2 with what it leaves out", async () => {
    const res = await request(app())
      .post("/api/v1/expressions/derive")
      .send({ flux: { order: -1, coefficient: "B" }, couplings: [{ symbol: "B", dimension: 0 }], evaluate_at: { m1: 10, m2: 5, B: 0.01 } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // Derived: gamma = B eta^(2/5), alpha = -gamma/2 at a = b + 5 = -2.
    const eta5 = (10 * 5) / 15 ** 2;
    expect(res.body.amplitude).toEqual([expect.objectContaining({ a: -2, note: expect.stringMatching(/frequency-drift piece only.*Kepler-law.*left out/) })]);
    expect(res.body.amplitude[0].value / (-0.5 * eta5 ** 0.4 * 0.01) - 1).toBeLessThan(1e-12);
  });
});
