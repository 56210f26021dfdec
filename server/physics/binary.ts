/**
 * A compact binary as the mappings see it: ordered (m1 >= m2), in the source frame, with every
 * derived quantity and the per-body charges the theories need.
 *
 * Generation effects turn a dimensionless combination into a length with source-frame masses; a
 * detector-frame input is divided by (1 + z) here, once, so the rest of the engine never sees
 * redshifted masses.
 */
import { PhysicsInputError, requireFinite } from "./input-error.ts";
import { SPEED_OF_LIGHT_KM_S, solarMassToKm } from "./units.ts";

/** Lowest frequency of the analysis band when none is given: 20 Hz (common practice for ground-based detectors). */
export const DEFAULT_F_LOW_HZ = 20;

/**
 * Time the signal spends in band above f_low, at leading (Newtonian) order:
 * tau = (5/256) Mc (pi Mc f)^(-8/3) (common practice), in km (c = 1). Source frame: Mc is the
 * source-frame chirp mass and f = (1 + z) f_low the source-frame frequency of the observed f_low
 * (z = 0 when the redshift is not known, which gives a longer tau and so a stricter condition).
 */
export function inBandTimeKm(mcKm: number, fLowHz: number, z = 0): number {
  const f = ((1 + z) * fLowHz) / SPEED_OF_LIGHT_KM_S;
  return (5 / 256) * mcKm * (Math.PI * mcKm * f) ** (-8 / 3);
}

export type BodyKind = "bh" | "ns";
export type MassFrame = "source" | "detector";

export interface BinaryInput {
  /** Component masses in solar masses, in the frame given by `frame`; any order. */
  readonly m1: number;
  readonly m2: number;
  /** Dimensionless spins along the orbital angular momentum, |chi| < 1. Default 0. */
  readonly chi1?: number;
  readonly chi2?: number;
  /** Default: two black holes. */
  readonly bodies?: readonly [BodyKind, BodyKind];
  readonly frame: MassFrame;
  /** Redshift; required for detector-frame masses and for propagation effects. */
  readonly z?: number;
  /**
   * Scalar-tensor sensitivities (Brans-Dicke): 1/2 for a black hole (Will & Zaglauer 1989,
   * ApJ 346, 366 [memory]); for a neutron star it depends on the equation of state and must be
   * given. Same order as m1, m2 of the input.
   */
  readonly scalar_sensitivities?: readonly [number | undefined, number | undefined];
}

export interface Binary {
  /** Source-frame masses, solar masses, m1 >= m2. */
  readonly m1: number;
  readonly m2: number;
  readonly M: number;
  readonly eta: number;
  readonly Mc: number;
  readonly dm: number;
  /** q = m2 / m1 <= 1. */
  readonly q: number;
  readonly chi1: number;
  readonly chi2: number;
  readonly chi_s: number;
  readonly chi_a: number;
  /** EdGB scalar-charge factors (0 for a neutron star). */
  readonly s1: number;
  readonly s2: number;
  /** Scalar-tensor sensitivities, when known. */
  readonly sigma1?: number;
  readonly sigma2?: number;
  readonly bodies: readonly [BodyKind, BodyKind];
  readonly z?: number;
  /** True when the input listed the lighter body first. */
  readonly swapped: boolean;
  /** Geometric lengths G m / c^2 in km (source frame). */
  readonly km: { readonly m1: number; readonly m2: number; readonly M: number; readonly Mc: number };
}

/** Black-hole scalar sensitivity in Brans-Dicke theory (Will & Zaglauer 1989 [memory]). */
export const BLACK_HOLE_SCALAR_SENSITIVITY = 0.5;

/**
 * EdGB black-hole scalar-charge spin factor s(chi) = 2 (sqrt(1 - chi^2) - 1 + chi^2) / chi^2
 * (Yagi, Stein & Yunes 2016, Phys. Rev. D 93, 024010 [memory: reference to be confirmed]).
 * Written as 2 r / (1 + r), r = sqrt(1 - chi^2), which is the same expression with the
 * cancellation near chi = 0 removed (sqrt(1 - x) - 1 = -x / (1 + sqrt(1 - x))): exact at chi = 0
 * (s = 1) and accurate to rounding everywhere, so no series is needed.
 */
export function edgbSpinFactor(chi: number): number {
  const r = Math.sqrt(1 - chi * chi);
  return (2 * r) / (1 + r);
}

function checkSpin(field: string, chi: number | undefined): number {
  if (chi === undefined) return 0;
  requireFinite(field, chi);
  if (Math.abs(chi) >= 1) throw new PhysicsInputError(field, `${field} must satisfy |${field}| < 1`);
  return chi;
}

function checkMass(field: string, m: number): number {
  requireFinite(field, m);
  if (m <= 0) throw new PhysicsInputError(field, `${field} must be positive (solar masses)`);
  return m;
}

