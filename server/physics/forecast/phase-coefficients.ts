/**
 * Aligned-spin TaylorF2 phase coefficients to 3.5PN, as dual numbers in
 * (mass-ratio parameter, chi_s, chi_a) so their partial derivatives are exact.
 *
 * Normalisation: Psi = 2 pi f t_c - phi_c - pi/4 + 3/(128 eta v^5) sum_k [phi_k + phi_kl ln v] v^k.
 * Non-spinning parts: Buonanno, Iyer, Ochsner, Pan & Sathyaprakash 2009, Phys. Rev. D 80, 084043,
 * arXiv:0907.0700, Eq. 3.18. Spin parts (black holes, spin-induced quadrupole kappa = 1), in the
 * chi_s / chi_a form of Khan et al. 2016, Phys. Rev. D 93, 044007, arXiv:1508.07253, App. B
 * (spin-orbit to 3.5PN after Bohe, Marsat, Faye & Blanchet 2013, arXiv:1303.7412; spin-spin after
 * Arun, Buonanno, Faye & Ochsner 2009, arXiv:0810.5336, Eq. 6.24). The 3.5PN cubic-in-spin terms are
 * those of the same chi_s / chi_a form.
 */
import { EULER_GAMMA } from "../units.ts";
import { Dual, poly } from "./dual.ts";

const PI = Math.PI;

export type MassRatioParameter = "ln_eta" | "delta";

/** The fiducial values the coefficients are expanded about. */
export interface SpinFiducial {
  readonly eta: number;
  readonly chi_s: number;
  readonly chi_a: number;
}

/**
 * Below this |delta| = |m1 - m2| / M the parameter ln eta is replaced by delta: d delta / d eta
 * = -2 / delta diverges at equal masses, while every derivative with respect to delta stays finite.
 * The marginalised beta bound does not depend on how the nuisance parameters are written.
 */
export const EQUAL_MASS_DELTA = 1e-3;

export interface PhaseCoefficients {
  readonly massParameter: MassRatioParameter;
  /** phi_k for k = 0..7 (phi_5 multiplies v^5 (1 + 3 ln v), so phi_5l = 3 phi_5). */
  readonly phi: readonly Dual[];
  /** phi_kl: coefficients of v^k ln v for k = 0..7 (non-zero at 5 and 6). */
  readonly phiLog: readonly Dual[];
  readonly eta: Dual;
  readonly delta: Dual;
}

/** The non-spinning part of phi_k as a function of eta (Buonanno et al. 2009, Eq. 3.18). */
function nonSpinning(eta: Dual): Dual[] {
  const phi6Constant =
    11583231236531 / 4694215680 - (640 / 3) * PI * PI - (6848 / 21) * EULER_GAMMA - (6848 / 21) * Math.log(4);
  return [
    new Dual(1),
    new Dual(0),
    poly(eta, [3715 / 756, 55 / 9]),
    new Dual(-16 * PI),
    poly(eta, [15293365 / 508032, 27145 / 504, 3085 / 72]),
    poly(eta, [PI * (38645 / 756), -PI * (65 / 9)]),
    poly(eta, [phi6Constant, -15737765635 / 3048192 + (2255 / 12) * PI * PI, 76055 / 1728, -127825 / 1296]),
    poly(eta, [PI * (77096675 / 254016), PI * (378515 / 1512), -PI * (74045 / 756)]),
  ];
}

/** The spin parts of phi_k, k = 0..7 (zero below 1.5PN). */
function spinParts(eta: Dual, delta: Dual, chiS: Dual, chiA: Dual): Dual[] {
  const zero = new Dual(0);
  const dChiA = delta.mul(chiA);
  const chiS2 = chiS.mul(chiS);
  const chiA2 = chiA.mul(chiA);
  const phi3 = dChiA.mul(113 / 3).add(poly(eta, [113 / 3, -76 / 3]).mul(chiS));
  const phi4 = poly(eta, [-405 / 8, 200])
    .mul(chiA2)
    .sub(dChiA.mul(chiS).mul(405 / 4))
    .add(poly(eta, [-405 / 8, 5 / 2]).mul(chiS2));
  const gammaSO = poly(eta, [732985 / 2268, -24260 / 81, -340 / 9])
    .mul(chiS)
    .add(poly(eta, [732985 / 2268, 140 / 9]).mul(dChiA));
  const phi5 = gammaSO.mul(-1);
  const phi6 = dChiA
    .mul(2270 / 3)
    .add(poly(eta, [2270 / 3, -520]).mul(chiS))
    .mul(PI)
    .add(poly(eta, [75515 / 144, -8225 / 18]).mul(dChiA).mul(chiS))
    .add(poly(eta, [75515 / 288, -263245 / 252, -480]).mul(chiA2))
    .add(poly(eta, [75515 / 288, -232415 / 504, 1255 / 9]).mul(chiS2));
  const phi7Linear = poly(eta, [-25150083775 / 3048192, 10566655595 / 762048, -1042165 / 3024, 5345 / 36])
    .mul(chiS)
    .add(poly(eta, [-25150083775 / 3048192, 26804935 / 6048, -1985 / 48]).mul(dChiA));
  const phi7Cubic = poly(eta, [14585 / 8, -7270, 80])
    .mul(chiA2)
    .mul(chiS)
    .add(poly(eta, [14585 / 24, -475 / 6, 100 / 3]).mul(chiS2).mul(chiS))
    .add(
      delta.mul(
        poly(eta, [14585 / 24, -2380])
          .mul(chiA2)
          .mul(chiA)
          .add(poly(eta, [14585 / 8, -215 / 2]).mul(chiA).mul(chiS2)),
      ),
    );
  return [zero, zero, zero, phi3, phi4, phi5, phi6, phi7Linear.add(phi7Cubic)];
}

/**
 * The coefficients at a fiducial binary, with infinitesimal 0 along the mass-ratio parameter
 * (ln eta, or delta near equal masses), 1 along chi_s and 2 along chi_a.
 */
export function phaseCoefficients(fiducial: SpinFiducial, force?: MassRatioParameter): PhaseCoefficients {
  const deltaValue = Math.sqrt(Math.max(0, 1 - 4 * fiducial.eta));
  const massParameter: MassRatioParameter = force ?? (deltaValue < EQUAL_MASS_DELTA ? "delta" : "ln_eta");
  let eta: Dual;
  let delta: Dual;
  if (massParameter === "ln_eta") {
    eta = new Dual(Math.log(fiducial.eta), 1, 0, 0).exp();
    delta = eta.mul(-4).add(1).sqrt();
  } else {
    delta = new Dual(deltaValue, 1, 0, 0);
    eta = delta.mul(delta).mul(-1).add(1).mul(0.25);
  }
  const chiS = new Dual(fiducial.chi_s, 0, 1, 0);
  const chiA = new Dual(fiducial.chi_a, 0, 0, 1);
  const ns = nonSpinning(eta);
  const spin = spinParts(eta, delta, chiS, chiA);
  const phi = ns.map((c, k) => c.add(spin[k]!));
  const phiLog = phi.map((_, k) => (k === 5 ? phi[5]!.mul(3) : k === 6 ? new Dual(-6848 / 21) : new Dual(0)));
  return { massParameter, phi, phiLog, eta, delta };
}
