import { describe, expect, it } from "vitest";
import { binarySymbols, edgbSpinFactor, makeBinary } from "../../server/physics/binary.ts";
import { PhysicsInputError } from "../../server/physics/input-error.ts";

/** The printed EdGB black-hole charge factor (Yagi 2012). */
const printedS = (chi: number) => (2 * (Math.sqrt(1 - chi * chi) - 1 + chi * chi)) / (chi * chi);

function fieldOf(f: () => unknown): string | undefined {
  try {
    f();
  } catch (e) {
    if (e instanceof PhysicsInputError) return e.field;
    throw e;
  }
  return undefined;
}

describe("binary", () => {
  it("orders m1 >= m2 and carries spins and body kinds along", () => {
    const b = makeBinary({ m1: 1.4, m2: 8, chi1: 0.02, chi2: 0.7, bodies: ["ns", "bh"], frame: "source" });
    expect([b.m1, b.m2]).toEqual([8, 1.4]);
    expect([b.chi1, b.chi2]).toEqual([0.7, 0.02]);
    expect(b.bodies).toEqual(["bh", "ns"]);
    expect(b.swapped).toBe(true);
    expect(b.s2).toBe(0); // neutron star: no EdGB monopole charge (Yagi 2012, Phys. Rev. D 86, 081504)
    expect(b.s1).toBeCloseTo(printedS(0.7), 14);
  });

  it("derives M, eta, Mc, dm, q, chi_s, chi_a from their definitions (standard notation)", () => {
    const b = makeBinary({ m1: 36, m2: 29, chi1: 0.3, chi2: -0.1, frame: "source" });
    expect(b.M).toBe(65);
    expect(b.eta).toBeCloseTo((36 * 29) / 65 ** 2, 15);
    expect(b.Mc).toBeCloseTo((36 * 29) ** 0.6 / 65 ** 0.2, 12);
    expect(b.dm).toBeCloseTo(7 / 65, 15);
    expect(b.q).toBeCloseTo(29 / 36, 15);
    expect(b.chi_s).toBeCloseTo(0.1, 15);
    expect(b.chi_a).toBeCloseTo(0.2, 15);
    expect(b.km.M).toBeCloseTo(65 * 1.476625038, 7); // G M_sun / c^2 = 1476.625038 m (IAU 2015 B3, derived)
  });

  it("divides detector-frame masses by (1 + z) (common practice: m_det = (1 + z) m_src)", () => {
    const det = makeBinary({ m1: 33, m2: 22, frame: "detector", z: 0.1 });
    expect(det.m1).toBeCloseTo(30, 12);
    expect(det.m2).toBeCloseTo(20, 12);
    expect(det.z).toBe(0.1);
  });

  it("EdGB charge factor equals the printed formula, -> 1 at chi = 0 without cancellation, -> 0 as chi -> 1", () => {
    for (const chi of [0.9, 0.5, 0.1, -0.3]) expect(edgbSpinFactor(chi)).toBeCloseTo(printedS(chi), 13);
    expect(edgbSpinFactor(0)).toBe(1);
    // Series 1 - x/4 - x^2/8 - 5x^3/64 with x = chi^2, where the printed form loses all digits.
    for (const chi of [1e-4, 1e-6, 1e-9]) {
      const x = chi * chi;
      expect(edgbSpinFactor(chi)).toBeCloseTo(1 - x / 4 - x * x / 8 - (5 * x ** 3) / 64, 15);
    }
    expect(edgbSpinFactor(0.999999)).toBeLessThan(3e-3);
  });

  it("uses scalar sensitivity 1/2 for black holes and asks for it for neutron stars", () => {
    const b = makeBinary({ m1: 10, m2: 1.4, bodies: ["bh", "ns"], frame: "source", scalar_sensitivities: [undefined, 0.21] });
    expect(b.sigma1).toBe(0.5);
    expect(b.sigma2).toBe(0.21);
    const env = binarySymbols(makeBinary({ m1: 10, m2: 1.4, bodies: ["bh", "ns"], frame: "source" }));
    expect(env.sigma1).toBe(0.5);
    expect(env.sigma2).toBeUndefined();
  });

  it("names the field at fault", () => {
    expect(fieldOf(() => makeBinary({ m1: -1, m2: 5, frame: "source" }))).toBe("m1");
    expect(fieldOf(() => makeBinary({ m1: 10, m2: 0, frame: "source" }))).toBe("m2");
    expect(fieldOf(() => makeBinary({ m1: 10, m2: 5, chi1: 1, frame: "source" }))).toBe("chi1");
    expect(fieldOf(() => makeBinary({ m1: 10, m2: 5, chi2: -1.2, frame: "source" }))).toBe("chi2");
    expect(fieldOf(() => makeBinary({ m1: 10, m2: 5, frame: "source", z: -0.5 }))).toBe("z");
    expect(fieldOf(() => makeBinary({ m1: 10, m2: 5, frame: "detector" }))).toBe("z");
    expect(fieldOf(() => makeBinary({ m1: Number.NaN, m2: 5, frame: "source" }))).toBe("m1");
  });
});
