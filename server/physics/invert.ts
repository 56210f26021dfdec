/**
 * Inverting |F(x)| = target for a coupling x > 0: closed form when F is a power law in x, a
 * bracketed root on a logarithmic scale otherwise.
 */

export interface PowerLaw {
  /** |F(x)| = prefactor * x^power. */
  readonly power: number;
  /** |F(1)|, in the canonical unit of the coupling. */
  readonly prefactor: number;
  /** Sign of F (constant for a power law). */
  readonly sign: 1 | -1;
}

/** Scale-free probes: a power law must hold over twelve decades around the canonical unit. */
const PROBES = [1e-6, 1e-4, 1e-2, 1, 1e2, 1e4, 1e6] as const;

/**
 * Detects F(x) = C x^p numerically: the log-log slope between neighbouring probes must agree to
 * `tolerance` (relative to max(1, |p|)). Returns null otherwise, or when F vanishes or changes sign.
 * The caller must still check the answer at the limit it computes, because a function can look
 * like a power law over the probes and bend beyond them.
 */
export function detectPowerLaw(f: (x: number) => number, tolerance = 1e-9): PowerLaw | null {
  const values = PROBES.map(f);
  const first = values[0]!;
  if (!Number.isFinite(first) || first === 0) return null;
  const sign = first > 0 ? 1 : -1;
  const logs: number[] = [];
  for (const v of values) {
    if (!Number.isFinite(v) || v === 0 || (v > 0 ? 1 : -1) !== sign) return null;
    logs.push(Math.log(Math.abs(v)));
  }
  const slopes: number[] = [];
  for (let i = 1; i < PROBES.length; i++) {
    slopes.push((logs[i]! - logs[i - 1]!) / Math.log(PROBES[i]! / PROBES[i - 1]!));
  }
  const p = slopes.reduce((a, s) => a + s, 0) / slopes.length;
  const scale = Math.max(1, Math.abs(p));
  if (slopes.some((s) => Math.abs(s - p) > tolerance * scale)) return null;
  return { power: snapRational(p), prefactor: Math.abs(f(1)), sign };
}

/** Rounds p to a nearby fraction with a small denominator (2 -> 2, 1.9999999999 -> 2, 0.5 -> 1/2). */
export function snapRational(p: number, tolerance = 1e-9): number {
  for (let d = 1; d <= 12; d++) {
    const n = Math.round(p * d);
    if (Math.abs(p - n / d) <= tolerance * Math.max(1, Math.abs(p))) return n / d;
  }
  return p;
}

/** A fraction "n/d" for x when one with d <= 12 matches, else a decimal string. */
export function fractionString(x: number): string {
  for (let d = 1; d <= 12; d++) {
    const n = Math.round(x * d);
    if (Math.abs(x - n / d) <= 1e-9 * Math.max(1, Math.abs(x))) return d === 1 ? String(n) : `${n}/${d}`;
  }
  return x.toPrecision(6);
}

/**
 * Brent's method for a root of g in [a, b], with g(a) and g(b) of opposite signs (or one zero).
 * Converges to full double precision in t for smooth g.
 */
export function brent(g: (t: number) => number, a: number, b: number, maxIter = 200): number {
  let fa = g(a);
  let fb = g(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (fa > 0 === fb > 0) throw new RangeError("brent: the interval does not bracket a root");
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let i = 0; i < maxIter; i++) {
    if (fb > 0 === fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 1e-300;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      // Inverse quadratic interpolation, or the secant when only two points are distinct.
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = d;
      }
    } else {
      d = m;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = g(b);
  }
  return b;
}

export type MagnitudeRoot =
  | {
      readonly kind: "root";
      readonly x: number;
      /** upper: |F| <= target for x below the root (GR at x -> 0); lower: GR at x -> infinity. */
      readonly side: "upper" | "lower";
      readonly monotonic: boolean;
      readonly crossings: number;
    }
  | { readonly kind: "none"; readonly reason: string };

/**
 * Solves |F(x)| = target on x in [lo, hi] (both > 0), sampling every half decade (a wiggle
 * narrower than that can go unseen). The end where |F| is smaller is taken as the GR end; the
 * root reported is the crossing nearest to it, so the answer is the edge of the allowed region
 * that contains GR.
 */
export function solveMagnitude(f: (x: number) => number, target: number, lo = 1e-60, hi = 1e60): MagnitudeRoot {
  const tLo = Math.log(lo);
  const tHi = Math.log(hi);
  const n = Math.max(2, Math.ceil((Math.log10(hi) - Math.log10(lo)) * 2)) + 1;
  const ts: number[] = [];
  const hs: number[] = [];
  const logTarget = Math.log(target);
  const h = (t: number) => {
    const v = f(Math.exp(t));
    if (Number.isNaN(v)) throw new RangeError(`the mapping is not a number at coupling ${Math.exp(t)}`);
    // Clamp at the smallest double so an underflow to 0 stays a finite, very negative number.
    return Math.log(Math.max(Math.abs(v), Number.MIN_VALUE)) - logTarget;
  };
  for (let i = 0; i < n; i++) {
    const t = tLo + ((tHi - tLo) * i) / (n - 1);
    ts.push(t);
    hs.push(h(t));
  }
  let increasing = true;
  let decreasing = true;
  let crossings = 0;
  for (let i = 1; i < n; i++) {
    const prev = hs[i - 1]!;
    const cur = hs[i]!;
    const slack = 1e-12 * Math.max(1, Math.abs(prev));
    if (cur < prev - slack) increasing = false;
    if (cur > prev + slack) decreasing = false;
    if (prev < 0 !== cur < 0) crossings++;
  }
  const grAtLow = hs[0]! <= hs[n - 1]!;
  const order = grAtLow ? ts.map((_, i) => i) : ts.map((_, i) => n - 1 - i);
  const start = hs[order[0]!]!;
  if (start >= 0) {
    return { kind: "none", reason: "the bound excludes every coupling in the searched range (1e-60 to 1e60 in the canonical unit): either the mapping does not approach GR, or the bound or a mass is so extreme that the limit lies outside that range" };
  }
  for (let j = 1; j < n; j++) {
    const i0 = order[j - 1]!;
    const i1 = order[j]!;
    if (hs[i1]! >= 0) {
      const t = brent(h, ts[i0]!, ts[i1]!);
      return {
        kind: "root",
        x: Math.exp(t),
        side: grAtLow ? "upper" : "lower",
        monotonic: increasing || decreasing,
        crossings,
      };
    }
  }
  return {
    kind: "none",
    reason: `the bound allows every coupling between ${lo} and ${hi} (canonical units): this binary gives no constraint`,
  };
}
