/**
 * Remnant mass and spin of an aligned-spin binary black hole from numerical-relativity fits.
 *
 * - Husa et al. 2016 (Phys. Rev. D 93, 044006, arXiv:1508.07250, Eqs. 3.6-3.8): final spin and
 *   radiated energy. Two different spin variables: S = (m1^2 chi1 + m2^2 chi2) / M^2 in the spin fit
 *   and S2 = (m1^2 chi1 + m2^2 chi2) / (m1^2 + m2^2) in the energy fit; mixing them is a classic bug.
 * - Barausse & Rezzolla 2009 (Astrophys. J. Lett. 704, L40, arXiv:0904.2577, Eq. 3 for aligned spins):
 *   a second final-spin fit; its difference from Husa's is shown as a systematic. It gives no mass.
 *
 * Masses in solar masses in any one frame; the remnant mass comes back in the same frame.
 */
import { PhysicsInputError, requireFinite } from "../input-error.ts";

export interface ComponentInput {
  readonly m1: number;
  readonly m2: number;
  readonly chi1?: number;
  readonly chi2?: number;
}

interface Ordered {
  m1: number;
  m2: number;
  chi1: number;
  chi2: number;
  M: number;
  eta: number;
}

function ordered(input: ComponentInput, prefix = ""): Ordered {
  const m1 = requireFinite(`${prefix}m1`, input.m1);
  const m2 = requireFinite(`${prefix}m2`, input.m2);
  if (m1 <= 0) throw new PhysicsInputError(`${prefix}m1`, `${prefix}m1 must be positive (solar masses)`);
  if (m2 <= 0) throw new PhysicsInputError(`${prefix}m2`, `${prefix}m2 must be positive (solar masses)`);
  const c1 = requireFinite(`${prefix}chi1`, input.chi1 ?? 0);
  const c2 = requireFinite(`${prefix}chi2`, input.chi2 ?? 0);
  if (Math.abs(c1) >= 1) throw new PhysicsInputError(`${prefix}chi1`, `${prefix}chi1 must satisfy |chi1| < 1`);
  if (Math.abs(c2) >= 1) throw new PhysicsInputError(`${prefix}chi2`, `${prefix}chi2 must satisfy |chi2| < 1`);
  const swap = m2 > m1;
  const a = swap ? { m1: m2, m2: m1, chi1: c2, chi2: c1 } : { m1, m2, chi1: c1, chi2: c2 };
  const M = a.m1 + a.m2;
  return { ...a, M, eta: (a.m1 * a.m2) / (M * M) };
}

/** Husa et al. 2016, Eq. 3.8: final dimensionless spin. */
function husaSpin(b: Ordered): number {
  const { eta } = b;
  const S = (b.m1 * b.m1 * b.chi1 + b.m2 * b.m2 * b.chi2) / (b.M * b.M);
  return (
    2 * Math.sqrt(3) * eta -
    4.399247300629289 * eta ** 2 +
    9.397292189321194 * eta ** 3 -
    13.180949901606242 * eta ** 4 +
    (1 - 0.0850917821418767 * eta - 5.837029316602263 * eta ** 2) * S +
    (0.1014665242971878 * eta - 2.0967746996832157 * eta ** 2) * S ** 2 +
    (-1.3546806617824356 * eta + 4.108962025369336 * eta ** 2) * S ** 3 +
    (-0.8676969352555539 * eta + 2.064046835273906 * eta ** 2) * S ** 4
  );
}

/** Husa et al. 2016, Eqs. 3.6-3.7: radiated energy as a fraction of the total mass. */
function husaRadiatedFraction(b: Ordered): number {
  const { eta } = b;
  const S2 = (b.m1 * b.m1 * b.chi1 + b.m2 * b.m2 * b.chi2) / (b.m1 * b.m1 + b.m2 * b.m2);
  const nonSpinning =
    0.055974469826360077 * eta + 0.5809510763115132 * eta ** 2 - 0.9606726679372312 * eta ** 3 + 3.352411249771192 * eta ** 4;
  const num = 1 + (-0.0030302335878845507 - 2.0066110851351073 * eta + 7.7050567802399215 * eta ** 2) * S2;
  const den = 1 + (-0.6714403054720589 - 1.4756929437702908 * eta + 7.304676214885011 * eta ** 2) * S2;
  return (nonSpinning * num) / den;
}

/** Barausse & Rezzolla 2009, Eq. 3 with aligned spins (q = m2/m1 <= 1). */
function barausseRezzollaSpin(b: Ordered): number {
  const q = b.m2 / b.m1;
  const { eta } = b;
  const at = (b.chi1 + q * q * b.chi2) / (1 + q * q);
  const s4 = -0.1229;
  const s5 = 0.4537;
  const t0 = -2.8904;
  const t2 = -3.5171;
  const t3 = 2.5763;
  return at + s4 * at * at * eta + s5 * at * eta * eta + t0 * at * eta + 2 * Math.sqrt(3) * eta + t2 * eta * eta + t3 * eta ** 3;
}

export interface RemnantEstimate {
  /** Remnant mass, solar masses, same frame as the input masses. */
  readonly M_f: number;
  /** Remnant spin from Husa et al. 2016. */
  readonly chi_f: number;
  /** Radiated energy fraction E_rad / M (Husa et al. 2016). */
  readonly radiated_fraction: number;
  /** The second final-spin fit (Barausse & Rezzolla 2009). */
  readonly chi_f_alternative: number;
  /** |chi_f - chi_f_alternative|: the spread between fits, a systematic of the remnant estimate. */
  readonly chi_f_fit_spread: number;
}

/** Remnant of an aligned-spin binary black hole (Husa et al. 2016, with Barausse & Rezzolla 2009 beside it). */
export function remnantFromBinary(input: ComponentInput, prefix = ""): RemnantEstimate {
  const b = ordered(input, prefix);
  const chi_f = husaSpin(b);
  const radiated = husaRadiatedFraction(b);
  const alt = barausseRezzollaSpin(b);
  return {
    M_f: b.M * (1 - radiated),
    chi_f,
    radiated_fraction: radiated,
    chi_f_alternative: alt,
    chi_f_fit_spread: Math.abs(chi_f - alt),
  };
}
