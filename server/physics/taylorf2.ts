/**
 * TaylorF2 phase coefficients and the generalized-IMR (gIMR) <-> ppE dictionary.
 *
 * GR phase (exp(+i Psi) convention): Psi = 2 pi f t_c - phi_c - pi/4 + 3/(128 eta v^5) sum_k phi_k v^k
 * (+ log terms at k = 5, 6), v = (pi M f)^(1/3). Non-spinning phi_k: Buonanno, Iyer, Ochsner, Pan &
 * Sathyaprakash 2009, Phys. Rev. D 80, 084043, arXiv:0907.0700, Eq. 3.18.
 *
 * A gIMR analysis stretches phi_k -> phi_k (1 + dphi_k). With u = eta^(1/5) v the extra phase is
 * (3/128) phi_k eta^(-k/5) dphi_k u^(k-5): a ppE term with b = k - 5 (Yunes & Pretorius 2009,
 * Phys. Rev. D 80, 122003). Where phi_k = 0 in GR (k = -2, 1) dphi_k is absolute.
 */
import { EULER_GAMMA } from "./units.ts";

export type GimrIndex = -2 | 0 | 1 | 2 | 3 | 4 | 5 | "5l" | 6 | "6l" | 7;
export const GIMR_INDICES: readonly GimrIndex[] = [-2, 0, 1, 2, 3, 4, 5, "5l", 6, "6l", 7];

export type SignConvention = "plus" | "minus";

/** The spin and mass-asymmetry variables the spin terms need (chi along the orbital angular momentum). */
export interface SpinState {
  readonly eta: number;
  /** (m1 - m2) / M. */
  readonly dm: number;
  readonly chi_s: number;
  readonly chi_a: number;
  readonly bodies?: readonly ["bh" | "ns", "bh" | "ns"];
}

const PI = Math.PI;

/** Non-spinning TaylorF2 coefficient phi_k(eta), k = 0..7 (Buonanno et al. 2009, Eq. 3.18). */
export function taylorF2Coefficient(k: number, eta: number): number {
  const eta2 = eta * eta;
  switch (k) {
    case 0:
      return 1;
    case 1:
      return 0;
    case 2:
      return 3715 / 756 + (55 / 9) * eta;
    case 3:
      return -16 * PI;
    case 4:
      return 15293365 / 508032 + (27145 / 504) * eta + (3085 / 72) * eta2;
    case 5:
      return PI * (38645 / 756 - (65 / 9) * eta);
    case 6:
      return (
        11583231236531 / 4694215680 -
        (640 / 3) * PI * PI -
        (6848 / 21) * EULER_GAMMA -
        (6848 / 21) * Math.log(4) +
        (-15737765635 / 3048192 + (2255 / 12) * PI * PI) * eta +
        (76055 / 1728) * eta2 -
        (127825 / 1296) * eta2 * eta
      );
    case 7:
      return PI * (77096675 / 254016 + (378515 / 1512) * eta - (74045 / 756) * eta2);
    default:
      throw new RangeError(`no TaylorF2 coefficient at k = ${k} (0..7)`);
  }
}

/** Coefficient of v^k ln v in the same sum (k = 5: 3 phi_5; k = 6: -6848/21). */
export function taylorF2LogCoefficient(k: 5 | 6, eta: number): number {
  return k === 5 ? 3 * taylorF2Coefficient(5, eta) : -6848 / 21;
}

/**
 * Leading spin-orbit part of phi_3 for aligned spins:
 * (113/3) dm chi_a + (113/3 - 76 eta/3) chi_s
 * (Khan et al. 2016, Phys. Rev. D 93, 044007, arXiv:1508.07253, App. B; equal to 4 beta_SO with
 * beta_SO = (1/12) sum_i chi_i (113 m_i^2/M^2 + 75 eta) of Poisson & Will 1995, Phys. Rev. D 52, 848).
 * No body-dependent constant enters at this order, so it holds for neutron stars too.
 */
export function taylorF2SpinOrbit3(s: SpinState): number {
  return (113 / 3) * s.dm * s.chi_a + (113 / 3 - (76 / 3) * s.eta) * s.chi_s;
}

/**
 * Leading spin-spin part of phi_4 for aligned black-hole spins (spin-induced quadrupole at its Kerr
 * value kappa = 1): (-405/8 + 200 eta) chi_a^2 - (405/4) dm chi_s chi_a + (-405/8 + 5 eta/2) chi_s^2
 * (Khan et al. 2016, arXiv:1508.07253, App. B; the same as Arun, Buonanno, Faye & Ochsner 2009,
 * Phys. Rev. D 79, 104023, arXiv:0810.5336, Eq. 6.24, restricted to aligned spins and kappa = 1).
 */
export function taylorF2SpinSpin4(s: SpinState): number {
  const { eta, dm, chi_s, chi_a } = s;
  return (-405 / 8 + 200 * eta) * chi_a * chi_a - (405 / 4) * dm * chi_s * chi_a + (-405 / 8 + (5 / 2) * eta) * chi_s * chi_s;
}

