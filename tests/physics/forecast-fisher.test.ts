import { describe, expect, it } from "vitest";
import { combineFisher } from "../../server/physics/forecast/combine.ts";
import { DEFAULT_PRIORS, runForecast, type ForecastInput } from "../../server/physics/forecast/forecast.ts";
import { invertFisher } from "../../server/physics/forecast/linalg.ts";
import { boundMultiplier, normalQuantile } from "../../server/physics/forecast/stats.ts";
import { PhysicsInputError } from "../../server/physics/input-error.ts";

/** GW150914-like source of the worked example: D_L = 410 Mpc and z = 0.09 both given. */
const SOURCE = { m1: 36, m2: 29, chi1: 0, chi2: 0, frame: "source" as const, distance_mpc: 410, z: 0.09 };

function forecast(detectors: ForecastInput["detectors"], extra: Partial<ForecastInput> = {}) {
  return runForecast({ source: SOURCE, detectors, networks: detectors.map((_, i) => [i]), b: [-7, -3], ...extra });
}

const within = (actual: number | null, expected: number, tolerance = 0.02) => {
  expect(actual).not.toBeNull();
  expect(Math.abs(actual! / expected - 1), `${actual} vs ${expected}`).toBeLessThan(tolerance);
};

describe("worked example, GW150914-like binary (our own computation; within 2 %)", () => {
  const r = forecast(
    [{ curve: "aligo-design" }, { curve: "aligo-design", orientation: "optimal" }, { curve: "aligo-o1" }, { curve: "et-b" }, { curve: "lisa" }, { curve: "tianqin" }, { curve: "decigo" }],
    { networks: [[0], [1], [2], [3], [4], [5], [6], [4, 0]] },
  );
  const rows: [string, number, number, number, number, number][] = [
    // label, network, SNR, sigma_beta(b=-7), sigma_beta(b=-3), bound(b=-7)
    ["aLIGO design, 10 Hz - f_ISCO", 0, 36.41, 4.805e-5, 0.2287, 7.9e-5],
    ["aLIGO design, optimal orientation", 1, 91.01, 1.945e-5, 0.0928, 3.2e-5],
    ["O1-like H1 fit, 20 Hz - f_ISCO", 2, 9.43, 1.166e-3, 4.34, 1.92e-3],
    ["ET-B triangle, 1 Hz - f_ISCO", 3, 694.9, 5.51e-8, 2.62e-3, 9.07e-8],
    ["LISA (RCL, 4 yr), 0.0163 Hz - 1 Hz", 4, 4.57, 1.015e-10, 1.9e-2, 1.67e-10],
    ["TianQin, same band", 5, 7.36, 3.86e-11, 4.86e-3, 6.35e-11],
    ["DECIGO, one triangle", 6, 3814, 3.1e-13, 3.32e-4, 5.09e-13],
    ["LISA + aLIGO design (sum of Fisher matrices)", 7, 36.69, 5.73e-11, 2.11e-3, 9.43e-11],
  ];
  for (const [label, n, snr, s7, s3, bound7] of rows) {
    it(`when the network is ${label}, then SNR, sigma_beta at b = -7 and -3 and the 90 % bound match`, () => {
      const net = r.networks[n]!;
      within(net.snr.total, snr);
      within(net.rows[0]!.sigma_beta, s7);
      within(net.rows[1]!.sigma_beta, s3);
      within(net.rows[0]!.bound, bound7);
    });
  }

  it("when the worked example is run, then the masses, ISCO and bands are those of the example (our own computation)", () => {
    within(r.source.mc_z_msun, 30.624, 1e-4);
    within(r.source.f_isco_hz, 62.06, 1e-3);
    within(r.detectors[4]!.f_low, 0.01631, 1e-3);
    expect(r.detectors[4]!.f_high).toBe(1);
    expect(r.detectors[0]!.f_high).toBe(r.source.f_isco_hz);
  });

  it("when LISA alone has SNR 4.6, then the network carries the low-SNR caution (common practice)", () => {
    expect(r.networks[4]!.cautions.join(" ")).toMatch(/below 10/);
    expect(r.networks[0]!.cautions).toHaveLength(0);
  });

  it("when the band is extrapolated to the PhenomA merger frequency, then the SNR is 44.92 and the bound is labelled (our own computation)", () => {
    const x = forecast([{ curve: "aligo-design" }], { upper_cut: "merger_extrapolated" });
    within(x.detectors[0]!.f_high, 113.8, 1e-3);
    within(x.networks[0]!.snr.total, 44.92);
    within(x.networks[0]!.rows[0]!.sigma_beta, 2.36e-5);
    expect(x.detectors[0]!.extrapolated).toBe(true);
    expect(x.networks[0]!.cautions.join(" ")).toMatch(/extrapolated/);
  });

  it("when the spins are +0.3 or -0.3, then sigma_beta(b=-7) is 5.58e-5 or 4.40e-5 (our own computation)", () => {
    const up = runForecast({ source: { ...SOURCE, chi1: 0.3, chi2: 0.3 }, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [-7] });
    const down = runForecast({ source: { ...SOURCE, chi1: -0.3, chi2: -0.3 }, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [-7] });
    within(up.networks[0]!.rows[0]!.sigma_beta, 5.58e-5);
    within(down.networks[0]!.rows[0]!.sigma_beta, 4.4e-5);
  });
});

