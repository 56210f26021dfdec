/* eslint-disable no-loss-of-precision -- constants are written with the digits of their published source; rounding them to the nearest double is intended. */
/**
 * Flat Lambda-CDM distances for propagation effects.
 *
 * D_alpha(z) = ((1+z)^(1-alpha_md) / H0) int_0^z (1+z')^(alpha_md-2) / E(z') dz',
 * E(z) = sqrt(Omega_m (1+z)^3 + Omega_L), Omega_L = 1 - Omega_m (radiation neglected: below 1e-4
 * of E at the redshifts of compact-binary sources). D_0 is the distance measure of the massive
 * graviton phase (Will 1998, Phys. Rev. D 57, 2061); the general alpha_md form is that of
 * Mirshekari, Yunes & Will 2012 (Phys. Rev. D 85, 024041). With c restored, 1/H0 -> c/H0.
 */
import { DEFAULT_COSMOLOGY } from "../../common/convert.ts";
import { PhysicsInputError, requireFinite } from "./input-error.ts";
import { SPEED_OF_LIGHT_KM_S, mpcToKm } from "./units.ts";

export interface Cosmology {
  /** Hubble constant in km/s/Mpc. */
  readonly H0: number;
  /** Matter density today; flatness fixes Omega_L = 1 - Omega_m. */
  readonly Omega_m: number;
}

/**
 * Planck 2018 (TT,TE,EE+lowE+lensing+BAO) values, H0 = 67.66 km/s/Mpc, Omega_m = 0.3111.
 * Value from memory: an editor should confirm against Planck Collaboration 2020, A&A 641, A6,
 * Table 2. Every stored bound keeps the cosmology it was converted with, so a later correction
 * here does not silently change old results.
 */
// One source for the default: the API schema (common/convert.ts) and the translate form use the same numbers.
export const PLANCK_2018: Cosmology = Object.freeze({ H0: DEFAULT_COSMOLOGY.H0, Omega_m: DEFAULT_COSMOLOGY.Omega_m });

export function validateCosmology(cosmology: Cosmology): Cosmology {
  const H0 = requireFinite("cosmology.H0", cosmology.H0);
  const Omega_m = requireFinite("cosmology.Omega_m", cosmology.Omega_m);
  if (H0 <= 0) throw new PhysicsInputError("cosmology.H0", "cosmology.H0 must be positive (km/s/Mpc)");
  if (Omega_m < 0 || Omega_m > 1) {
    throw new PhysicsInputError("cosmology.Omega_m", "cosmology.Omega_m must lie in [0, 1] for a flat universe");
  }
  return { H0, Omega_m };
}

/** Hubble distance c / H0 in Mpc. */
export function hubbleDistanceMpc(cosmology: Cosmology = PLANCK_2018): number {
  return SPEED_OF_LIGHT_KM_S / cosmology.H0;
}

function hubbleRate(zp: number, cosmology: Cosmology): number {
  return Math.sqrt(cosmology.Omega_m * zp * zp * zp + (1 - cosmology.Omega_m));
}

// ---------------------------------------------------------------------------------------------
// Adaptive Gauss–Kronrod (7-point Gauss embedded in 15-point Kronrod). Node and weight values are
// the standard G7/K15 set; tests check the rule integrates polynomials to its design degree.

const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
  0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
  0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
] as const;
const WGK = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204,
  0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
  0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
] as const;
/** Gauss weights for nodes XGK[1], XGK[3], XGK[5] and the centre. */
const WG = [
  0.129484966168869693270611432679082, 0.27970539148927666790146777142378,
  0.381830050505118944950369775488975, 0.417959183673469387755102040816327,
] as const;

interface Panel {
  kronrod: number;
  error: number;
}

function gaussKronrod15(f: (x: number) => number, a: number, b: number): Panel {
  const centre = 0.5 * (a + b);
  const half = 0.5 * (b - a);
  const fc = f(centre);
  let kronrod = WGK[7] * fc;
  let gauss = WG[3] * fc;
  for (let i = 0; i < 7; i++) {
    const dx = half * XGK[i]!;
    const pair = f(centre - dx) + f(centre + dx);
    kronrod += WGK[i]! * pair;
    if (i % 2 === 1) gauss += WG[(i - 1) / 2]! * pair;
  }
  return { kronrod: kronrod * half, error: Math.abs((kronrod - gauss) * half) };
}

