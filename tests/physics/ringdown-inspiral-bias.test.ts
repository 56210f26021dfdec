import { describe, expect, it } from "vitest";
import { builtInCurve } from "../../server/physics/forecast/curves.ts";
import { phase, phaseModel } from "../../server/physics/forecast/phase.ts";
import { couplingExclusion, inspiralBiasSigmas, testCovarianceAtGr } from "../../server/physics/ringdown/coupling-exclusion.ts";
import { inspiralRemnantWidths, ringdownRemnantWidths } from "../../server/physics/ringdown/forecast-widths.ts";
import { remnantFromBinary } from "../../server/physics/ringdown/remnant.ts";
import { SOLAR_MASS_TIME_S } from "../../server/physics/units.ts";

/**
 * The inspiral side of a theory's shift in the IMR consistency test: the linear bias of a GR template
 * fitted to a signal with a ppE term (Cutler & Vallisneri 2007, arXiv:0707.2982), pushed through the
 * remnant fits (applied to the IMR test as in Carson & Yagi 2020, arXiv:2002.08559; our reconstruction).
 * Worked case: the GW150914-like binary of tests/physics/ringdown-forecast-widths.test.ts (m1 = 36,
 * m2 = 29 M_sun source frame, non-spinning, z = 0.09, D_L = 410 Mpc) at Advanced LIGO design, 10 Hz on.
 */
const WORKED = { m1: 36, m2: 29, chi1: 0, chi2: 0, z: 0.09, distance_mpc: 410, detector: { curve: "aligo-design", f_low: 10 } } as const;

/** Solves A x = y by Gaussian elimination with partial pivoting (small dense systems of this test). */
function solve(A: number[][], y: number[]): number[] {
  const n = y.length;
  const M = A.map((row, i) => [...row, y[i]!]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r]![c]!) > Math.abs(M[p]![c]!)) p = r;
    [M[c], M[p]] = [M[p]!, M[c]!];
    for (let r = c + 1; r < n; r++) {
      const k = M[r]![c]! / M[c]![c]!;
      for (let j = c; j <= n; j++) M[r]![j]! -= k * M[c]![j]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = M[r]![n]!;
    for (let j = r + 1; j < n; j++) s -= M[r]![j]! * x[j]!;
    x[r] = s / M[r]![r]!;
  }
  return x;
}

