import { distanceAlphaKm, luminosityDistanceMpc, type Cosmology } from "../cosmology.ts";

/**
 * Distances for millions of samples: each integral is computed on a table of redshifts once and
 * interpolated linearly (cubic behaviour of D over a step of zmax/4096 keeps the relative error
 * below 1e-6; tests compare with the direct integral).
 */
const POINTS = 4096;

function table(zmax: number, f: (z: number) => number): { step: number; values: Float64Array } {
  const step = zmax / (POINTS - 1);
  const values = new Float64Array(POINTS);
  for (let i = 0; i < POINTS; i++) values[i] = f(i * step);
  return { step, values };
}

function interpolate(t: { step: number; values: Float64Array }, z: number): number {
  const u = z / t.step;
  const i = Math.min(POINTS - 2, Math.floor(u));
  const f = u - i;
  return t.values[i]! + f * (t.values[i + 1]! - t.values[i]!);
}

/** D_alpha(z_i) in km for every sample (the distance measure of a propagation mapping). */
export function distanceAlphaColumn(z: Float64Array, alphaMd: number, cosmology: Cosmology): Float64Array {
  let zmax = 0;
  for (let i = 0; i < z.length; i++) if (z[i]! > zmax) zmax = z[i]!;
  const out = new Float64Array(z.length);
  if (zmax === 0) return out;
  const t = table(zmax * 1.0001, (x) => (x === 0 ? 0 : distanceAlphaKm(x, alphaMd, cosmology)));
  for (let i = 0; i < z.length; i++) out[i] = interpolate(t, z[i]!);
  return out;
}

/** z for every luminosity distance (Mpc), by inverting a table of D_L(z) (increasing in z). */
export function redshiftColumn(dl: Float64Array, cosmology: Cosmology): Float64Array {
  let dmax = 0;
  for (let i = 0; i < dl.length; i++) if (dl[i]! > dmax) dmax = dl[i]!;
  const out = new Float64Array(dl.length);
  if (dmax === 0) return out;
  let zmax = 0.01;
  while (luminosityDistanceMpc(zmax, cosmology) < dmax) zmax *= 2;
  const t = table(zmax, (x) => luminosityDistanceMpc(x, cosmology));
  const v = t.values;
  for (let i = 0; i < dl.length; i++) {
    const d = dl[i]!;
    let lo = 0;
    let hi = POINTS - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (v[mid]! <= d) lo = mid;
      else hi = mid;
    }
    const f = v[hi]! > v[lo]! ? (d - v[lo]!) / (v[hi]! - v[lo]!) : 0;
    out[i] = (lo + f) * t.step;
  }
  return out;
}
