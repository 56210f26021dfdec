import h5wasm from "h5wasm/node";

/**
 * Synthetic posteriors for the samples-job tests: a seeded generator (mulberry32 + Box-Muller), so
 * every run draws the same samples and no assertion depends on luck.
 */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function gaussian(seed: number, n: number, mean: number, sd: number): Float64Array {
  const u = rng(seed);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i += 2) {
    const r = Math.sqrt(-2 * Math.log(1 - u()));
    const th = 2 * Math.PI * u();
    out[i] = mean + sd * r * Math.cos(th);
    if (i + 1 < n) out[i + 1] = mean + sd * r * Math.sin(th);
  }
  return out;
}

export function toCsv(columns: Record<string, ArrayLike<number>>, delimiter = ","): string {
  const names = Object.keys(columns);
  const n = columns[names[0]!]!.length;
  const lines = [names.join(delimiter)];
  for (let i = 0; i < n; i++) lines.push(names.map((k) => String(columns[k]![i])).join(delimiter));
  return `${lines.join("\n")}\n`;
}

/** An HDF5 file with one group of 1-D float64 datasets, written with h5wasm. */
export async function writeHdf5(path: string, group: string, columns: Record<string, Float64Array>): Promise<void> {
  await h5wasm.ready;
  const f = new h5wasm.File(path, "w");
  try {
    const g = f.create_group(group);
    for (const [name, data] of Object.entries(columns)) g.create_dataset({ name, data });
  } finally {
    f.close();
  }
}

export const filled = (n: number, v: number) => new Float64Array(n).fill(v);