/**
 * Integral of a smooth f over [a, b] to relative tolerance `relTol` (absolute floor `absTol`),
 * by recursive bisection of panels whose K15 - G7 difference is too large.
 */
export function integrate(
  f: (x: number) => number,
  a: number,
  b: number,
  relTol = 1e-12,
  absTol = 0,
): number {
  if (a === b) return 0;
  const whole = gaussKronrod15(f, a, b);
  const tolerance = (scale: number) => Math.max(absTol, relTol * Math.abs(scale));
  const recurse = (lo: number, hi: number, panel: Panel, scale: number, depth: number): number => {
    if (panel.error <= tolerance(scale) || depth >= 40) return panel.kronrod;
    const mid = 0.5 * (lo + hi);
    const left = gaussKronrod15(f, lo, mid);
    const right = gaussKronrod15(f, mid, hi);
    return recurse(lo, mid, left, scale, depth + 1) + recurse(mid, hi, right, scale, depth + 1);
  };
  return recurse(a, b, whole, whole.kronrod, 0);
}

// ---------------------------------------------------------------------------------------------
// Distances

function checkRedshift(z: number): number {
  requireFinite("z", z);
  if (z < 0) throw new PhysicsInputError("z", "z must be >= 0");
  return z;
}

/** Recently used distances: a catalogue page converts many mappings for the same event. */
const distanceCache = new Map<string, number>();
const DISTANCE_CACHE_SIZE = 512;

/** D_alpha(z) in Mpc for a modified dispersion with exponent alpha_md (D_0: alpha_md = 0). */
export function distanceAlphaMpc(z: number, alphaMd: number, cosmology: Cosmology = PLANCK_2018): number {
  checkRedshift(z);
  requireFinite("alpha_md", alphaMd);
  const cosmo = validateCosmology(cosmology);
  const key = `${z}|${alphaMd}|${cosmo.H0}|${cosmo.Omega_m}`;
  const hit = distanceCache.get(key);
  if (hit !== undefined) return hit;
  const integral = integrate((x) => (1 + x) ** (alphaMd - 2) / hubbleRate(1 + x, cosmo), 0, z, 1e-13);
  const d = (1 + z) ** (1 - alphaMd) * hubbleDistanceMpc(cosmo) * integral;
  if (distanceCache.size >= DISTANCE_CACHE_SIZE) distanceCache.delete(distanceCache.keys().next().value!);
  distanceCache.set(key, d);
  return d;
}

export function distanceAlphaKm(z: number, alphaMd: number, cosmology: Cosmology = PLANCK_2018): number {
  return mpcToKm(distanceAlphaMpc(z, alphaMd, cosmology));
}

/** Line-of-sight comoving distance in Mpc. */
export function comovingDistanceMpc(z: number, cosmology: Cosmology = PLANCK_2018): number {
  checkRedshift(z);
  const cosmo = validateCosmology(cosmology);
  return hubbleDistanceMpc(cosmo) * integrate((x) => 1 / hubbleRate(1 + x, cosmo), 0, z, 1e-13);
}

/** Luminosity distance (1+z) D_C in Mpc (flat universe). */
export function luminosityDistanceMpc(z: number, cosmology: Cosmology = PLANCK_2018): number {
  return (1 + z) * comovingDistanceMpc(z, cosmology);
}

export function luminosityDistanceKm(z: number, cosmology: Cosmology = PLANCK_2018): number {
  return mpcToKm(luminosityDistanceMpc(z, cosmology));
}

/**
 * Redshift whose luminosity distance is `distanceMpc`, by bisection (D_L is increasing in z).
 * Events are often published with D_L only; this recovers the z the distance measures need.
 */
export function redshiftFromLuminosityDistance(distanceMpc: number, cosmology: Cosmology = PLANCK_2018): number {
  requireFinite("luminosity_distance", distanceMpc);
  if (distanceMpc < 0) throw new PhysicsInputError("luminosity_distance", "luminosity_distance must be >= 0");
  if (distanceMpc === 0) return 0;
  let lo = 0;
  let hi = 1;
  while (luminosityDistanceMpc(hi, cosmology) < distanceMpc) {
    hi *= 2;
    if (hi > 1e4) throw new PhysicsInputError("luminosity_distance", "luminosity_distance is beyond z = 1e4");
  }
  for (let i = 0; i < 200 && hi - lo > 1e-15 * hi; i++) {
    const mid = 0.5 * (lo + hi);
    if (luminosityDistanceMpc(mid, cosmology) < distanceMpc) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}
