import { describe, expect, it } from "vitest";
import { GEOMETRY_FACTOR, amplitudeFactor, frequencyAtTimeToMerger, iscoFrequency, timeToMerger } from "../../server/physics/forecast/amplitude.ts";
import { BUILT_IN_CURVES, builtInCurve, lisaConfusionRow, lisaInstrument, tabulatedPsd } from "../../server/physics/forecast/curves.ts";
import { SOLAR_MASS_TIME_S, SPEED_OF_LIGHT_M_S } from "../../server/physics/units.ts";

const asd = (id: string, f: number, years = 4) => Math.sqrt(builtInCurve(id)!.psd(f, years));

/** Check values of sqrt(S_n) in 1/sqrt(Hz): our own computation from the published fits (4 digits). */
const CHECKS: Record<string, [number, number][]> = {
  // Ajith 2011 fit of the aLIGO zero-detuned high-power curve
  "aligo-design": [[10, 7.436e-23], [20, 1.901e-23], [50, 4.987e-24], [100, 3.97e-24], [200, 3.802e-24], [500, 4.031e-24], [1000, 5.386e-24]],
  // Yunes, Yagi & Pretorius 2016, App. C fit of LIGO Hanford O1
  "aligo-o1": [[20, 2.079e-22], [50, 1.587e-23], [100, 8.721e-24], [200, 7.916e-24], [500, 1.111e-23]],
  // Mishra, Arun, Iyer & Sathyaprakash 2010 ET-B fit, one interferometer
  "et-b": [[10, 5.215e-24], [50, 4.27e-25], [100, 3.249e-25], [200, 1.612e-25], [1000, 5.949e-25]],
  // Robson, Cornish & Liu 2019 with the 4-year galactic confusion
  lisa: [[1e-4, 4.628e-17], [1e-3, 2.88e-19], [3e-3, 1.768e-20], [1e-2, 1.201e-20], [2e-2, 1.422e-20], [0.1, 4.615e-20]],
  // Huang et al. 2020, Eq. 13, times 10/3
  tianqin: [[1e-3, 5.602e-19], [1e-2, 1.183e-20], [2e-2, 1.064e-20], [0.1, 1.095e-20]],
  // Yagi & Seto 2011, Eq. 5
  decigo: [[0.1, 7.77e-24], [1, 2.681e-24], [10, 4.479e-24]],
  // Isoyama, Nakano & Nakamura 2018
  "b-decigo": [[0.1, 2.538e-22], [1, 2.027e-23]],
};

describe("noise curves", () => {
  for (const [id, checks] of Object.entries(CHECKS)) {
    it(`when ${id} is evaluated, then it matches the check values to 0.1 % (our own computation from the published fit)`, () => {
      for (const [f, expected] of checks) expect(asd(id, f) / expected - 1, `${id} at ${f} Hz`).toBeLessThan(1e-3);
      for (const [f, expected] of checks) expect(asd(id, f) / expected - 1, `${id} at ${f} Hz`).toBeGreaterThan(-1e-3);
    });
  }

  it("when every built-in curve is listed, then each has a source, a convention and a range that contains its default lower cut", () => {
    expect(BUILT_IN_CURVES.map((c) => c.id).sort()).toEqual(["aligo-design", "aligo-o1", "b-decigo", "decigo", "et-b", "lisa", "tianqin"]);
    for (const c of BUILT_IN_CURVES) {
      expect(c.source.length).toBeGreaterThan(10);
      expect(c.fMin).toBeLessThanOrEqual(c.defaultFLow);
      expect(c.fMax).toBeGreaterThan(c.defaultFLow);
    }
  });

  it("when the aLIGO design fit is scanned, then its minimum is 3.789e-24 near 250 Hz (our own computation)", () => {
    let best = { f: 0, a: Infinity };
    for (let f = 100; f <= 500; f += 1) {
      const a = asd("aligo-design", f);
      if (a < best.a) best = { f, a };
    }
    expect(best.a / 3.789e-24 - 1).toBeLessThan(1e-3);
    expect(Math.abs(best.f - 250)).toBeLessThan(10);
  });

  it("when LISA is evaluated without the galactic foreground, then sqrt(S_n) at 1 mHz is 1.278e-19 (our own computation, RCL 2019 Eqs. 1, 9-12)", () => {
    expect(Math.sqrt(lisaInstrument(1e-3)) / 1.278e-19 - 1).toBeLessThan(1e-3);
    expect(Math.sqrt(lisaInstrument(1e-3)) / 1.278e-19 - 1).toBeGreaterThan(-1e-3);
  });

  it("when the observing time is 1.3 yr, then the 1-yr confusion row is used; 3.5 yr picks the 4-yr row (closest in log time; RCL 2019, Table 1)", () => {
    expect(lisaConfusionRow(1.3).years).toBe(1);
    expect(lisaConfusionRow(3.5).years).toBe(4);
    expect(Math.abs(asd("lisa", 1e-3, 1) / asd("lisa", 1e-3, 4) - 1)).toBeGreaterThan(0.01);
  });

  it("when a tabulated curve is interpolated, then a power law is reproduced exactly between the nodes (log-log linear; derived)", () => {
    const fs = [1, 10, 100];
    const psd = tabulatedPsd({ frequencies: fs, psd: fs.map((f) => 1e-46 * f ** -3) });
    expect(psd(3.7) / (1e-46 * 3.7 ** -3)).toBeCloseTo(1, 12);
    expect(psd(55) / (1e-46 * 55 ** -3)).toBeCloseTo(1, 12);
  });
});

