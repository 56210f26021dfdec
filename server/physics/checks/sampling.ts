import type { SymbolTable } from "../expr/symbols.ts";

/** Small deterministic PRNG (mulberry32): checks must give the same verdict on every run. */
export function createRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const uniform = (rng: () => number, lo: number, hi: number): number => lo + (hi - lo) * rng();

/** Length scale that sets the size of a coupling of dimension d: a coupling is small against m^d. */
const COUPLING_LENGTH = 10;

/**
 * One random point in the physical region: masses 1-100 (m1 >= m2, never equal), spins in
 * (-0.9, 0.9), charges in (0.1, 1), sensitivities in (0.05, 0.5), z in (0.01, 2), Omega_m in (0.2, 0.4), distances
 * 1e3-1e4, and couplings small and
 * positive (0.01-0.1 times COUPLING_LENGTH^dimension).
 */
export function samplePoint(args: readonly string[], table: SymbolTable, rng: () => number): Float64Array {
  const a = uniform(rng, 1, 100);
  const b = uniform(rng, 1, 100);
  const m1 = Math.max(a, b);
  const m2 = Math.min(a, b) * (Math.abs(a - b) < 0.5 ? 0.8 : 1);
  const out = new Float64Array(args.length);
  args.forEach((name, k) => {
    const info = table.get(name);
    let v: number;
    switch (name) {
      case "m1":
        v = m1;
        break;
      case "m2":
        v = m2;
        break;
      case "chi1":
      case "chi2":
        v = uniform(rng, -0.9, 0.9);
        break;
      case "s1":
      case "s2":
        v = uniform(rng, 0.1, 1);
        break;
      case "sigma1":
      case "sigma2":
        v = uniform(rng, 0.05, 0.5);
        break;
      case "z":
        v = uniform(rng, 0.01, 2);
        break;
      case "Omega_m":
        v = uniform(rng, 0.2, 0.4);
        break;
      case "M_f":
        v = 0.95 * (m1 + m2);
        break;
      case "chi_f":
        v = uniform(rng, 0.3, 0.9);
        break;
      case "D":
      case "D_0":
      case "D_alpha":
        v = uniform(rng, 1e3, 1e4);
        break;
      default:
        v = uniform(rng, 0.01, 0.1) * COUPLING_LENGTH ** (info?.dimension ?? 0);
    }
    out[k] = v;
  });
  return out;
}

/** Rescales a point: every symbol of dimension d is multiplied by lambda^d. */
export function scalePoint(point: Float64Array, dims: readonly number[], lambda: number): Float64Array {
  const out = new Float64Array(point.length);
  for (let k = 0; k < point.length; k += 1) out[k] = (point[k] as number) * lambda ** (dims[k] as number);
  return out;
}

/** Short "m1 = 37.2, m2 = 11.1" description of a point for messages. */
export function describePoint(args: readonly string[], point: Float64Array): string {
  return args.map((a, k) => `${a} = ${Number((point[k] as number).toPrecision(4))}`).join(", ");
}
