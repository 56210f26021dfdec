/**
 * Kerr quasinormal modes from the fits of Berti, Cardoso & Will 2006 (Phys. Rev. D 73, 064030,
 * gr-qc/0512160, Table VIII): M_f omega_R = f1 + f2 (1 - j)^f3 and Q = omega_R / (2 |omega_I|) =
 * q1 + q2 (1 - j)^q3, so tau = 2 Q / omega_R. The fits are good to about 2 % in omega_R against
 * Leaver's continued fraction for 0 <= j <= 0.99 (largest at j = 0).
 *
 * Spins are the remnant's dimensionless spin j = chi_f >= 0; the modes are the co-rotating (m > 0)
 * branch. Masses in solar masses, in the frame of the caller: a detector-frame (redshifted) mass gives
 * the observed frequency and damping time.
 */
import { PhysicsInputError, requireFinite } from "../input-error.ts";
import { SOLAR_MASS_TIME_S } from "../units.ts";

export const QNM_MODES = ["220", "221", "330", "210", "440"] as const;
export type QnmMode = (typeof QNM_MODES)[number];

interface FitCoefficients {
  readonly f: readonly [number, number, number];
  readonly q: readonly [number, number, number];
}

/** Berti, Cardoso & Will 2006, Table VIII (rows (l, m, n) = (2,2,0), (2,2,1), (3,3,0), (2,1,0), (4,4,0)). */
const FITS: Record<QnmMode, FitCoefficients> = {
  "220": { f: [1.5251, -1.1568, 0.1292], q: [0.7, 1.4187, -0.499] },
  "221": { f: [1.3673, -1.026, 0.1628], q: [0.1, 0.5436, -0.4731] },
  "330": { f: [1.8956, -1.3043, 0.1818], q: [0.9, 2.343, -0.481] },
  "210": { f: [0.6, -0.2339, 0.4175], q: [-0.3, 2.3561, -0.2277] },
  "440": { f: [2.3, -1.5056, 0.2244], q: [1.1929, 3.1191, -0.4825] },
};

/** Highest spin the fits were made for. */
export const QNM_FIT_MAX_SPIN = 0.99;

export function isQnmMode(x: string): x is QnmMode {
  return (QNM_MODES as readonly string[]).includes(x);
}

function checkSpin(field: string, chi: number): number {
  requireFinite(field, chi);
  if (Math.abs(chi) >= 1) throw new PhysicsInputError(field, `${field} must satisfy |${field}| < 1`);
  if (chi < 0) {
    throw new PhysicsInputError(field, `${field} must be >= 0: the fits describe the co-rotating modes of a remnant spinning with the orbit`);
  }
  return chi;
}

/** Dimensionless mode in units of the remnant mass: M omega_R, Q, M omega_I, tau/M and their spin derivatives. */
export interface DimensionlessMode {
  /** M_f omega_R. */
  readonly F: number;
  /** Quality factor omega_R / (2 |omega_I|). */
  readonly Q: number;
  /** M_f |omega_I| = F / (2 Q). */
  readonly omegaI: number;
  /** tau / M_f = 2 Q / F. */
  readonly T: number;
  /** dF/dj and dQ/dj. */
  readonly dF: number;
  readonly dQ: number;
}

export function dimensionlessMode(mode: QnmMode, chi: number, field = "chi_f"): DimensionlessMode {
  const j = checkSpin(field, chi);
  const { f, q } = FITS[mode];
  const x = 1 - j;
  const F = f[0] + f[1] * x ** f[2];
  const Q = q[0] + q[1] * x ** q[2];
  return {
    F,
    Q,
    omegaI: F / (2 * Q),
    T: (2 * Q) / F,
    dF: -f[1] * f[2] * x ** (f[2] - 1),
    dQ: -q[1] * q[2] * x ** (q[2] - 1),
  };
}

export interface QnmInHz {
  readonly mode: QnmMode;
  /** Frequency f = omega_R / (2 pi), Hz. */
  readonly frequency_hz: number;
  /** Damping time tau = 1 / |omega_I|, s. */
  readonly damping_time_s: number;
  readonly quality_factor: number;
  /** The dimensionless M_f omega_R and M_f omega_I. */
  readonly M_omega_R: number;
  readonly M_omega_I: number;
}

/** Mode frequency (Hz) and damping time (s) for a remnant of mass `massSolar` (frame of the caller). */
export function qnm(mode: QnmMode, massSolar: number, chi: number): QnmInHz {
  requireFinite("M_f", massSolar);
  if (massSolar <= 0) throw new PhysicsInputError("M_f", "M_f must be positive (solar masses)");
  const d = dimensionlessMode(mode, chi);
  const Ms = massSolar * SOLAR_MASS_TIME_S;
  return {
    mode,
    frequency_hz: d.F / (2 * Math.PI * Ms),
    damping_time_s: d.T * Ms,
    quality_factor: d.Q,
    M_omega_R: d.F,
    M_omega_I: -d.omegaI,
  };
}

/**
 * J = d(ln f, ln tau) / d(ln M_f, chi_f) for one mode. With f = F(j)/(2 pi M), tau = M T(j):
 * J = [[-1, F'/F], [1, T'/T]], T'/T = Q'/Q - F'/F [derived].
 */
export function qnmJacobian(mode: QnmMode, chi: number): [[number, number], [number, number]] {
  const d = dimensionlessMode(mode, chi);
  const fLog = d.dF / d.F;
  const tLog = d.dQ / d.Q - fLog;
  return [
    [-1, fLog],
    [1, tLog],
  ];
}