/**
 * Antenna patterns by quadrature (derived): an interferometer with unit arm vectors a, b responds
 * to h_ij with F = D_ij e_ij, D = (a a - b b)/2. The average of F+^2 over the sky and the polarisation
 * angle gives 1/5 for perpendicular arms and sin^2(opening) / 5 in general.
 */
function meanSquaredResponse(openingDeg: number): number {
  const zeta = (openingDeg * Math.PI) / 180;
  const a = [1, 0, 0];
  const b = [Math.cos(zeta), Math.sin(zeta), 0];
  const D = (i: number, j: number) => 0.5 * (a[i]! * a[j]! - b[i]! * b[j]!);
  const nTheta = 120;
  const nPhi = 120;
  const nPsi = 24;
  let sum = 0;
  let weight = 0;
  for (let it = 0; it < nTheta; it++) {
    const theta = ((it + 0.5) / nTheta) * Math.PI;
    const w = Math.sin(theta);
    for (let ip = 0; ip < nPhi; ip++) {
      const phi = ((ip + 0.5) / nPhi) * 2 * Math.PI;
      for (let is = 0; is < nPsi; is++) {
        const psi = ((is + 0.5) / nPsi) * Math.PI;
        // wave frame: propagation n, polarisation axes p, q rotated by psi
        const ex = [Math.cos(theta) * Math.cos(phi), Math.cos(theta) * Math.sin(phi), -Math.sin(theta)];
        const ey = [-Math.sin(phi), Math.cos(phi), 0];
        const p = ex.map((x, k) => Math.cos(psi) * x + Math.sin(psi) * ey[k]!);
        const q = ex.map((x, k) => -Math.sin(psi) * x + Math.cos(psi) * ey[k]!);
        let fPlus = 0;
        for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) fPlus += D(i, j) * (p[i]! * p[j]! - q[i]! * q[j]!);
        sum += w * fPlus * fPlus;
        weight += w;
      }
    }
  }
  return sum / weight;
}

/** Average over cos(i) in [-1, 1] of ((1 + cos^2 i)/2)^2 + cos^2 i, by Simpson's rule (derived: 4/5). */
function inclinationAverage(): number {
  const n = 2000;
  let s = 0;
  for (let k = 0; k <= n; k++) {
    const c = -1 + (2 * k) / n;
    const g = ((1 + c * c) / 2) ** 2 + c * c;
    s += (k === 0 || k === n ? 1 : k % 2 ? 4 : 2) * g;
  }
  return (s * (2 / n)) / 3 / 2;
}