describe("scalings and degeneracies", () => {
  const noPriors = { phi_c: null, chi_s: null, chi_a: null };

  it("when the distance doubles without priors, then the SNR halves and sigma_beta doubles (derived: Gamma scales as 1/D^2)", () => {
    const near = runForecast({ source: SOURCE, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [-7, -1], priors: noPriors });
    const far = runForecast({ source: { ...SOURCE, distance_mpc: 820 }, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [-7, -1], priors: noPriors });
    expect(far.networks[0]!.snr.total / near.networks[0]!.snr.total).toBeCloseTo(0.5, 10);
    expect(far.networks[0]!.rows[0]!.sigma_beta! / near.networks[0]!.rows[0]!.sigma_beta!).toBeCloseTo(2, 4);
  });

  it("when priors are on, then sigma_beta no longer scales exactly with 1/SNR (the prior is a fixed amount of information)", () => {
    const near = runForecast({ source: SOURCE, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [-7] });
    const far = runForecast({ source: { ...SOURCE, distance_mpc: 820 }, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [-7] });
    expect(Math.abs(far.networks[0]!.rows[0]!.sigma_beta! / near.networks[0]!.rows[0]!.sigma_beta! - 2)).toBeGreaterThan(1e-3);
  });

  it("when the matrices are returned, then ln A decouples: Gamma_{lnA,j} = 0 and Gamma_{lnA,lnA} = SNR^2 (derived)", () => {
    const r = runForecast({ source: SOURCE, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [-7], include_matrices: true });
    const g = r.matrices![0]!.per_detector[0]!;
    expect(g[0]![0]).toBeCloseTo(r.detectors[0]!.snr ** 2, 8);
    for (let j = 1; j < 8; j++) expect(g[0]![j]).toBe(0);
    expect(r.parameters).toEqual(["ln_A", "phi_c", "t_c", "ln_Mc", "ln_eta", "chi_s", "chi_a", "beta"]);
  });

  it("when b = 0 or b = 3, then the answer is no_constraint with the reason (Yunes & Pretorius 2009: degenerate with phi_c and t_c)", () => {
    const r = runForecast({ source: SOURCE, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [0, 3], include_matrices: true });
    for (const row of r.networks[0]!.rows) {
      expect(row.status).toBe("no_constraint");
      expect(row.sigma_beta).toBeNull();
      expect(row.note).toMatch(row.b === 0 ? /coalescence phase/ : /coalescence time/);
    }
    // The degeneracies are real, not just declared (derived: dPsi/dbeta = 1 = -dPsi/dphi_c at b = 0;
    // u^3 is proportional to f, like dPsi/dt_c, at b = 3).
    const names = r.parameters;
    const b0 = r.matrices![0]!.per_detector[0]!.map((row) => [...row]);
    expect(invertFisher(b0, names).status).toBe("no_constraint");
    const b3 = r.matrices![1]!.per_detector[0]!.map((row) => [...row]);
    b3[1]![1]! += 1 / Math.PI ** 2;
    b3[5]![5]! += 1;
    b3[6]![6]! += 1;
    const inv3 = invertFisher(b3, names);
    expect(inv3.status).toBe("no_constraint");
    expect(inv3.degenerateDirection).toMatch(/t_c/);
    expect(inv3.degenerateDirection).toMatch(/beta/);
  });

  it("when the grid is four times finer, then sigma_beta changes by less than 1e-4 (our own convergence check of the trapezoid rule in ln f)", () => {
    const base = { source: SOURCE, detectors: [{ curve: "aligo-design" }, { curve: "lisa" }], networks: [[0, 1]], b: [-7, -1, 2] };
    const coarse = runForecast(base);
    const fine = runForecast({ ...base, grid_points: 40_000 });
    coarse.networks[0]!.rows.forEach((row, i) => expect(Math.abs(row.sigma_beta! / fine.networks[0]!.rows[i]!.sigma_beta! - 1)).toBeLessThan(1e-4));
  });
});

describe("bounds from sigma", () => {
  it("when the credibility is 90 %, then the two-sided multiplier is 1.6449 and the one-sided 1.2816 (standard normal quantiles, common practice)", () => {
    expect(boundMultiplier(0.9, "two")).toBeCloseTo(1.644854, 5);
    expect(boundMultiplier(0.9, "one")).toBeCloseTo(1.281552, 5);
    expect(normalQuantile(0.975)).toBeCloseTo(1.959964, 6);
    expect(normalQuantile(0.001)).toBeCloseTo(-3.090232, 5);
  });
});

