// Run with: npx tsx bench/forecast.bench.ts (or npm run bench). Not a test: it prints medians and the
// ratio against a numpy implementation of the same Fisher computation measured in the same run.
//
// What is timed: one full forecast (aLIGO design, LISA and both together; 15 values of b; default
// priors; 10 000 grid points per detector) by server/physics/forecast/forecast.ts, i.e. the work the
// worker thread does for POST /api/v1/forecasts, against bench/forecast_numpy.py doing the same
// arithmetic with numpy (vectorised over the grid). The bench also checks that both give the same
// sigma_beta, so the comparison is of the same computation.
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { amplitudeWeight } from "../server/physics/forecast/amplitude.ts";
import { DEFAULT_GRID_POINTS, DEFAULT_PRIORS, runForecast, type ForecastInput } from "../server/physics/forecast/forecast.ts";
import { phaseModel } from "../server/physics/forecast/phase.ts";
import { MEGAPARSEC_M, SOLAR_MASS_TIME_S, SPEED_OF_LIGHT_M_S } from "../server/physics/units.ts";

const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const RUNS = 30;
const bs = Array.from({ length: 15 }, (_, i) => -13 + i);

const input: ForecastInput = {
  source: { m1: 36, m2: 29, chi1: 0.3, chi2: -0.1, frame: "source", distance_mpc: 410, z: 0.09 },
  detectors: [{ curve: "aligo-design" }, { curve: "lisa" }],
  networks: [[0], [1], [0, 1]],
  b: bs,
};

for (let i = 0; i < 5; i++) runForecast(input);
const samples: number[] = [];
let result = runForecast(input);
for (let i = 0; i < RUNS; i++) {
  const t0 = process.hrtime.bigint();
  result = runForecast(input);
  samples.push(Number(process.hrtime.bigint() - t0) / 1e6);
}
const ours = median(samples);

// The same job for numpy: the bands the engine chose, the amplitude weights and the phase coefficients.
const z = 0.09;
const M = 65;
const eta = (36 * 29) / (M * M);
const mcZ = eta ** 0.6 * M * (1 + z) * SOLAR_MASS_TIME_S;
const model = phaseModel(mcZ, { eta, chi_s: 0.1, chi_a: 0.2 });
const distance = (410 * MEGAPARSEC_M) / SPEED_OF_LIGHT_M_S;
const job = {
  runs: RUNS,
  points: DEFAULT_GRID_POINTS,
  mc_z: mcZ,
  E: model.E.map((d) => [d.v, d.d0, d.d1, d.d2]),
  D: model.D.map((d) => [d.v, d.d0, d.d1, d.d2]),
  detectors: result.detectors.map((d) => ({
    curve: d.curve,
    f_low: d.f_low,
    f_high: d.f_high,
    years: d.years_observed ?? 4,
    amplitude2: amplitudeWeight(d.convention, d.orientation, mcZ, distance),
  })),
  b: bs,
  networks: input.networks,
  priors: DEFAULT_PRIORS,
};
const script = fileURLToPath(new URL("./forecast_numpy.py", import.meta.url));
const py = spawnSync("python3", [script], { input: JSON.stringify(job), encoding: "utf8", maxBuffer: 1 << 24 });
process.stdout.write(`  forecast: 3 networks x 15 b, 2 detectors, ${DEFAULT_GRID_POINTS} points each\n`);
process.stdout.write(`  TypeScript (server/physics/forecast)          median ${ours.toFixed(2)} ms  (${RUNS} runs)\n`);
if (py.status !== 0) {
  process.stdout.write(`  numpy baseline did not run: ${(py.stderr || py.error?.message || "").trim().split("\n").pop()}\n`);
} else {
  const baseline = JSON.parse(py.stdout) as { median_ms: number; sigma: (number | null)[][]; numpy: string };
  let worst = 0;
  result.networks.forEach((n, ni) =>
    n.rows.forEach((r, bi) => {
      const other = baseline.sigma[ni]![bi];
      if (r.status === "ok" && r.sigma_beta !== null && other !== null && other !== undefined) worst = Math.max(worst, Math.abs(r.sigma_beta / other - 1));
    }),
  );
  process.stdout.write(`  numpy ${baseline.numpy} (bench/forecast_numpy.py)             median ${baseline.median_ms.toFixed(2)} ms  (${RUNS} runs)\n`);
  process.stdout.write(`  largest relative difference in sigma_beta (well-conditioned rows): ${worst.toExponential(1)}\n`);
  process.stdout.write(`  ratio TypeScript / numpy: ${(ours / baseline.median_ms).toFixed(2)}  (goal <= 2)\n`);
}
