import { describe, expect, it } from "vitest";
import { DEFAULT_PRIORS, runForecast, type Coalescence, type ForecastInput } from "../../server/physics/forecast/forecast.ts";
import { invertFisher } from "../../server/physics/forecast/linalg.ts";
import { BETA_INDEX, N_PARAMS } from "../../server/physics/forecast/phase.ts";

/**
 * A separate coalescence phase (and time) per detector, for detectors that are not phase-coherent
 * (common practice for a space and a ground detector observing years apart).
 *
 * Why it can only loosen the bound (derived): the shared model is the separate model restricted to the
 * subspace phi_c^(1) = phi_c^(2) = ... (and the same for t_c). Its Fisher matrix is J^T F J with J the
 * embedding of that subspace, so for any direction the shared model's information on beta, after
 * marginalising the other parameters, is at least the separate model's (Cramer-Rao: marginalising over
 * more parameters never shrinks a marginal variance). sigma_beta(separate) >= sigma_beta(shared).
 * This needs the priors to agree on that subspace: the phi_c prior sits on the first detector's phase
 * only, the other phases are free. (A Gaussian prior on every copy would count the prior once per
 * detector and can tighten the bound: with aLIGO design + ET-B it did, by about 10 %; our own computation.)
 */

const SOURCE = { m1: 36, m2: 29, chi1: 0.2, chi2: -0.1, frame: "source" as const, distance_mpc: 410, z: 0.09 };
const BS = [-13, -9, -7, -5, -3, -1, 1, 2, 4, 6];
const NETWORKS: [string, ForecastInput["detectors"]][] = [
  ["LISA + aLIGO design (multi-band)", [{ curve: "lisa" }, { curve: "aligo-design" }]],
  ["aLIGO design + ET-B", [{ curve: "aligo-design" }, { curve: "et-b" }]],
  ["TianQin + LISA + ET-B", [{ curve: "tianqin" }, { curve: "lisa" }, { curve: "et-b" }]],
];

function run(detectors: ForecastInput["detectors"], coalescence: Coalescence, extra: Partial<ForecastInput> = {}) {
  return runForecast({ source: SOURCE, detectors, networks: [detectors.map((_, i) => i), [0]], b: BS, coalescence, ...extra });
}

describe("per-detector coalescence phase and time", () => {
  const PRIORS: [string, ForecastInput["priors"]][] = [
    ["default priors", undefined],
    ["no priors", { phi_c: null, chi_s: null, chi_a: null }],
  ];
  for (const [label, detectors] of NETWORKS) for (const [priorLabel, priors] of PRIORS) {
    it(`when ${label} (${priorLabel}) is given separate phi_c (then also t_c) per detector, then sigma_beta never shrinks at any b (derived above)`, () => {
      const shared = run(detectors, "shared", { priors }).networks[0]!.rows;
      const phase = run(detectors, "phi_c_per_detector", { priors }).networks[0]!.rows;
      const both = run(detectors, "phi_c_t_c_per_detector", { priors }).networks[0]!.rows;
      let compared = 0;
      BS.forEach((b, i) => {
        const [s, p, t] = [shared[i]!, phase[i]!, both[i]!];
        if (s.sigma_beta === null) return;
        expect(p.sigma_beta, `b = ${b}`).not.toBeNull();
        expect(p.sigma_beta! / s.sigma_beta, `b = ${b}: phi_c per detector`).toBeGreaterThanOrEqual(1 - 1e-9);
        if (t.sigma_beta !== null) expect(t.sigma_beta / p.sigma_beta!, `b = ${b}: t_c per detector as well`).toBeGreaterThanOrEqual(1 - 1e-9);
        compared++;
      });
      expect(compared).toBeGreaterThanOrEqual(6);
    });
  }

  it("when the network has one detector, then the option changes nothing (there is no second phase to free)", () => {
    const detectors = NETWORKS[0]![1];
    const shared = run(detectors, "shared").networks[1]!.rows;
    const both = run(detectors, "phi_c_t_c_per_detector").networks[1]!.rows;
    shared.forEach((r, i) => expect(both[i]!.sigma_beta).toBe(r.sigma_beta));
  });

  it("when the separate matrix is assembled by hand from the per-detector matrices, then runForecast's sigma_beta matches it (checks where each copy of phi_c and t_c lands)", () => {
    const detectors = NETWORKS[0]![1];
    const r = run(detectors, "phi_c_t_c_per_detector", { include_matrices: true, b: [-7] });
    const [g0, g1] = r.matrices![0]!.per_detector as [number[][], number[][]];
    // parameters: the eight shared ones (detector 0's phi_c, t_c), then phi_c and t_c of detector 1
    const map1 = (p: number) => (p === 1 ? 8 : p === 2 ? 9 : p);
    const size = N_PARAMS + 2;
    const gamma = Array.from({ length: size }, () => new Array<number>(size).fill(0));
    for (let a = 0; a < N_PARAMS; a++) {
      for (let c = 0; c < N_PARAMS; c++) {
        gamma[a]![c]! += g0[a]![c]!;
        gamma[map1(a)]![map1(c)]! += g1[a]![c]!;
      }
    }
    gamma[1]![1]! += 1 / DEFAULT_PRIORS.phi_c! ** 2; // the first detector's phase only
    gamma[5]![5]! += 1 / DEFAULT_PRIORS.chi_s! ** 2;
    gamma[6]![6]! += 1 / DEFAULT_PRIORS.chi_a! ** 2;
    const inv = invertFisher(gamma, Array.from({ length: size }, (_, i) => `p${i}`));
    const sigma = Math.sqrt(inv.covariance![BETA_INDEX]![BETA_INDEX]!);
    expect(r.networks[0]!.rows[0]!.sigma_beta! / sigma - 1).toBeCloseTo(0, 10);
    expect(r.coalescence).toBe("phi_c_t_c_per_detector");
    expect(r.networks[0]!.cautions.join(" ")).toMatch(/own coalescence phase and time/);
  });

  it("when b = 0 with a phase per detector, then it is still no constraint (beta u^0 is a constant phase, as phi_c)", () => {
    const r = runForecast({ source: SOURCE, detectors: NETWORKS[0]![1], networks: [[0, 1]], b: [0], coalescence: "phi_c_per_detector" });
    expect(r.networks[0]!.rows[0]!.status).toBe("no_constraint");
  });
});