describe("combining uploaded Fisher matrices", () => {
  const r = runForecast({
    source: SOURCE,
    detectors: [{ curve: "lisa" }, { curve: "aligo-design" }],
    networks: [[0], [1], [0, 1]],
    b: [-7],
    include_matrices: true,
  });
  const [lisa, ligo] = r.matrices![0]!.per_detector;
  const names = [...r.parameters];

  it("when the per-detector matrices are uploaded, then the combined network equals the forecast's sum (derived: independent noise adds Fisher matrices)", () => {
    // the second matrix lists its parameters in reverse order: alignment is by name
    const reversed = ligo!.map((row) => [...row].reverse()).reverse();
    const c = combineFisher({
      matrices: [
        { label: "LISA", parameters: names, matrix: lisa! },
        { label: "aLIGO", parameters: [...names].reverse(), matrix: reversed },
      ],
      networks: [[0], [1], [0, 1]],
      target: "beta",
      priors: DEFAULT_PRIORS,
      credibility: 0.9,
      sides: "two",
    });
    c.networks.forEach((n, i) => expect(n.sigma! / r.networks[i]!.rows[0]!.sigma_beta! - 1).toBeCloseTo(0, 10));
    const summed = c.networks[2]!.fisher;
    expect(summed[3]![7]).toBeCloseTo(lisa![3]![7]! + ligo![3]![7]!, 0);
  });

  it("when a matrix is not symmetric, not positive definite or names other parameters, then the error names it", () => {
    const bad = lisa!.map((row) => [...row]);
    bad[2]![3] = bad[2]![3]! * 1.5 + 1;
    const call = (m: number[][], p = names) => () =>
      combineFisher({ matrices: [{ label: "a", parameters: names, matrix: lisa! }, { label: "b", parameters: p, matrix: m }], networks: [[0, 1]], target: "beta", priors: DEFAULT_PRIORS, credibility: 0.9, sides: "two" });
    expect(call(bad)).toThrowError(/matrices\.1 is not symmetric/);
    const indefinite: number[][] = names.map((_, i) => names.map((__, j) => (i === j ? 1 : 0.9)));
    indefinite[0]![1] = indefinite[1]![0] = -0.9;
    expect(call(indefinite)).toThrowError(/not positive definite/);
    const renamed = [...names];
    renamed[4] = "q";
    expect(call(lisa!.map((row) => [...row]), renamed)).toThrowError(/matrices\.1\.parameters do not match.*missing ln_eta.*unexpected q/);
  });
});

describe("bad input", () => {
  const base: ForecastInput = { source: SOURCE, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [-7] };
  const field = (input: ForecastInput) => {
    try {
      runForecast(input);
    } catch (e) {
      if (e instanceof PhysicsInputError) return e.field;
      throw e;
    }
    return null;
  };

  it("when an input is out of range, then the error names the field at fault", () => {
    expect(field({ ...base, detectors: [{ curve: "nope" }] })).toBe("detectors.0.curve");
    expect(field({ ...base, detectors: [{ curve: "aligo-design", f_low: 5 }] })).toBe("detectors.0.f_low");
    expect(field({ ...base, detectors: [{ curve: "aligo-design", f_low: 80 }] })).toBe("detectors.0.f_low");
    expect(field({ ...base, detectors: [{ curve: "aligo-design", f_low: 30, f_high: 20 }] })).toBe("detectors.0.f_low");
    expect(field({ ...base, detectors: [{ curve: "lisa", f_low: 0.5, years_before_merger: 4, years_observed: 1 }] })).toBe("detectors.0.years_observed");
    expect(field({ ...base, detectors: [{ curve: "lisa", years_before_merger: 1e-6 }] })).toBe("detectors.0.years_before_merger");
    expect(field({ ...base, source: { ...SOURCE, m1: -3 } })).toBe("source.m1");
    expect(field({ ...base, source: { ...SOURCE, chi2: 1.2 } })).toBe("source.chi2");
    expect(field({ ...base, source: { ...SOURCE, distance_mpc: 0 } })).toBe("source.distance_mpc");
    expect(field({ ...base, source: { m1: 30, m2: 20, frame: "source", z: -1 } })).toBe("source.z");
    expect(field({ ...base, networks: [[0, 3]] })).toBe("networks.0.1");
    expect(field({ ...base, priors: { chi_s: -1 } })).toBe("priors.chi_s");
    expect(field(base)).toBeNull();
  });

  it("when results come back, then no number is NaN or infinite (JSON cannot carry them)", () => {
    const r = runForecast({ ...base, detectors: [{ curve: "aligo-design" }, { curve: "lisa" }], networks: [[0], [1], [0, 1]], b: [-13, -7, 0, 2.9, 3, 3.1, 6] });
    const numbers: number[] = [];
    JSON.stringify(r, (_, v) => {
      if (typeof v === "number") numbers.push(v);
      return v;
    });
    expect(numbers.every(Number.isFinite)).toBe(true);
  });
});
