/* eslint-disable no-loss-of-precision -- constants are written with the digits of their published source; rounding them to the nearest double is intended. */
import * as math from "mathjs";
import { describe, expect, it } from "vitest";
import {
  gimrFactor,
  gimrToPpe,
  normaliseSign,
  ppeToGimr,
  taylorF2Coefficient,
  taylorF2LogCoefficient,
  taylorF2SpinOrbit3,
  taylorF2SpinSpin4,
  type SpinState,
} from "../../server/physics/taylorf2.ts";

const PI = Math.PI;
const GAMMA_E = 0.5772156649015329;

/**
 * Buonanno, Iyer, Ochsner, Pan & Sathyaprakash 2009, Phys. Rev. D 80, 084043, arXiv:0907.0700,
 * Eq. 3.18, written out again here from the printed formulas.
 */
function printedPhi(k: number, eta: number): number {
  switch (k) {
    case 0:
      return 1;
    case 2:
      return 3715 / 756 + (55 * eta) / 9;
    case 3:
      return -16 * PI;
    case 4:
      return 15293365 / 508032 + (27145 * eta) / 504 + (3085 * eta ** 2) / 72;
    case 5:
      return PI * (38645 / 756 - (65 * eta) / 9);
    case 6:
      return (
        11583231236531 / 4694215680 - (640 * PI ** 2) / 3 - (6848 * GAMMA_E) / 21 - (6848 / 21) * Math.log(4) +
        (-15737765635 / 3048192 + (2255 * PI ** 2) / 12) * eta + (76055 * eta ** 2) / 1728 - (127825 * eta ** 3) / 1296
      );
    case 7:
      return PI * (77096675 / 254016 + (378515 * eta) / 1512 - (74045 * eta ** 2) / 756);
    default:
      throw new Error(`no printed coefficient for k = ${k}`);
  }
}

/** The same formulas at eta = 1/4 evaluated in 30-digit arithmetic (mpmath), rounded to doubles. */
const AT_EQUAL_MASS: Record<number, number> = {
  2: 6.4417989417989417989,
  3: -50.265482457436691815,
  4: 46.245886085915847821,
  5: 154.91874884368715864,
  6: -1104.1231610823976121,
  7: 1130.8942020382668661,
};

describe("TaylorF2 coefficients (Buonanno et al. 2009, Eq. 3.18)", () => {
  it("match the printed formulas at eta = 1/4 and at an unequal-mass eta", () => {
    for (const k of [0, 2, 3, 4, 5, 6, 7]) {
      expect(taylorF2Coefficient(k, 0.25)).toBeCloseTo(printedPhi(k, 0.25), 11);
      expect(taylorF2Coefficient(k, 0.1875)).toBeCloseTo(printedPhi(k, 0.1875), 11);
    }
    for (const [k, v] of Object.entries(AT_EQUAL_MASS)) {
      expect(Math.abs(taylorF2Coefficient(Number(k), 0.25) / v - 1)).toBeLessThan(1e-13);
    }
    expect(taylorF2Coefficient(1, 0.25)).toBe(0);
  });

  it("rational coefficients agree with exact fraction arithmetic in mathjs at eta = 1/4", () => {
    const q = math.fraction(1, 4);
    const phi2 = math.add(math.fraction(3715, 756), math.multiply(math.fraction(55, 9), q));
    const phi4 = math.add(
      math.add(math.fraction(15293365, 508032), math.multiply(math.fraction(27145, 504), q)),
      math.multiply(math.fraction(3085, 72), math.multiply(q, q)),
    );
    expect(taylorF2Coefficient(2, 0.25)).toBeCloseTo(math.number(phi2 as never), 14);
    expect(taylorF2Coefficient(4, 0.25)).toBeCloseTo(math.number(phi4 as never), 13);
  });

  it("log terms: 3 phi_5 at k = 5 and -6848/21 at k = 6 (Buonanno et al. 2009, Eq. 3.18)", () => {
    expect(taylorF2LogCoefficient(5, 0.2)).toBeCloseTo(3 * printedPhi(5, 0.2), 12);
    expect(taylorF2LogCoefficient(6, 0.2)).toBeCloseTo(-326.0952380952381, 12);
  });
});

