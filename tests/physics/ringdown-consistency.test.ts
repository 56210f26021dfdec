import { describe, expect, it } from "vitest";
import { PhysicsInputError } from "../../server/physics/input-error.ts";
import {
  chiSquare2Quantile,
  gaussianContour,
  gaussianDeviation,
  gaussianGrQuantile,
  mahalanobis2,
  type RemnantSummary,
} from "../../server/physics/ringdown/gaussian-consistency.ts";
import { sampleConsistency, type RemnantSamples } from "../../server/physics/ringdown/sample-consistency.ts";

const inspiral: RemnantSummary = { M_f: 62, chi_f: 0.68, sigma_M_f: 4, sigma_chi_f: 0.05, rho: -0.5 };
const ringdown: RemnantSummary = { M_f: 65, chi_f: 0.7, sigma_M_f: 5, sigma_chi_f: 0.08, rho: 0.8 };

/** Seeded normal draws (Park-Miller generator, Box-Muller). */
function normals(seed: number): () => number {
  let s = seed;
  const u = () => {
    s = (s * 16807) % 2147483647;
    return s / 2147483647;
  };
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

function draw(s: RemnantSummary, n: number, seed: number): RemnantSamples {
  const g = normals(seed);
  const M: number[] = [];
  const c: number[] = [];
  for (let i = 0; i < n; i += 1) {
    const a = g();
    const b = g();
    M.push(s.M_f + s.sigma_M_f * a);
    c.push(s.chi_f + s.sigma_chi_f * (s.rho * a + Math.sqrt(1 - s.rho ** 2) * b));
  }
  return { M_f: M, chi_f: c };
}

describe("Gaussian consistency test", () => {
  it("when the two estimates are given, then the deviation is normalised by their mean and propagated by the delta method", () => {
    // Derived: mu = (2 (62 - 65)/127, 2 (0.68 - 0.70)/1.38); J_I = diag(4*65/127^2, 4*0.7/1.38^2), J_R = diag(-4*62/127^2, -4*0.68/1.38^2).
    const g = gaussianDeviation(inspiral, ringdown);
    expect(g.mean[0]).toBeCloseTo(-6 / 127, 14);
    expect(g.mean[1]).toBeCloseTo(-0.04 / 1.38, 14);
    const jI = [(4 * 65) / 127 ** 2, (4 * 0.7) / 1.38 ** 2];
    const jR = [(-4 * 62) / 127 ** 2, (-4 * 0.68) / 1.38 ** 2];
    expect(g.covariance[0][0]).toBeCloseTo(jI[0]! ** 2 * 16 + jR[0]! ** 2 * 25, 14);
    expect(g.covariance[1][1]).toBeCloseTo(jI[1]! ** 2 * 0.0025 + jR[1]! ** 2 * 0.0064, 14);
    expect(g.covariance[0][1]).toBeCloseTo(jI[0]! * jI[1]! * -0.5 * 4 * 0.05 + jR[0]! * jR[1]! * 0.8 * 5 * 0.08, 14);
  });

  it("when the deviation is known, then the GR quantile is 1 - exp(-d^2/2)", () => {
    // chi-square with two degrees of freedom (derived).
    const g = gaussianDeviation(inspiral, ringdown);
    const d2 = mahalanobis2(g);
    expect(gaussianGrQuantile(g)).toBeCloseTo(1 - Math.exp(-d2 / 2), 14);
    // A hand-made case: mean (0.1, 0), diagonal covariance (0.05^2, 1): d^2 = 4, Q = 1 - e^-2 = 0.8647 (derived).
    expect(gaussianGrQuantile({ mean: [0.1, 0], covariance: [[0.0025, 0], [0, 1]] })).toBeCloseTo(1 - Math.exp(-2), 12);
    // Region radii: 2.279, 4.605, 5.991 for 68, 90, 95 % (chi-square, 2 dof; common practice).
    expect(chiSquare2Quantile(0.68)).toBeCloseTo(2.279, 3);
    expect(chiSquare2Quantile(0.9)).toBeCloseTo(4.605, 3);
    expect(chiSquare2Quantile(0.95)).toBeCloseTo(5.991, 3);
  });

  it("when both estimates are identical (a GR injection), then the quantile is 0", () => {
    expect(gaussianGrQuantile(gaussianDeviation(inspiral, inspiral))).toBe(0);
  });

  it("when the contour at level p is drawn, then every vertex has d^2 = -2 ln(1 - p) and the contour through (0,0) has level Q_GR", () => {
    const g = gaussianDeviation(inspiral, ringdown);
    for (const p of [0.68, 0.9, 0.95]) {
      for (const pt of gaussianContour(g, p, 24)) expect(mahalanobis2(g, pt)).toBeCloseTo(chiSquare2Quantile(p), 9);
    }
    const q = gaussianGrQuantile(g);
    expect(mahalanobis2(g, [0, 0])).toBeCloseTo(chiSquare2Quantile(q), 9);
  });

  it("when an input is unphysical, then the error names the field", () => {
    const bad = (s: Partial<RemnantSummary>, field: string) => {
      try {
        gaussianDeviation({ ...inspiral, ...s }, ringdown);
        throw new Error("accepted");
      } catch (err) {
        expect(err).toBeInstanceOf(PhysicsInputError);
        expect((err as PhysicsInputError).field).toBe(field);
      }
    };
    bad({ chi_f: 1 }, "inspiral.chi_f");
    bad({ M_f: -3 }, "inspiral.M_f");
    bad({ rho: 1 }, "inspiral.rho");
    bad({ sigma_chi_f: 0 }, "inspiral.sigma_chi_f");
    expect(() => gaussianDeviation({ ...inspiral, chi_f: 0.02 }, { ...ringdown, chi_f: 0.01 })).toThrow(/ill-defined/);
  });
});

describe("sample-based consistency test (density and contours from d3-contour)", () => {
  it("when samples are drawn from two Gaussians, then the quantile matches 1 - exp(-d^2/2) within the Monte-Carlo tolerance", () => {
    // Reference: the Gaussian formula with the sample mean and covariance of the deviation pairs (derived).
    // Tolerance 0.05 (our own estimate, about two standard errors): the quantile is the mass above the
    // density at (0, 0), and that density is estimated from the few hundred pairs under the kernel there
    // (relative error ~5 %, times 1 - Q ~ 0.4 gives ~0.02), plus a smoothing bias of ~0.01 (the kernel
    // widens the density by ~(1 + 0.64 n^(-1/3)) in variance).
    const small: RemnantSummary[] = [
      { M_f: 62, chi_f: 0.68, sigma_M_f: 2, sigma_chi_f: 0.03, rho: -0.6 },
      { M_f: 66, chi_f: 0.72, sigma_M_f: 2.5, sigma_chi_f: 0.04, rho: 0.7 },
    ];
    const r = sampleConsistency(draw(small[0]!, 20_000, 11), draw(small[1]!, 20_000, 29), { levels: [0.68, 0.9, 0.95] });
    const formula = 1 - Math.exp(-mahalanobis2(r.deviation) / 2);
    expect(formula).toBeGreaterThan(0.3);
    expect(Math.abs(r.gr_quantile - formula)).toBeLessThan(0.05);
    // And against the delta-method Gaussian of the two summaries (same tolerance, the ratio is nearly linear here).
    expect(Math.abs(r.gr_quantile - gaussianGrQuantile(gaussianDeviation(small[0]!, small[1]!)))).toBeLessThan(0.05);
    expect(r.gr_outside_grid).toBe(false);
  });

  it("when both sample sets come from the same Gaussian (a GR injection), then the quantile is near 0", () => {
    const s: RemnantSummary = { M_f: 62, chi_f: 0.68, sigma_M_f: 2, sigma_chi_f: 0.03, rho: 0 };
    const r = sampleConsistency(draw(s, 20_000, 5), draw(s, 20_000, 7), { levels: [0.9] });
    // Sample means differ by ~1/sqrt(20000) sigma, so d^2 ~ 1e-4 and Q ~ 0 (derived); grid resolution allows 0.03.
    expect(r.gr_quantile).toBeLessThan(0.03);
  });

  it("when contours are drawn at 68, 90, 95 %, then each encloses about that fraction of the pairs' Gaussian mass", () => {
    const r = sampleConsistency(draw(inspiral, 20_000, 3), draw({ ...ringdown, sigma_chi_f: 0.05 }, 20_000, 4), { levels: [0.95, 0.68, 0.9] });
    expect(r.contours.map((c) => c.level)).toEqual([0.68, 0.9, 0.95]);
    // For a near-Gaussian density the HPD contour at level p sits at d^2 ~ -2 ln(1 - p) (derived); tolerance 15 % for smoothing and MC.
    for (const c of r.contours) {
      expect(c.paths.length).toBeGreaterThan(0);
      const ring = c.paths.reduce((a, b) => (b.length > a.length ? b : a));
      const d2 = ring.map((pt) => mahalanobis2(r.deviation, pt));
      const median = [...d2].sort((a, b) => a - b)[Math.floor(d2.length / 2)]!;
      expect(median / chiSquare2Quantile(c.level)).toBeGreaterThan(0.85);
      expect(median / chiSquare2Quantile(c.level)).toBeLessThan(1.15);
    }
  });

  it("when the columns of a file differ in length, then the error names the column", () => {
    const good = draw(inspiral, 200, 1);
    expect(() => sampleConsistency({ M_f: good.M_f, chi_f: Array.from(good.chi_f).slice(1) }, good, { levels: [0.9] })).toThrow(
      /inspiral: M_f has 200 samples but chi_f has 199/,
    );
    const badSpin = { M_f: good.M_f, chi_f: Array.from(good.chi_f, (c, i) => (i === 7 ? 1.2 : c)) };
    expect(() => sampleConsistency(good, badSpin, { levels: [0.9] })).toThrow(/merger_ringdown: sample 8 has chi_f = 1.2/);
  });
});
