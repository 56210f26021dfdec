/**
 * Weighted statistics over samples held in typed arrays (docs/samples-jobs.md, steps 4-5).
 */

/** (sum w)^2 / sum w^2: the number of equally weighted samples with the same variance. */
export function effectiveSampleSize(w: Float64Array): number {
  let s = 0;
  let s2 = 0;
  for (let i = 0; i < w.length; i++) {
    const v = w[i]!;
    s += v;
    s2 += v * v;
  }
  return s2 > 0 ? (s * s) / s2 : 0;
}

/**
 * Weighted quantiles of x. The weighted CDF at the j-th smallest value is C_j = sum_{i<=j} w_(i) / W;
 * the q-quantile lies between x_(j-1) and x_(j) where C_(j-1) < q <= C_j, interpolated linearly in C.
 * Sorting pairs (x, w) by x is what costs; instead the x values are sorted alone (a typed-array sort)
 * and the crossing index is found by bisection over them, one O(n) weight sum per step.
 * `sorted` is x sorted ascending; `w` null means equal weights.
 */
export function weightedQuantiles(x: Float64Array, w: Float64Array | null, sorted: Float64Array, qs: readonly number[]): number[] {
  const n = x.length;
  if (n === 0) return qs.map(() => Number.NaN);
  let total = 0;
  if (w) for (let i = 0; i < n; i++) total += w[i]!;
  else total = n;
  // Weight of samples with x <= t (and the part strictly below, for ties).
  const below = (t: number, strict: boolean): number => {
    if (!w) {
      // Equal weights: count by bisection on the sorted array.
      let lo = 0;
      let hi = n;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (strict ? sorted[mid]! < t : sorted[mid]! <= t) lo = mid + 1;
        else hi = mid;
      }
      return lo;
    }
    let s = 0;
    if (strict) {
      for (let i = 0; i < n; i++) if (x[i]! < t) s += w[i]!;
    } else for (let i = 0; i < n; i++) if (x[i]! <= t) s += w[i]!;
    return s;
  };
  return qs.map((q) => {
    const target = q * total;
    // Smallest index j with C(x_(j)) >= target.
    let lo = 0;
    let hi = n - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (below(sorted[mid]!, false) >= target) hi = mid;
      else lo = mid + 1;
    }
    const xj = sorted[lo]!;
    const cj = below(xj, false);
    const cPrevAll = below(xj, true);
    if (lo === 0 || cPrevAll <= 0) return xj;
    // Previous distinct value and its cumulative weight.
    let k = lo - 1;
    while (k > 0 && sorted[k] === xj) k--;
    const xPrev = sorted[k]!;
    if (xPrev === xj) return xj;
    const cPrev = cPrevAll;
    const frac = cj > cPrev ? (target - cPrev) / (cj - cPrev) : 1;
    return xPrev + Math.min(1, Math.max(0, frac)) * (xj - xPrev);
  });
}

export interface Histogram {
  scale: "log" | "linear";
  edges: number[];
  /** Weighted fraction of the posterior in each bin (sums to 1). */
  mass: number[];
}

export function weightedHistogram(values: Float64Array, w: Float64Array | null, bins: number, scale: "log" | "linear"): Histogram {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (!Number.isFinite(v) || (scale === "log" && v <= 0)) continue;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (!Number.isFinite(min)) return { scale, edges: [], mass: [] };
  const tr = scale === "log" ? Math.log10 : (v: number) => v;
  let a = tr(min);
  let b = tr(max);
  if (b - a < 1e-12 * Math.max(1, Math.abs(a))) {
    a -= 0.5;
    b += 0.5;
  }
  const mass = new Array<number>(bins).fill(0);
  let total = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (!Number.isFinite(v) || (scale === "log" && v <= 0)) continue;
    const wi = w ? w[i]! : 1;
    const j = Math.min(bins - 1, Math.max(0, Math.floor(((tr(v) - a) / (b - a)) * bins)));
    mass[j]! += wi;
    total += wi;
  }
  const edges = Array.from({ length: bins + 1 }, (_, i) => (scale === "log" ? 10 ** (a + ((b - a) * i) / bins) : a + ((b - a) * i) / bins));
  return { scale, edges, mass: mass.map((m) => (total > 0 ? m / total : 0)) };
}