describe("aligned-spin terms", () => {
  const cases: Array<[number, number, number, number]> = [
    [10, 5, 0.4, -0.3],
    [1.4, 1.3, 0.05, 0.02],
    [30, 3, -0.8, 0.6],
  ];
  const state = (m1: number, m2: number, c1: number, c2: number): SpinState => {
    const M = m1 + m2;
    return { eta: (m1 * m2) / M ** 2, dm: (m1 - m2) / M, chi_s: (c1 + c2) / 2, chi_a: (c1 - c2) / 2 };
  };

  it("spin-orbit phi_3 part = 4 beta_SO, beta_SO = (1/12) sum chi_i (113 m_i^2/M^2 + 75 eta) (Poisson & Will 1995, Phys. Rev. D 52, 848)", () => {
    for (const [m1, m2, c1, c2] of cases) {
      const M = m1 + m2;
      const eta = (m1 * m2) / M ** 2;
      const betaSO = (c1 * (113 * (m1 / M) ** 2 + 75 * eta) + c2 * (113 * (m2 / M) ** 2 + 75 * eta)) / 12;
      expect(taylorF2SpinOrbit3(state(m1, m2, c1, c2))).toBeCloseTo(4 * betaSO, 12);
    }
  });

  it("spin-spin phi_4 part in per-body form -(395/4) eta chi1 chi2 - (405/8) sum (m_i/M)^2 chi_i^2 (Arun et al. 2009, arXiv:0810.5336, Eq. 6.24, aligned, kappa = 1; per-body values as in the public LALSuite TaylorF2 phasing)", () => {
    for (const [m1, m2, c1, c2] of cases) {
      const M = m1 + m2;
      const eta = (m1 * m2) / M ** 2;
      const perBody = -(395 / 4) * eta * c1 * c2 - (405 / 8) * ((m1 / M) ** 2 * c1 ** 2 + (m2 / M) ** 2 * c2 ** 2);
      expect(taylorF2SpinSpin4(state(m1, m2, c1, c2))).toBeCloseTo(perBody, 11);
    }
  });

  it("includes the spin part only when asked, and never guesses a neutron-star quadrupole", () => {
    const s = { ...state(10, 5, 0.4, -0.3), bodies: ["bh", "bh"] as const };
    const plain = gimrFactor(3, s.eta);
    const spinning = gimrFactor(3, s.eta, { includesSpin: true, spins: s });
    if (plain.status !== "ok" || spinning.status !== "ok") throw new Error("expected ok");
    expect(spinning.coefficient).toBeCloseTo(-16 * PI + taylorF2SpinOrbit3(s), 12);
    expect(spinning.spinModelled).toBe(true);
    const ns = gimrFactor(4, s.eta, { includesSpin: true, spins: { ...s, bodies: ["bh", "ns"] } });
    if (ns.status !== "ok") throw new Error("expected ok");
    expect(ns.coefficient).toBe(taylorF2Coefficient(4, s.eta));
    expect(ns.spinModelled).toBe(false);
    expect(ns.cautions.join(" ")).toMatch(/not modelled/);
    const k2 = gimrFactor(2, s.eta, { includesSpin: true, spins: s });
    expect(k2.cautions.join(" ")).toMatch(/not modelled/);
  });
});

describe("gIMR dphi_k <-> ppE beta (derived)", () => {
  it("beta u^(k-5) reproduces the phase shift 3/(128 eta) phi_k dphi_k v^(k-5) at any velocity", () => {
    const eta = 0.2;
    for (const k of [-2, 0, 1, 2, 3, 4, 6, 7] as const) {
      const dphi = 0.07;
      const r = gimrToPpe(k, dphi, eta);
      if (r.status !== "ok") throw new Error(`k = ${k}: ${r.status}`);
      expect(r.b).toBe(k - 5);
      const phi = k === -2 || k === 1 ? 1 : printedPhi(k, eta);
      for (const v of [0.1, 0.25, 0.4]) {
        const u = eta ** 0.2 * v;
        const phaseShift = (3 / (128 * eta)) * phi * dphi * v ** (k - 5);
        expect((r.beta * u ** r.b) / phaseShift).toBeCloseTo(1, 12);
      }
      expect(ppeToGimr(r.b, r.beta, eta)).toBeCloseTo(dphi, 14);
    }
  });

  it("k = -2 is absolute: beta = (3/128) eta^(2/5) dphi_-2", () => {
    const r = gimrToPpe(-2, 1e-3, 0.16);
    if (r.status !== "ok") throw new Error("expected ok");
    expect(r.beta).toBeCloseTo((3 / 128) * 0.16 ** 0.4 * 1e-3, 18);
    expect(r.absolute).toBe(true);
  });

  it("flags the cases without a ppE bound", () => {
    expect(gimrToPpe(5, 0.1, 0.25).status).toBe("degenerate");
    expect(gimrToPpe("5l", 0.1, 0.25).status).toBe("no_ppe_equivalent");
    expect(gimrToPpe("6l", 0.1, 0.25).status).toBe("no_ppe_equivalent");
    const k0 = gimrToPpe(0, 0.1, 0.25);
    expect(k0.cautions.join(" ")).toMatch(/chirp mass/);
  });

  it("a beta recorded with exp(-i Psi) flips sign (Yunes & Pretorius 2009 convention)", () => {
    expect(normaliseSign(-2.5e-3, "minus")).toBe(2.5e-3);
    expect(normaliseSign(-2.5e-3, "plus")).toBe(-2.5e-3);
  });
});
