// Run with: npx tsx bench/physics-check.bench.ts
// Prints timings and ratios against baselines measured in the same run; nothing here asserts.
import { execFileSync } from "node:child_process";
import nerdamer from "nerdamer";
import "nerdamer/Algebra.js";
import { checkMapping } from "../server/physics/checks/check-mapping.ts";
import type { MappingInput } from "../server/physics/checks/types.ts";
import { compileVectorized } from "../server/physics/expr/compile.ts";
import { closeSymbolicPool, getSymbolicPool } from "../server/physics/expr/pool.ts";
import { createSymbolTable, expandDefinitions } from "../server/physics/expr/symbols.ts";

const EDGB: MappingInput = {
  expression: "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))",
  target: "ppe_phase",
  b: -7,
  pn_order: -1,
  couplings: [{ symbol: "alpha", dimension: 2 }],
  definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }],
};
const WITH_DERIVATION: MappingInput = {
  ...EDGB,
  derivation: { flux: { order: -1, coefficient: "(5/96)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^4)" } },
};

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] as number;
};

async function timeCheck(input: MappingInput, runs: number): Promise<number> {
  const times: number[] = [];
  for (let k = 0; k < runs; k += 1) {
    const t0 = performance.now();
    const r = await checkMapping(input);
    times.push(performance.now() - t0);
    if (!r.ok) throw new Error(`EdGB mapping failed a check: ${JSON.stringify(r.checks)}`);
  }
  return median(times);
}

function samples(n: number): Float64Array[] {
  let seed = 987654321;
  const rand = (): number => {
    seed = (seed * 48271) % 2147483647;
    return seed / 2147483647;
  };
  const m1 = new Float64Array(n);
  const m2 = new Float64Array(n);
  const s1 = new Float64Array(n);
  const s2 = new Float64Array(n);
  const alpha = new Float64Array(n);
  for (let i = 0; i < n; i += 1) {
    const a = 1 + 99 * rand();
    const b = 1 + 99 * rand();
    m1[i] = Math.max(a, b);
    m2[i] = Math.min(a, b);
    s1[i] = rand();
    s2[i] = rand();
    alpha[i] = 0.1 + 10 * rand();
  }
  return [m1, m2, s1, s2, alpha];
}

async function main(): Promise<void> {
  const pool = getSymbolicPool();
  await pool.warm();

  // 1. Full checkMapping of the EdGB mapping.
  await timeCheck(WITH_DERIVATION, 5);
  const plain = await timeCheck(EDGB, 101);
  const derived = await timeCheck(WITH_DERIVATION, 51);
  console.log(`checkMapping EdGB (parse, symbols, dimension, gr_limit, pn_order): median ${plain.toFixed(2)} ms  (goal < 50 ms)`);
  console.log(`checkMapping EdGB + derivation from the dipole flux (CAS in worker): median ${derived.toFixed(2)} ms  (goal < 50 ms)`);

  // 2. Vectorized evaluation against per-sample nerdamer.
  const table = createSymbolTable({ couplings: EDGB.couplings, definitions: EDGB.definitions ?? [] });
  const expanded = expandDefinitions(EDGB.expression, table);
  const args = ["m1", "m2", "s1", "s2", "alpha"];
  const n = 1_000_000;
  const columns = samples(n);
  const f = compileVectorized(expanded, args);
  const out = new Float64Array(n);
  f(columns, out); // warm-up (JIT)
  const vecTimes: number[] = [];
  for (let k = 0; k < 7; k += 1) {
    const t0 = performance.now();
    f(columns, out);
    vecTimes.push(performance.now() - t0);
  }
  const vec = median(vecTimes);
  console.log(`compileVectorized EdGB beta, 1e6 samples: median ${vec.toFixed(1)} ms (${((vec * 1e6) / n).toFixed(1)} ns/sample)`);

  const calls = 2000;
  const t0 = performance.now();
  let sink = 0;
  for (let i = 0; i < calls; i += 1) {
    const scope: Record<string, string> = {};
    args.forEach((a, k) => {
      scope[a] = String((columns[k] as Float64Array)[i]);
    });
    // "numer" mode: the chained .evaluate() returns 0 for this expression on nerdamer 1.1.13.
    sink += Number(nerdamer(expanded, scope, "numer").text("decimals"));
  }
  const perCall = (performance.now() - t0) / calls;
  const nerdamerMillion = perCall * n;
  if (!Number.isFinite(sink)) console.log("(nerdamer produced a non-finite value)");
  console.log(`nerdamer per-sample evaluation: ${perCall.toFixed(3)} ms/sample -> ${(nerdamerMillion / 1000).toFixed(0)} s extrapolated for 1e6`);
  console.log(`speed-up over nerdamer: ${(nerdamerMillion / vec).toFixed(0)}x  (goal >= 100x)`);

  // 3. numpy on the same formula, same sample count, when available.
  let hasNumpy = false;
  try {
    execFileSync("python3", ["-c", "import numpy"], { stdio: "ignore" });
    hasNumpy = true;
  } catch {
    console.log("numpy not available: skipping the numpy comparison");
  }
  if (hasNumpy) {
    const script = `
import numpy as np, time
rng = np.random.default_rng(1)
n = ${n}
a = 1 + 99*rng.random(n); b = 1 + 99*rng.random(n)
m1 = np.maximum(a, b); m2 = np.minimum(a, b)
s1 = rng.random(n); s2 = rng.random(n); alpha = 0.1 + 10*rng.random(n)
def beta():
    M = m1 + m2
    eta = m1*m2/M**2
    zeta = 16*np.pi*alpha**2/M**4
    return -(5/7168)*zeta*(m1**2*s2 - m2**2*s1)**2/(M**4*eta**(18/5))
beta()
ts = []
for _ in range(7):
    t = time.perf_counter(); beta(); ts.append(time.perf_counter() - t)
print(sorted(ts)[3]*1000)
`;
    const numpyMs = Number(execFileSync("python3", ["-c", script], { encoding: "utf8" }).trim());
    console.log(`numpy, same formula, 1e6 samples: median ${numpyMs.toFixed(1)} ms`);
    console.log(`compileVectorized / numpy time: ${(vec / numpyMs).toFixed(2)}  (goal <= 1.5)`);
  }
  await closeSymbolicPool();
}

await main();
