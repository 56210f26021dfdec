import { describe, expect, it } from "vitest";
import { phaseCoefficients } from "../../server/physics/forecast/phase-coefficients.ts";
import { phase, phaseDerivatives, phaseModel } from "../../server/physics/forecast/phase.ts";
import { taylorF2Coefficient, taylorF2SpinOrbit3, taylorF2SpinSpin4 } from "../../server/physics/taylorf2.ts";
import { SOLAR_MASS_TIME_S } from "../../server/physics/units.ts";

function binary(m1: number, m2: number, chi1: number, chi2: number) {
  const M = m1 + m2;
  return { eta: (m1 * m2) / (M * M), chi_s: (chi1 + chi2) / 2, chi_a: (chi1 - chi2) / 2, dm: (m1 - m2) / M, X1: m1 / M, X2: m2 / M, chi1, chi2 };
}

describe("aligned-spin TaylorF2 coefficients", () => {
  it("when the spins vanish, then phi_k equals the non-spinning table (Buonanno et al. 2009, Phys. Rev. D 80, 084043, Eq. 3.18)", () => {
    const c = phaseCoefficients({ eta: 0.2471, chi_s: 0, chi_a: 0 });
    for (let k = 0; k <= 7; k++) expect(c.phi[k]!.v).toBeCloseTo(taylorF2Coefficient(k, 0.2471), 9);
    expect(c.phiLog[5]!.v).toBeCloseTo(3 * taylorF2Coefficient(5, 0.2471), 9);
    expect(c.phiLog[6]!.v).toBeCloseTo(-6848 / 21, 12);
  });

  it("when spins are on, then phi_3 and phi_4 carry the spin-orbit and spin-spin parts of the translator's module (Khan et al. 2016, arXiv:1508.07253, App. B)", () => {
    const s = binary(10, 5, 0.5, -0.3);
    const c = phaseCoefficients(s);
    expect(c.phi[3]!.v).toBeCloseTo(-16 * Math.PI + taylorF2SpinOrbit3(s), 10);
    expect(c.phi[4]!.v).toBeCloseTo(taylorF2Coefficient(4, s.eta) + taylorF2SpinSpin4(s), 10);
  });

  it("when phi_4 is written per body, then it agrees: phi_4^NS - (395/4) eta chi1 chi2 - sum (50 + 5/8) X_i^2 chi_i^2 (Arun, Buonanno, Faye & Ochsner 2009, arXiv:0810.5336, Eq. 6.24 with kappa = 1; second typing)", () => {
    const s = binary(36, 29, 0.8, -0.2);
    const perBody = taylorF2Coefficient(4, s.eta) - (395 / 4) * s.eta * s.chi1 * s.chi2 - (50 + 5 / 8) * (s.X1 ** 2 * s.chi1 ** 2 + s.X2 ** 2 * s.chi2 ** 2);
    expect(phaseCoefficients(s).phi[4]!.v).toBeCloseTo(perBody, 9);
  });

  it("when the full phi_3 and phi_4 set beta/dphi_k, then the check table is reproduced (our own computation)", () => {
    const rows: [number, number, number, number, number, number][] = [
      [36, 29, 0.3, 0.3, -2.2147, 2.9781],
      [36, 29, 0.8, -0.2, -2.1047, 2.8392],
      [10, 5, 0.5, 0, -2.2605, 3.0106],
      [1.4, 1.4, 0.05, 0.05, -2.6222, 3.2769],
    ];
    for (const [m1, m2, c1, c2, k3, k4] of rows) {
      const s = binary(m1, m2, c1, c2);
      const c = phaseCoefficients(s);
      expect((3 / 128) * c.phi[3]!.v * s.eta ** (-3 / 5)).toBeCloseTo(k3, 3);
      expect((3 / 128) * c.phi[4]!.v * s.eta ** (-4 / 5)).toBeCloseTo(k4, 3);
    }
  });

  it("when equal masses carry equal spins 0.9617, then the full phi_4 vanishes (our own computation: 46.2459 - 50 chi^2)", () => {
    const c = phaseCoefficients({ eta: 0.25, chi_s: 0.9617, chi_a: 0 });
    expect(Math.abs(c.phi[4]!.v)).toBeLessThan(0.01);
    expect(c.massParameter).toBe("delta");
  });
});