function checkSensitivity(field: string, s: number | undefined): number | undefined {
  if (s === undefined) return undefined;
  requireFinite(field, s);
  if (s < 0 || s > 0.5) throw new PhysicsInputError(field, `${field} must lie in [0, 1/2]`);
  return s;
}

export function makeBinary(input: BinaryInput): Binary {
  let m1 = checkMass("m1", input.m1);
  let m2 = checkMass("m2", input.m2);
  let chi1 = checkSpin("chi1", input.chi1);
  let chi2 = checkSpin("chi2", input.chi2);
  const bodiesIn = input.bodies ?? (["bh", "bh"] as const);
  for (const [i, body] of bodiesIn.entries()) {
    if (body !== "bh" && body !== "ns") throw new PhysicsInputError(`bodies.${i}`, `bodies.${i} must be "bh" or "ns"`);
  }
  let bodies: [BodyKind, BodyKind] = [bodiesIn[0], bodiesIn[1]];
  const sens = input.scalar_sensitivities;
  let sigma1 = checkSensitivity("scalar_sensitivities.0", sens?.[0]);
  let sigma2 = checkSensitivity("scalar_sensitivities.1", sens?.[1]);
  if (input.frame !== "source" && input.frame !== "detector") {
    throw new PhysicsInputError("frame", 'frame must be "source" or "detector"');
  }
  let z: number | undefined;
  if (input.z !== undefined) {
    z = requireFinite("z", input.z);
    if (z < 0) throw new PhysicsInputError("z", "z must be >= 0");
  }
  if (input.frame === "detector") {
    if (z === undefined) throw new PhysicsInputError("z", "detector-frame masses need the redshift z");
    m1 /= 1 + z;
    m2 /= 1 + z;
  }

  const swapped = m2 > m1;
  if (swapped) {
    [m1, m2] = [m2, m1];
    [chi1, chi2] = [chi2, chi1];
    [sigma1, sigma2] = [sigma2, sigma1];
    bodies = [bodies[1], bodies[0]];
  }
  if (bodies[0] === "bh" && sigma1 === undefined) sigma1 = BLACK_HOLE_SCALAR_SENSITIVITY;
  if (bodies[1] === "bh" && sigma2 === undefined) sigma2 = BLACK_HOLE_SCALAR_SENSITIVITY;

  const M = m1 + m2;
  const eta = (m1 * m2) / (M * M);
  const Mc = eta ** 0.6 * M;
  const s1 = bodies[0] === "ns" ? 0 : edgbSpinFactor(chi1);
  const s2 = bodies[1] === "ns" ? 0 : edgbSpinFactor(chi2);
  return {
    m1,
    m2,
    M,
    eta,
    Mc,
    dm: (m1 - m2) / M,
    q: m2 / m1,
    chi1,
    chi2,
    chi_s: (chi1 + chi2) / 2,
    chi_a: (chi1 - chi2) / 2,
    s1,
    s2,
    ...(sigma1 === undefined ? {} : { sigma1 }),
    ...(sigma2 === undefined ? {} : { sigma2 }),
    bodies,
    ...(z === undefined ? {} : { z }),
    swapped,
    km: { m1: solarMassToKm(m1), m2: solarMassToKm(m2), M: solarMassToKm(M), Mc: solarMassToKm(Mc) },
  };
}

/**
 * The symbols a mapping expression may use, lengths in km: m1, m2, M, Mc (source frame), eta,
 * dm, q, chi1, chi2, chi_s, chi_a, s1, s2, sigma1, sigma2 (when known), z (when known), f_low
 * (the observed lowest frequency of the band, 1/km) and tau (time in band above f_low, km).
 * Distances (D_0, D_alpha) are added by the converter, which owns the cosmology.
 */
export function binarySymbols(binary: Binary, fLowHz: number = DEFAULT_F_LOW_HZ): Record<string, number> {
  if (!(Number.isFinite(fLowHz) && fLowHz > 0)) throw new PhysicsInputError("f_low", "f_low must be a positive frequency in Hz");
  const env: Record<string, number> = {
    m1: binary.km.m1,
    m2: binary.km.m2,
    M: binary.km.M,
    Mc: binary.km.Mc,
    eta: binary.eta,
    dm: binary.dm,
    q: binary.q,
    chi1: binary.chi1,
    chi2: binary.chi2,
    chi_s: binary.chi_s,
    chi_a: binary.chi_a,
    s1: binary.s1,
    s2: binary.s2,
    f_low: fLowHz / SPEED_OF_LIGHT_KM_S,
    tau: inBandTimeKm(binary.km.Mc, fLowHz, binary.z ?? 0),
  };
  if (binary.sigma1 !== undefined) env.sigma1 = binary.sigma1;
  if (binary.sigma2 !== undefined) env.sigma2 = binary.sigma2;
  if (binary.z !== undefined) env.z = binary.z;
  return env;
}
