import request from "supertest";
import { describe, expect, it } from "vitest";
import { convertResponseSchema } from "../../common/convert.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { catalogueWave2bSeed, catalogueWave2cSeed, catalogueWave2Seed } from "../../seeds/catalogue-wave2.ts";
import { convertSuite, KM_PER_MSUN, rel } from "../helpers/convert.ts";

/**
 * POST /api/v1/convert through the second batch of entries: each limit against a formula written
 * here from the entry's source or derivation, with the constants typed in again.
 */

describe("POST /api/v1/convert with the second batch of entries", () => {
  const { app, convert, resultFor } = convertSuite([catalogueSeed, catalogueWave2Seed, catalogueWave2bSeed, catalogueWave2cSeed]);

  const m1 = 10 * KM_PER_MSUN;
  const m2 = 5 * KM_PER_MSUN;
  const M = m1 + m2;
  const eta = (m1 * m2) / M ** 2;
  const binary = { m1: 10, m2: 5, chi1: 0.4, chi2: 0.2, bodies: ["bh", "bh"], frame: "source" };

  it("when a -1PN bound is given, then the vector-charge difference follows the Larmor dipole: |dq| = sqrt(beta_max / ((5/3584) eta^(2/5)))", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary, theories: ["vector-charges", "scalar-charges"] });
    // beta = -(5/3584) eta^(2/5) dq^2 (dipole flux (2/3) eta^2 v^8 dq^2, derived); the scalar one has half the flux.
    expect(rel(resultFor(r, "vector-charges").coupling.value, Math.sqrt(1e-3 / ((5 / 3584) * eta ** 0.4)))).toBeLessThan(1e-9);
    expect(rel(resultFor(r, "scalar-charges").coupling.value, Math.sqrt(1e-3 / ((5 / 7168) * eta ** 0.4)))).toBeLessThan(1e-9);
    expect(resultFor(r, "vector-charges").side_used).toBe("lower");
  });

  it("when a 5PN bound is given, then the mimickers' common tidal deformability follows the Lambda-tilde phase", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: 5, upper: 0.5, credibility: 0.9 }, binary, theories: ["eco-tidal-deformability"] });
    // beta = -(117/256) Lambda-tilde / eta^2, Lambda-tilde = (16/13) Lambda [(m1 + 12 m2) m1^4 + (m2 + 12 m1) m2^4] / M^5 (value from memory).
    const perLambda = ((117 / 256) * (16 / 13) * ((m1 + 12 * m2) * m1 ** 4 + (m2 + 12 * m1) * m2 ** 4)) / (M ** 5 * eta ** 2);
    const res = resultFor(r, "eco-tidal-deformability");
    expect(rel(res.coupling.value, 0.5 / perLambda)).toBeLessThan(1e-9);
    expect(res.signed_interval?.lower).toBeCloseTo(-0.5 / perLambda, 9);
  });

  it("when a -2PN bound is given, then the Yukawa binding of a massive graviton gives a lower bound on lambda_g (derived)", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -9, upper: 1e-4, credibility: 0.9 }, binary, theories: ["massive-graviton-yukawa"] });
    // beta = -(5/576) eta^(4/5) M^2 / lambda_g^2 (our own derivation from -(M/r) exp(-r/lambda_g)).
    const res = resultFor(r, "massive-graviton-yukawa");
    expect(res.b).toBe(-9);
    expect(res.canonical.symbol).toBe("lambda_g");
    expect(rel(res.canonical.value, Math.sqrt(((5 / 576) * eta ** 0.8 * M ** 2) / 1e-4))).toBeLessThan(1e-9);
  });

  it("when spins are given at 2PN, then the spin-induced quadrupole deviation follows the quadrupole-monopole coefficient", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -1, upper: 0.2, credibility: 0.9 }, binary, theories: ["spin-induced-quadrupole", "quasi-kerr-quadrupole"] });
    // d phi_4 = -50 dkappa sum (m_i/M)^2 chi_i^2, beta = (3/128) eta^(-4/5) d phi_4 (Krishnendu, Arun & Mishra 2017; value from memory).
    const perKappa = (3 / 128) * eta ** -0.8 * 50 * ((m1 / M) ** 2 * 0.16 + (m2 / M) ** 2 * 0.04);
    expect(rel(resultFor(r, "spin-induced-quadrupole").coupling.value, 0.2 / perKappa)).toBeLessThan(1e-9);
    const perEps = (3 / 128) * eta ** -0.8 * 50 * ((m1 / M) ** 2 + (m2 / M) ** 2);
    expect(rel(resultFor(r, "quasi-kerr-quadrupole").coupling.value, 0.2 / perEps)).toBeLessThan(1e-9);
  });

  it("when a bound at b = 3 is asked for, then no limit comes back: a constant speed of GWs is degenerate with the coalescence time", async () => {
    const res = await request(app()).post("/api/v1/convert").send({ bound: { parameter: "ppe_beta", b: 3, upper: 1, credibility: 0.9 }, binary, theories: ["gw-speed"] });
    // Yunes & Pretorius 2009: b = 3 (4PN) is degenerate with t_c; the entry documents the term and cites the GW-EM bound instead.
    expect(res.status).toBe(200);
    const r = convertResponseSchema.parse(res.body);
    expect(r.results.filter((x) => x.theory === "gw-speed")).toEqual([]);
    expect(r.not_applicable.find((n) => n.theory === "gw-speed")).toMatchObject({ code: "degenerate_b" });
  });

  it("when a -4PN bound is given for a neutron star and a black hole, then the massive scalar's first mass correction bounds xi = m_s^2/(2 + omega_BD), and the -1PN term of the same entry is left out", async () => {
    const nsbh = { m1: 10, m2: 1.4, chi1: 0.1, chi2: 0, bodies: ["bh", "ns"], frame: "source", scalar_sensitivities: [null, 0.2] };
    const r = await convert({ bound: { parameter: "ppe_beta", b: -13, upper: 1e-2, credibility: 0.9 }, binary: nsbh, theories: ["massive-scalar-tensor"] });
    const a = 10 * KM_PER_MSUN;
    const b = 1.4 * KM_PER_MSUN;
    const Mt = a + b;
    const et = (a * b) / Mt ** 2;
    // beta = -15 B eta^(8/5) / 3328 at k = -4 with B = -(3/2)(5/48)(s1 - s2)^2 M^2 xi: (75/106496)(s1 - s2)^2 M^2 xi eta^(8/5) (derived).
    const perXi = (75 / 106496) * (0.5 - 0.2) ** 2 * Mt ** 2 * et ** 1.6;
    const res = resultFor(r, "massive-scalar-tensor");
    expect(res.b).toBe(-13);
    expect(res.canonical.symbol).toBe("xi_ms");
    expect(rel(res.canonical.value, 1e-2 / perXi)).toBeLessThan(1e-9);
    expect(r.results.filter((x) => x.theory === "massive-scalar-tensor").map((x) => x.b)).toEqual([-13]);
    expect(JSON.stringify(res)).toMatch(/cannot check from ξ alone/);
  });

  it("when a -2PN bound is given, then the massive dark photon's Yukawa coupling y gets a signed interval, and equal charges do not hide it", async () => {
    const r = await convert({ bound: { parameter: "ppe_beta", b: -9, upper: 1e-4, credibility: 0.9 }, binary, theories: ["massive-vector-charges"] });
    // beta = (5/576) eta^(4/5) y M^2 (Yukawa potential -(M/r)(1 - y r^2/2), our own derivation): |y| <= 1e-4 / ((5/576) eta^(4/5) M^2).
    const perY = (5 / 576) * eta ** 0.8 * M ** 2;
    const res = resultFor(r, "massive-vector-charges");
    expect(res.canonical.symbol).toBe("y_V");
    expect(rel(res.canonical.value, 1e-4 / perY)).toBeLessThan(1e-9);
    expect(res.signed_interval?.lower).toBeCloseTo(-1e-4 / perY, 12);
    expect(res.signed_interval?.upper).toBeCloseTo(1e-4 / perY, 12);
  });

  it("when a bound at b = 3 is given, then Einstein-aether's c13 gets no limit from the phase (degenerate with the coalescence time), and b = -5 carries the chirp-mass caution", async () => {
    const at3 = await convert({ bound: { parameter: "ppe_beta", b: 3, upper: 1, credibility: 0.9 }, binary: { ...binary, z: 0.1 }, theories: ["einstein-aether"] });
    expect(at3.results.filter((x) => x.theory === "einstein-aether" && x.coupling.value !== null && Number.isFinite(x.coupling.value))).toEqual([]);
    expect(JSON.stringify(at3)).toMatch(/degenerate with the coalescence time/);
    const at5 = await convert({ bound: { parameter: "ppe_beta", b: -5, upper: 1e-2, credibility: 0.9 }, binary, theories: ["einstein-aether"] });
    // beta = -(3/128) dA (0PN flux change, derived): |dA| <= 1e-2 * 128/3.
    const res = resultFor(at5, "einstein-aether");
    expect(res.canonical.symbol).toBe("dA_ae");
    expect(rel(res.canonical.value, (1e-2 * 128) / 3)).toBeLessThan(1e-9);
    expect(JSON.stringify(res)).toMatch(/degenerate with the chirp mass/);
  });
});
