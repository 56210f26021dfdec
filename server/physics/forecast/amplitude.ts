/**
 * Amplitude conventions and frequency bands.
 *
 * Leading-order stationary-phase amplitude |h(f)| = A f^(-7/6), A^2 = k pi^(-4/3) Mc_z^(5/3) / D_L^2
 * (seconds), with the factor k fixed by how the detector responds (derived; Cutler & Flanagan 1994,
 * Phys. Rev. D 49, 2658 for the inner product):
 *  - optimal orientation (source overhead, face-on) of an L-shaped detector: k = 5/24;
 *  - averaged over sky, polarisation and inclination: <F+^2> = <Fx^2> = 1/5 and
 *    <((1 + cos^2 i)/2)^2 + cos^2 i> = 4/5: the average is 4/25 of the optimal power, k = (4/25)(5/24) = 1/30;
 *  - a 60-degree interferometer sees sin^2(60 deg) = 3/4 of an L's power; a triangle of three with
 *    independent noise 3 x 3/4 = 9/4; one triangle read as two channels 2 x 3/4 = 3/2;
 *  - a response-averaged curve (Robson, Cornish & Liu 2019) already holds the sky and polarisation
 *    average, so only the inclination average 4/5 is left: SNR^2 = (16/5) int A_opt^2 f^(-7/3)/S_n df,
 *    i.e. 4 k with k = (4/5)(5/24) = 1/6; face-on, k = 5/24.
 * The weight returned multiplies f^(-7/3) / S_n(f) in 4 A^2 int f^(-7/3) / S_n df.
 */
import type { CurveConvention } from "./curves.ts";

export type Orientation = "sky_averaged" | "optimal";

/** Fraction of an L-shaped detector's SNR^2 that each geometry collects (derived). */
export const GEOMETRY_FACTOR: Record<Exclude<CurveConvention, "response_averaged">, number> = {
  l_shaped: 1,
  triangle: 9 / 4,
  two_channel_triangle: 3 / 2,
};

/** k in A^2 = k pi^(-4/3) Mc_z^(5/3) / D^2 for a convention and orientation. */
export function amplitudeFactor(convention: CurveConvention, orientation: Orientation): number {
  if (convention === "response_averaged") return orientation === "optimal" ? 5 / 24 : 1 / 6;
  const single = orientation === "optimal" ? 5 / 24 : 1 / 30;
  return single * GEOMETRY_FACTOR[convention];
}

/** 4 A^2 with Mc_z and D_L in seconds. */
export function amplitudeWeight(convention: CurveConvention, orientation: Orientation, mcZSeconds: number, distanceSeconds: number): number {
  return (4 * amplitudeFactor(convention, orientation) * Math.PI ** (-4 / 3) * mcZSeconds ** (5 / 3)) / distanceSeconds ** 2;
}

/** Schwarzschild ISCO GW frequency of the detector-frame total mass (seconds): 1/(6^(3/2) pi M). */
export function iscoFrequency(mZSeconds: number): number {
  return 1 / (6 ** 1.5 * Math.PI * mZSeconds);
}

/**
 * Merger frequency of the PhenomA model (coefficients as tabulated by Robson, Cornish & Liu 2019,
 * Class. Quantum Grav. 36, 105011, Table 2): f = (0.29740 eta^2 + 0.044810 eta + 0.095560)/(pi M).
 * Pushing TaylorF2 this far is an extrapolation.
 */
export function phenomAMergerFrequency(eta: number, mZSeconds: number): number {
  return (0.2974 * eta * eta + 0.04481 * eta + 0.09556) / (Math.PI * mZSeconds);
}

/** Leading-order time to coalescence from GW frequency f (seconds): tau = 5 Mc (8 pi Mc f)^(-8/3). */
export function timeToMerger(mcZSeconds: number, f: number): number {
  return 5 * mcZSeconds * (8 * Math.PI * mcZSeconds * f) ** (-8 / 3);
}

/** Inverse of timeToMerger: f(tau) = (5 Mc / tau)^(3/8) / (8 pi Mc). */
export function frequencyAtTimeToMerger(mcZSeconds: number, tauSeconds: number): number {
  return (5 * mcZSeconds / tauSeconds) ** (3 / 8) / (8 * Math.PI * mcZSeconds);
}