/** ppE exponent for a gIMR index: b = k - 5 (null for the log terms). */
export function gimrIndexToB(k: GimrIndex): number | null {
  return typeof k === "number" ? k - 5 : null;
}

/** PN order n of a ppE exponent b = 2n - 5. */
export function pnOrderFromB(b: number): number {
  return (b + 5) / 2;
}

export function bFromPnOrder(n: number): number {
  return 2 * n - 5;
}

/** Why a ppE exponent cannot be bounded, or null: b = 0 is the phase constant, b = 3 the time shift. */
export function degeneracyOfB(b: number): string | null {
  if (b === 0) return "b = 0 (2.5PN) is degenerate with the coalescence phase: no bound exists there";
  if (b === 3) return "b = 3 (4PN) is degenerate with the coalescence time: no bound exists there";
  return null;
}

/** beta recorded in the exp(-i Psi) convention has the opposite sign: return it in the +Psi convention. */
export function normaliseSign(beta: number, convention: SignConvention): number {
  return convention === "minus" ? -beta : beta;
}

export interface GimrFactor {
  readonly status: "ok";
  readonly b: number;
  /** beta = factor * dphi_k. */
  readonly factor: number;
  /** The phi_k the relative deviation multiplies (1 for the absolute k = -2, 1). */
  readonly coefficient: number;
  readonly absolute: boolean;
  readonly spinModelled: boolean;
  readonly cautions: readonly string[];
}

export interface GimrNoEquivalent {
  readonly status: "degenerate" | "no_ppe_equivalent";
  readonly b: number | null;
  readonly reason: string;
  readonly cautions: readonly string[];
}

export interface GimrFactorOptions {
  /** Whether the analysis stretched the spin-including phi_k rather than the non-spinning one. */
  readonly includesSpin?: boolean;
  readonly spins?: SpinState;
}

/**
 * The linear factor between dphi_k and beta for one binary, with the cautions a user must see.
 * dphi_k is relative to a term of the GR phase and shares its sign, so it needs no sign
 * normalisation (unlike a ppE beta).
 */
export function gimrFactor(k: GimrIndex, eta: number, options: GimrFactorOptions = {}): GimrFactor | GimrNoEquivalent {
  const cautions: string[] = [];
  if (k === "5l" || k === "6l") {
    return {
      status: "no_ppe_equivalent",
      b: null,
      reason: `dphi_${k} multiplies a v^k ln v term, which has no single-b ppE equivalent`,
      cautions,
    };
  }
  const b = k - 5;
  const degenerate = degeneracyOfB(b);
  if (degenerate) return { status: "degenerate", b, reason: `dphi_5: ${degenerate}`, cautions };
  if (k === 0) cautions.push("dphi_0 is degenerate with the chirp mass: a bound on it reflects the mass prior as much as the theory");

  const absolute = k === -2 || k === 1;
  let coefficient = absolute ? 1 : taylorF2Coefficient(k, eta);
  let spinModelled = false;
  const spins = options.spins;
  if (options.includesSpin && !absolute && spins && (spins.chi_s !== 0 || spins.chi_a !== 0)) {
    if (k === 3) {
      coefficient += taylorF2SpinOrbit3(spins);
      spinModelled = true;
    } else if (k === 4 && !(spins.bodies ?? ["bh", "bh"]).includes("ns")) {
      coefficient += taylorF2SpinSpin4(spins);
      spinModelled = true;
    } else {
      cautions.push(
        k === 4
          ? "the bound is relative to the spin-including phi_4, but the neutron-star spin-induced quadrupole is not modelled: the non-spinning phi_4 is used"
          : `the bound is relative to the spin-including phi_${k}, whose spin part is not modelled here: the non-spinning phi_${k} is used`,
      );
    }
  }
  const factor = (3 / 128) * coefficient * eta ** (-k / 5);
  return { status: "ok", b, factor, coefficient, absolute, spinModelled, cautions };
}

/** beta for a given dphi_k, or the reason there is none. */
export function gimrToPpe(
  k: GimrIndex,
  dphi: number,
  eta: number,
  options: GimrFactorOptions = {},
): (GimrFactor & { readonly beta: number }) | GimrNoEquivalent {
  const f = gimrFactor(k, eta, options);
  return f.status === "ok" ? { ...f, beta: f.factor * dphi } : f;
}

/** dphi_k equivalent to a ppE beta at b = k - 5 (inverse of gimrToPpe). */
export function ppeToGimr(b: number, beta: number, eta: number, options: GimrFactorOptions = {}): number {
  const k = b + 5;
  if (!GIMR_INDICES.includes(k as GimrIndex)) throw new RangeError(`b = ${b} has no gIMR index`);
  const f = gimrFactor(k as GimrIndex, eta, options);
  if (f.status !== "ok") throw new RangeError(f.reason);
  return beta / f.factor;
}