describe("phase", () => {
  it("when written in u, then Psi equals the usual 3/(128 eta v^5) sum_k [phi_k + phi_kl ln v] v^k form (derived rewrite, v = eta^(-1/5) u)", () => {
    const mc = 12.3 * SOLAR_MASS_TIME_S;
    const fid = { eta: 0.2, chi_s: 0.4, chi_a: 0.1 };
    const model = phaseModel(mc, fid);
    const c = phaseCoefficients(fid);
    const f = 80;
    const M = mc * fid.eta ** -0.6;
    const v = (Math.PI * M * f) ** (1 / 3);
    let sum = 0;
    for (let k = 0; k <= 7; k++) sum += (c.phi[k]!.v + c.phiLog[k]!.v * Math.log(v)) * v ** k;
    const usual = 2 * Math.PI * f * 0.1 - 0.3 - Math.PI / 4 + (3 / (128 * fid.eta * v ** 5)) * sum + 0.5 * ((Math.PI * mc * f) ** (1 / 3)) ** -7;
    expect(phase(model, f, 0.1, 0.3, -7, 0.5)).toBeCloseTo(usual, 8);
  });
});

describe("analytic phase derivatives", () => {
  const f = 35.7;
  const fiducial = { lnMc: Math.log(30.62 * SOLAR_MASS_TIME_S), eta: 0.2186, chi_s: 0.31, chi_a: -0.17, tc: 0.012, phic: 0.4 };
  const b = -3;
  const beta = 0.02;

  function psiAt(p: typeof fiducial, mass?: { param: "delta"; value: number }): number {
    const eta = mass ? (1 - mass.value ** 2) / 4 : p.eta;
    const model = phaseModel(Math.exp(p.lnMc), { eta, chi_s: p.chi_s, chi_a: p.chi_a }, mass ? "delta" : "ln_eta");
    return phase(model, f, p.tc, p.phic, b, beta);
  }

  it("when each parameter is nudged, then the central finite difference of Psi matches the analytic derivative to 1e-6 (derived check)", () => {
    const model = phaseModel(Math.exp(fiducial.lnMc), fiducial);
    const d = new Float64Array(7);
    phaseDerivatives(model, f, b, beta, d);
    const h = 1e-6;
    const fd = (shift: (p: typeof fiducial, s: number) => typeof fiducial) => (psiAt(shift(fiducial, h)) - psiAt(shift(fiducial, -h))) / (2 * h);
    const numeric = [
      fd((p, s) => ({ ...p, phic: p.phic + s })),
      fd((p, s) => ({ ...p, tc: p.tc + s })),
      fd((p, s) => ({ ...p, lnMc: p.lnMc + s })),
      fd((p, s) => ({ ...p, eta: p.eta * Math.exp(s) })),
      fd((p, s) => ({ ...p, chi_s: p.chi_s + s })),
      fd((p, s) => ({ ...p, chi_a: p.chi_a + s })),
    ];
    numeric.forEach((n, i) => expect(Math.abs(d[i]! - n), `parameter ${i}`).toBeLessThan(1e-6 * Math.max(1, Math.abs(n))));
    const m0 = phaseModel(Math.exp(fiducial.lnMc), fiducial);
    const dBeta = (phase(m0, f, fiducial.tc, fiducial.phic, b, beta + h) - phase(m0, f, fiducial.tc, fiducial.phic, b, beta - h)) / (2 * h);
    expect(d[6]).toBeCloseTo(dBeta, 6);
  });

  it("when the masses are almost equal, then the delta parameter is used and its derivative matches a finite difference (derived check)", () => {
    const delta = 5e-4;
    const eta = (1 - delta * delta) / 4;
    const model = phaseModel(Math.exp(fiducial.lnMc), { eta, chi_s: 0.2, chi_a: 0.3 });
    expect(model.massParameter).toBe("delta");
    const d = new Float64Array(7);
    phaseDerivatives(model, f, b, beta, d);
    const p = { ...fiducial, chi_s: 0.2, chi_a: 0.3 };
    const h = 1e-6;
    const numeric = (psiAt(p, { param: "delta", value: delta + h }) - psiAt(p, { param: "delta", value: delta - h })) / (2 * h);
    expect(Number.isFinite(d[3]!)).toBe(true);
    expect(Math.abs(d[3]! - numeric)).toBeLessThan(1e-6 * Math.max(1, Math.abs(numeric)));
  });
});
