/**
 * Sample-by-sample inversion of a mapping that is not a power law in its coupling: for every sample,
 * the x with F(x; binary_i) = beta_i, found on typed arrays with the vectorised evaluator (one
 * evaluation over all samples per step). F must be monotonic in x over the coupling's declared range
 * for every sample's binary; otherwise a bound on beta does not translate into one on x.
 *
 * 1. Scan: |x| on a grid every 2.5 decades from 1e-60 to 1e60 (and its mirror for couplings of either
 *    sign): each sample's values must keep one direction (monotonic), and the grid cell where F crosses
 *    beta_i is the sample's bracket. A wiggle narrower than 2.5 decades can go unseen.
 * 2. Bisection in the bracket, 64 steps for all samples at once (geometric within one sign, arithmetic
 *    across zero): x_i to about 1e-15 relative.
 * 3. |dF/dx| at x_i by a central difference (step 1e-6 |x_i|), for the prior weights.
 */

export interface ColumnInversion {
  /** Root per sample (NaN when the sample has none). */
  x: Float64Array;
  /** |dF/dx| at the root. */
  slope: Float64Array;
  /** 1 where beta_i lies outside the values F takes over the range (the sample is unreachable). */
  unreachable: Uint8Array;
  /** Where the theory's GR limit lies: |F| smallest at x -> 0 (upper bound) or at |x| -> infinity (lower bound). */
  grEnd: "zero" | "infinity";
}

export class NotMonotonicError extends Error {
  constructor(
    readonly row: number,
    readonly between: [number, number],
  ) {
    super(`not monotonic for row ${row}`);
  }
}

const DECADES = Array.from({ length: 49 }, (_, k) => 10 ** (-60 + 2.5 * k));
const BISECTION_STEPS = 64;

/** The scan's grid of the coupling, ascending: positive, or both signs (NotMonotonicError.between are two neighbours of it). */
export function scanGrid(eitherSign: boolean): number[] {
  return eitherSign ? [...DECADES.map((v) => -v).reverse(), ...DECADES] : DECADES;
}

/**
 * `evaluate(xs, out)` must return F at x = xs[i] for sample i (a vectorised evaluator with the coupling's
 * column set to xs). Samples with skip[i] = 1 are left alone.
 */
export function invertColumns(evaluate: (xs: Float64Array, out: Float64Array) => Float64Array, beta: Float64Array, skip: Uint8Array, eitherSign: boolean): ColumnInversion {
  const n = beta.length;
  const grid = scanGrid(eitherSign);
  const xs = new Float64Array(n);
  const out = new Float64Array(n);
  const prev = new Float64Array(n).fill(Number.NaN);
  const prevX = new Float64Array(n).fill(Number.NaN);
  const dir = new Int8Array(n);
  const lo = new Float64Array(n).fill(Number.NaN);
  const hi = new Float64Array(n).fill(Number.NaN);
  const flo = new Float64Array(n);
  const firstAbs = new Float64Array(n).fill(Number.NaN);
  const lastAbs = new Float64Array(n).fill(Number.NaN);
  for (const g of grid) {
    xs.fill(g);
    const v = evaluate(xs, out);
    for (let i = 0; i < n; i++) {
      if (skip[i]) continue;
      const f = v[i]!;
      if (!Number.isFinite(f)) continue;
      if (Number.isNaN(firstAbs[i]!) && Math.abs(g) === DECADES[0]!) firstAbs[i] = Math.abs(f);
      if (Math.abs(g) === DECADES[DECADES.length - 1]!) lastAbs[i] = Math.max(Number.isNaN(lastAbs[i]!) ? 0 : lastAbs[i]!, Math.abs(f));
      const p = prev[i]!;
      if (!Number.isNaN(p)) {
        const slack = 1e-12 * Math.max(Math.abs(p), Math.abs(f));
        const d = f > p + slack ? 1 : f < p - slack ? -1 : 0;
        if (d !== 0) {
          if (dir[i] !== 0 && dir[i] !== d) throw new NotMonotonicError(i, [prevX[i]!, g]);
          dir[i] = d;
        }
        const b = beta[i]!;
        if (Number.isNaN(lo[i]!) && (p - b) * (f - b) <= 0 && p !== f) {
          lo[i] = prevX[i]!;
          hi[i] = g;
          flo[i] = p - b;
        }
      }
      prev[i] = f;
      prevX[i] = g;
    }
  }
  // Bisection, all bracketed samples at once.
  const a = lo;
  const b = hi;
  const mid = new Float64Array(n);
  for (let step = 0; step < BISECTION_STEPS; step++) {
    for (let i = 0; i < n; i++) {
      const ai = a[i]!;
      const bi = b[i]!;
      mid[i] = Number.isNaN(ai) ? 1 : ai > 0 && bi > 0 ? Math.sqrt(ai * bi) : ai < 0 && bi < 0 ? -Math.sqrt(ai * bi) : (ai + bi) / 2;
    }
    const v = evaluate(mid, out);
    for (let i = 0; i < n; i++) {
      if (Number.isNaN(a[i]!)) continue;
      const fm = v[i]! - beta[i]!;
      if (fm === 0) {
        a[i] = mid[i]!;
        b[i] = mid[i]!;
      } else if (fm > 0 === flo[i]! > 0) {
        a[i] = mid[i]!;
        flo[i] = fm;
      } else b[i] = mid[i]!;
    }
  }
  const x = new Float64Array(n);
  const unreachable = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (skip[i]) continue;
    if (Number.isNaN(a[i]!)) {
      x[i] = Number.NaN;
      unreachable[i] = 1;
    } else x[i] = (a[i]! + b[i]!) / 2;
  }
  // |dF/dx| by a central difference.
  const plus = Float64Array.from(x, (v) => (Number.isNaN(v) ? 1 : v + stepOf(v)));
  const fPlus = Float64Array.from(evaluate(plus, out));
  const minus = Float64Array.from(x, (v) => (Number.isNaN(v) ? 1 : v - stepOf(v)));
  const fMinus = evaluate(minus, out);
  const slope = new Float64Array(n);
  for (let i = 0; i < n; i++) slope[i] = Number.isNaN(x[i]!) ? Number.NaN : Math.abs(fPlus[i]! - fMinus[i]!) / (plus[i]! - minus[i]!);
  let first = 0;
  while (first < n && (skip[first] || Number.isNaN(firstAbs[first]!) || Number.isNaN(lastAbs[first]!))) first++;
  const grEnd = first < n && lastAbs[first]! < firstAbs[first]! ? "infinity" : "zero";
  return { x, slope, unreachable, grEnd };
}

function stepOf(v: number): number {
  return v === 0 ? 1e-9 : 1e-6 * Math.abs(v);
}