describe("geometric factors", () => {
  const l = meanSquaredResponse(90);
  const sixty = meanSquaredResponse(60);

  it("when the L-shaped response is averaged over sky and polarisation, then <F+^2> = 1/5 (derived by quadrature)", () => {
    expect(l).toBeCloseTo(1 / 5, 4);
  });

  it("when the inclination is averaged too, then the power is 4/25 of the optimal and the amplitude factor 1/30 = (4/25)(5/24) (derived)", () => {
    const average = l * inclinationAverage();
    expect(average).toBeCloseTo(4 / 25, 4);
    expect(amplitudeFactor("l_shaped", "sky_averaged") / amplitudeFactor("l_shaped", "optimal")).toBeCloseTo(average, 4);
    expect(amplitudeFactor("l_shaped", "optimal")).toBe(5 / 24);
  });

  it("when the arms open at 60 degrees, then one interferometer sees 3/4, a triangle of three 9/4 and two channels 3/2 of an L (derived by quadrature)", () => {
    expect(sixty / l).toBeCloseTo(3 / 4, 4);
    expect(GEOMETRY_FACTOR.triangle).toBeCloseTo((3 * sixty) / l, 4);
    expect(GEOMETRY_FACTOR.two_channel_triangle).toBeCloseTo((2 * sixty) / l, 4);
  });

  it("when a response-averaged curve is used, then SNR^2 = (16/5) int A_opt^2 f^(-7/3)/S_n df, i.e. 4 x 4/5 x 5/24 (derived; RCL 2019 convention)", () => {
    expect(4 * amplitudeFactor("response_averaged", "sky_averaged")).toBeCloseTo((16 / 5) * (5 / 24), 14);
    expect(amplitudeFactor("response_averaged", "sky_averaged") / amplitudeFactor("response_averaged", "optimal")).toBeCloseTo(inclinationAverage(), 6);
  });

  it("when the LISA curve is compared with its noise at low frequency, then the ratio is 10/3 = 1/R with R = 2 channels x 3/4 x 1/5 (derived; RCL 2019 Eqs. 10-12 typed again here)", () => {
    const f = 1e-4;
    const L = 2.5e9;
    const fstar = SPEED_OF_LIGHT_M_S / (2 * Math.PI * L);
    const pOms = (1.5e-11) ** 2 * (1 + (2e-3 / f) ** 4);
    const pAcc = (3e-15) ** 2 * (1 + (0.4e-3 / f) ** 2) * (1 + (f / 8e-3) ** 4);
    const pn = (pOms + (2 * (1 + Math.cos(f / fstar) ** 2) * pAcc) / (2 * Math.PI * f) ** 4) / L ** 2;
    const R = 2 * (sixty / l) * l;
    expect(R).toBeCloseTo(3 / 10, 4);
    expect(lisaInstrument(f) / pn).toBeCloseTo(1 / R, 2);
  });
});

describe("frequency limits", () => {
  const mcZ = 30.62 * SOLAR_MASS_TIME_S;
  const yr = 31_557_600;

  it("when Mc_z = 30.62 M_sun, then f(1 yr) = 0.02742 Hz, f(4 yr) = 0.01631 Hz, f(10 yr) = 0.01156 Hz and tau(10 Hz) = 4.65 s (our own computation, leading-order chirp time)", () => {
    expect(frequencyAtTimeToMerger(mcZ, yr) / 0.02742 - 1).toBeLessThan(1e-3);
    expect(Math.abs(frequencyAtTimeToMerger(mcZ, 4 * yr) / 0.01631 - 1)).toBeLessThan(1e-3);
    expect(Math.abs(frequencyAtTimeToMerger(mcZ, 10 * yr) / 0.01156 - 1)).toBeLessThan(1e-3);
    expect(Math.abs(timeToMerger(mcZ, 10) / 4.65 - 1)).toBeLessThan(2e-3);
    expect(timeToMerger(mcZ, frequencyAtTimeToMerger(mcZ, 123.4))).toBeCloseTo(123.4, 8);
  });

  it("when M_z = 70.85 M_sun, then the ISCO frequency is 62.06 Hz (derived: 1/(6^(3/2) pi M))", () => {
    expect(iscoFrequency(70.85 * SOLAR_MASS_TIME_S)).toBeCloseTo(62.06, 1);
  });
});