describe("linear bias of the inspiral estimate from a theory's ppE term", () => {
  const w = inspiralRemnantWidths({ ...WORKED, bias_b: [3, -5, -7] });
  const byB = (b: number) => w.bias.find((v) => v.b === b)!;
  const at = (name: string) => w.parameters.indexOf(name);
  const mcZs = ((36 * 29) ** 0.6 / 65 ** 0.2) * 1.09 * SOLAR_MASS_TIME_S;

  it("when the ppE term is linear in f (b = 3), then t_c absorbs it all: d t_c = beta Mc_z / 2 and nothing else moves", () => {
    // Derived: beta u^3 = beta pi Mc_z f, and the template's 2 pi f t_c matches it exactly with d t_c = beta Mc_z / 2.
    // No prior acts on t_c, so the prior-augmented Fisher matrix leaves the absorption exact.
    const v = byB(3);
    expect(v.theta[at("t_c")]! / (mcZs / 2)).toBeCloseTo(1, 6);
    for (const name of ["phi_c", "ln_Mc", "ln_eta", "chi_s", "chi_a"]) expect(Math.abs(v.theta[at(name)]!)).toBeLessThan(1e-8);
    expect(Math.abs(v.remnant[0])).toBeLessThan(1e-9);
    expect(Math.abs(v.remnant[1])).toBeLessThan(1e-9);
  });

  it("when the ppE term is the 0PN one (b = -5), then ln Mc takes it: d ln Mc close to -(128/5) beta", () => {
    // Our own computation: the 0PN phase is (3/128) u^-5, u = (pi Mc f)^(1/3), so ln Mc -> ln Mc + d shifts it by
    // -(5/3)(3/128) d u^-5 = -(5/128) d u^-5; a beta u^-5 term is matched by d = -(128/5) beta = -25.6 beta. The
    // higher PN terms also move with Mc, so the other parameters take a small part: a few per cent for this band.
    const d = byB(-5).theta[at("ln_Mc")]!;
    expect(d).toBeLessThan(0);
    expect(Math.abs(d / (-128 / 5) - 1)).toBeLessThan(0.06);
  });

  it("when the GR template is fitted to the shifted phase by direct minimisation, then its shifts match the bias vector", () => {
    // Independent of the Fisher assembly: minimise sum_i w_i [Psi_GR(f_i; theta) - Psi_GR(f_i; theta0) - beta u^b]^2 plus
    // the same Gaussian priors (phi_c pi, chi_s 1, chi_a 1, centred on the truth), with Gauss-Newton steps on
    // finite-difference derivatives of the phase, weights 4 A^2 f^(-7/3)/S_n normalised to the forecast's SNR^2.
    const curve = builtInCurve("aligo-design")!;
    const eta0 = (36 * 29) / 65 ** 2;
    const theta0 = [0, 0, Math.log(mcZs), Math.log(eta0), 0, 0];
    const psi = (t: number[], f: number) => phase(phaseModel(Math.exp(t[2]!), { eta: Math.exp(t[3]!), chi_s: t[4]!, chi_a: t[5]! }, "ln_eta"), f, t[1]!, t[0]!, 0, 0);
    const n = 3000;
    const l0 = Math.log(w.f_low);
    const step = (Math.log(w.f_high) - l0) / (n - 1);
    const fs = Array.from({ length: n }, (_, i) => Math.exp(l0 + i * step));
    const raw = fs.map((f, i) => ((i === 0 || i === n - 1 ? 0.5 : 1) * step * f * f ** (-7 / 3)) / curve.psd(f, 1));
    const total = raw.reduce((s, x) => s + x, 0);
    const weights = raw.map((x) => (x * w.snr ** 2) / total);
    const prior = [1 / Math.PI ** 2, 0, 0, 0, 1, 1];
    const h = [1e-6, 1e-9, 1e-7, 1e-7, 1e-6, 1e-6];
    for (const [b, beta] of [
      [-7, 1e-8],
      [-5, 1e-5],
    ] as const) {
      const u0 = fs.map((f) => Math.cbrt(Math.PI * mcZs * f));
      const signal = fs.map((f, i) => psi(theta0, f) + beta * u0[i]! ** b);
      let theta = [...theta0];
      for (let iter = 0; iter < 3; iter++) {
        const r = fs.map((f, i) => psi(theta, f) - signal[i]!);
        const J = theta.map((_, k) => {
          const up = [...theta];
          const dn = [...theta];
          up[k]! += h[k]!;
          dn[k]! -= h[k]!;
          return fs.map((f) => (psi(up, f) - psi(dn, f)) / (2 * h[k]!));
        });
        const A = J.map((ja, a) => J.map((jb, c) => ja.reduce((s, x, i) => s + weights[i]! * x * jb[i]!, 0) + (a === c ? prior[a]! : 0)));
        const g = J.map((ja, a) => -(ja.reduce((s, x, i) => s + weights[i]! * x * r[i]!, 0) + prior[a]! * (theta[a]! - theta0[a]!)));
        const delta = solve(A, g);
        theta = theta.map((x, k) => x + delta[k]!);
      }
      const v = byB(b);
      const names = ["phi_c", "t_c", "ln_Mc", "ln_eta", "chi_s", "chi_a"];
      // Within 2 % each (the two integrate on different grids; u^-7 weighs the lowest frequencies most).
      names.forEach((name, k) => {
        expect(Math.abs((theta[k]! - theta0[k]!) / beta / v.theta[at(name)]! - 1), `${name} at b = ${b}`).toBeLessThan(0.02);
      });
      // The remnant of the fitted binary against the product's Jacobian route (Husa et al. 2016 fits, both).
      const remnantOf = (t: number[]) => {
        const eta = Math.exp(t[3]!);
        const M = Math.exp(t[2]!) * eta ** -0.6;
        const d = Math.sqrt(1 - 4 * eta);
        const r = remnantFromBinary({ m1: (M * (1 + d)) / 2, m2: (M * (1 - d)) / 2, chi1: t[4]! + t[5]!, chi2: t[4]! - t[5]! });
        return [Math.log(r.M_f), r.chi_f];
      };
      const a = remnantOf(theta0);
      const c = remnantOf(theta);
      expect((c[0]! - a[0]!) / beta / v.remnant[0]).toBeCloseTo(1, 2);
      expect((c[1]! - a[1]!) / beta / v.remnant[1]).toBeCloseTo(1, 2);
    }
  });

  it("when the only effect is an inspiral dipole term (b = -7) and the widths are the forecast's, then GR is excluded at 90 % from beta ~ 6e-5, near the direct ppE forecast", () => {
    const r = remnantFromBinary({ m1: 36 * 1.09, m2: 29 * 1.09, chi1: 0, chi2: 0 });
    const M = r.M_f;
    const chi = r.chi_f;
    const toMass = (c: readonly (readonly number[])[]) =>
      [
        [M * M * c[0]![0]!, M * c[0]![1]!],
        [M * c[1]![0]!, c[1]![1]!],
      ] as [[number, number], [number, number]];
    const covI = toMass(w.covariance);
    const covR = toMass(ringdownRemnantWidths("220", chi, 21.9));
    const cov = testCovarianceAtGr(M, chi, covI, covR);
    const g = byB(-7).remnant;
    const sigma: [number, number] = [Math.sqrt(w.covariance[0][0]), Math.sqrt(w.covariance[1][1]) / chi];
    const input = {
      mode: "220" as const,
      M,
      chi,
      shifts: { df: () => 0, dtau: () => 0 },
      inspiral: { dM: (x: number) => Math.expm1(x * g[0]), dchi: (x: number) => (x * g[1]) / chi },
      inspiralSigma: sigma,
      covariance: cov,
      credibility: 0.9,
      sides: [1, -1] as (1 | -1)[],
    };
    const res = couplingExclusion(input);
    // Closed form written here (derived): the inspiral estimate is (M e^{beta g_M}, chi + beta g_chi), the ringdown's is (M, chi);
    // the deviation is normalised by the mean of the two; Q = 1 - exp(-d^2/2) at the bound is the credibility.
    const det = cov[0][0] * cov[1][1] - cov[0][1] ** 2;
    const q = (beta: number) => {
      const MI = M * Math.exp(beta * g[0]);
      const cI = chi + beta * g[1];
      const a = (2 * (MI - M)) / (MI + M);
      const b = (2 * (cI - chi)) / (cI + chi);
      return 1 - Math.exp(-((cov[1][1] * a * a - 2 * cov[0][1] * a * b + cov[0][0] * b * b) / det) / 2);
    };
    for (const s of res.sides) {
      expect(s.x).not.toBeNull();
      expect(q(s.x!)).toBeCloseTo(0.9, 6);
      // The worked number 6.9e-5 (our own computation, its band and priors not stated) is reproduced to about 15 %:
      // here 5.8e-5 and -6.2e-5. The direct ppE forecast on 10 Hz - f_ISCO is 7.9e-5 (tests/physics/forecast-fisher.test.ts).
      expect(Math.abs(Math.abs(s.x!) / 6.9e-5 - 1)).toBeLessThan(0.16);
      expect(Math.abs(s.x!) / 7.9e-5).toBeGreaterThan(0.6);
      expect(Math.abs(s.x!) / 7.9e-5).toBeLessThan(1.2);
      // At the bound the bias is past one standard deviation of the inspiral estimate: the linear picture is stretched,
      // and the point where it passes one is reported below the bound, where the bias is exactly one standard deviation.
      expect(s.bias_sigmas_at_bound).toBeCloseTo(Math.max(Math.abs(s.x! * g[0]) / sigma[0], Math.abs(s.x! * g[1]) / chi / sigma[1]), 6);
      expect(s.bias_sigmas_at_bound!).toBeGreaterThan(1);
      expect(Math.abs(s.bias_exceeds_sigma_at!)).toBeLessThan(Math.abs(s.x!));
      expect(Math.sign(s.bias_exceeds_sigma_at!)).toBe(s.side);
      expect(inspiralBiasSigmas(input, s.bias_exceeds_sigma_at!)).toBeCloseTo(1, 6);
    }
  });

  it("when the source is twice as far, then the bias per unit beta barely moves (only the priors weigh more)", () => {
    // Without priors Gamma and its beta column both scale with the amplitude squared (Cutler & Vallisneri 2007): the bias
    // would not depend on the distance. The Gaussian priors (the widths' own) make it depend weakly.
    const far = inspiralRemnantWidths({ ...WORKED, distance_mpc: 820, bias_b: [-5] });
    const near = byB(-5).remnant;
    expect(far.bias[0]!.remnant[0] / near[0]).toBeGreaterThan(0.8);
    expect(far.bias[0]!.remnant[0] / near[0]).toBeLessThan(1.25);
    expect(far.bias[0]!.remnant[0]).not.toBe(near[0]);
  });
});
