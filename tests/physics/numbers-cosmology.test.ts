import { describe, expect, it } from "vitest";
import {
  PLANCK_2018,
  comovingDistanceMpc,
  distanceAlphaKm,
  distanceAlphaMpc,
  integrate,
  luminosityDistanceMpc,
  redshiftFromLuminosityDistance,
  type Cosmology,
} from "../../server/physics/cosmology.ts";
import { PhysicsInputError } from "../../server/physics/input-error.ts";
import { mpcToKm } from "../../server/physics/units.ts";

const C_KM_S = 299_792.458;

/** Independent reference: composite Simpson's rule with a fixed, fine grid. */
function simpson(f: (x: number) => number, a: number, b: number, n = 20_000): number {
  const h = (b - a) / n;
  let s = f(a) + f(b);
  for (let i = 1; i < n; i++) s += f(a + i * h) * (i % 2 === 1 ? 4 : 2);
  return (s * h) / 3;
}

/** D_alpha from its definition (Mirshekari, Yunes & Will 2012; D_0: Will 1998), by Simpson. */
function referenceDalpha(z: number, alphaMd: number, c: Cosmology): number {
  const E = (x: number) => Math.sqrt(c.Omega_m * (1 + x) ** 3 + 1 - c.Omega_m);
  return ((1 + z) ** (1 - alphaMd) * C_KM_S) / c.H0 * simpson((x) => (1 + x) ** (alphaMd - 2) / E(x), 0, z);
}

function referenceLuminosity(z: number, c: Cosmology): number {
  const E = (x: number) => Math.sqrt(c.Omega_m * (1 + x) ** 3 + 1 - c.Omega_m);
  return ((1 + z) * C_KM_S) / c.H0 * simpson((x) => 1 / E(x), 0, z);
}

describe("adaptive Gauss-Kronrod quadrature", () => {
  it("integrates a degree-22 polynomial exactly and a smooth function to 1e-13", () => {
    expect(integrate((x) => x ** 22, 0, 1)).toBeCloseTo(1 / 23, 15);
    expect(integrate(Math.sin, 0, Math.PI)).toBeCloseTo(2, 13);
    expect(integrate((x) => 1 / (1 + x * x), 0, 1e3)).toBeCloseTo(Math.atan(1e3), 12);
  });
});

describe("distances in flat Lambda-CDM", () => {
  for (const z of [0.1, 1]) {
    it(`D_0 and D_L at z = ${z} agree with an independent Simpson quadrature of their definitions`, () => {
      const d0 = distanceAlphaMpc(z, 0, PLANCK_2018);
      expect(Math.abs(d0 / referenceDalpha(z, 0, PLANCK_2018) - 1)).toBeLessThan(1e-10);
      const dl = luminosityDistanceMpc(z, PLANCK_2018);
      expect(Math.abs(dl / referenceLuminosity(z, PLANCK_2018) - 1)).toBeLessThan(1e-10);
      const d25 = distanceAlphaMpc(z, 2.5, PLANCK_2018);
      expect(Math.abs(d25 / referenceDalpha(z, 2.5, PLANCK_2018) - 1)).toBeLessThan(1e-10);
      expect(distanceAlphaKm(z, 0) / mpcToKm(d0)).toBeCloseTo(1, 14);
    });
  }

  it("D_L(z) -> c z / H0 (1 + (1 - q0) z / 2) for small z, q0 = 3 Omega_m / 2 - 1 (Hubble law, textbook expansion)", () => {
    const z = 1e-4;
    const q0 = 1.5 * PLANCK_2018.Omega_m - 1;
    const series = ((C_KM_S * z) / PLANCK_2018.H0) * (1 + ((1 - q0) * z) / 2);
    expect(Math.abs(luminosityDistanceMpc(z) / series - 1)).toBeLessThan(1e-8);
    expect(Math.abs(distanceAlphaMpc(z, 0) / ((C_KM_S * z) / PLANCK_2018.H0) - 1)).toBeLessThan(2e-4);
  });

  it("matches the closed forms of the Einstein-de Sitter universe (Omega_m = 1)", () => {
    const eds: Cosmology = { H0: 70, Omega_m: 1 };
    const z = 1.7;
    // D_C = 2 c/H0 (1 - (1+z)^-1/2); D_0 = (1+z) c/H0 (2/5)(1 - (1+z)^-5/2)
    expect(comovingDistanceMpc(z, eds) / ((2 * C_KM_S) / 70 * (1 - (1 + z) ** -0.5))).toBeCloseTo(1, 12);
    expect(distanceAlphaMpc(z, 0, eds) / ((1 + z) * (C_KM_S / 70) * 0.4 * (1 - (1 + z) ** -2.5))).toBeCloseTo(1, 12);
  });

  it("reduces to c z / H0 in an empty de Sitter universe (Omega_m = 0), for D_C and D_0 alike", () => {
    const ds: Cosmology = { H0: 67.66, Omega_m: 0 };
    expect(comovingDistanceMpc(2, ds)).toBeCloseTo((2 * C_KM_S) / 67.66, 9);
    expect(distanceAlphaMpc(2, 0, ds)).toBeCloseTo((2 * C_KM_S) / 67.66, 9);
  });

  it("inverts D_L to z", () => {
    const z = redshiftFromLuminosityDistance(luminosityDistanceMpc(0.37));
    expect(z).toBeCloseTo(0.37, 12);
  });

  it("rejects a negative redshift and a non-positive H0, naming the field", () => {
    expect(() => distanceAlphaMpc(-0.1, 0)).toThrowError(PhysicsInputError);
    try {
      luminosityDistanceMpc(0.1, { H0: 0, Omega_m: 0.3 });
      expect.unreachable();
    } catch (e) {
      expect((e as PhysicsInputError).field).toBe("cosmology.H0");
    }
  });
});
