/**
 * The restricted TaylorF2 phase with a ppE term and its analytic derivatives.
 *
 * Psi(f) = 2 pi f t_c - phi_c - pi/4 + sum_k u^(k-5) [E_k + D_k ln u] + beta u^b, u = (pi Mc_z f)^(1/3),
 * which is the usual 3/(128 eta v^5) sum_k [phi_k + phi_kl ln v] v^k rewritten with v = eta^(-1/5) u:
 * E_k = (3/128) eta^(-k/5) [phi_k - phi_kl ln(eta)/5], D_k = (3/128) eta^(-k/5) phi_kl (derived).
 * Written in u, the chirp mass and the mass ratio separate: dPsi/d ln Mc only touches the powers of u
 * and dPsi/d(mass ratio) only the coefficients, whose exact derivatives come from the dual numbers.
 * The ppE term is that of Yunes & Pretorius 2009, Phys. Rev. D 80, 122003, in the exp(+i Psi) sign.
 */
import type { Dual } from "./dual.ts";
import { phaseCoefficients, type MassRatioParameter, type SpinFiducial } from "./phase-coefficients.ts";

/** Parameter order of every Fisher matrix here (the mass-ratio entry is ln_eta or delta). */
export const PARAMETER_NAMES = ["ln_A", "phi_c", "t_c", "ln_Mc", "ln_eta", "chi_s", "chi_a", "beta"] as const;
export type ParameterName = (typeof PARAMETER_NAMES)[number] | "delta";

/** The parameters as a physicist names them in notes and cautions (the identifiers above stay in the API). */
export const PARAMETER_TEXT: Readonly<Record<ParameterName, string>> = {
  ln_A: "ln A",
  phi_c: "φ_c",
  t_c: "t_c",
  ln_Mc: "ln ℳ",
  ln_eta: "ln η",
  chi_s: "χ_s",
  chi_a: "χ_a",
  beta: "β",
  delta: "δ",
};
export const N_PARAMS = 8;
export const BETA_INDEX = 7;
export const PHI_C_INDEX = 1;
export const T_C_INDEX = 2;

export interface PhaseModel {
  readonly massParameter: MassRatioParameter;
  /** Chirp mass in the detector frame, seconds. */
  readonly mcZ: number;
  /** E_k and D_k, k = 0..7, with their derivatives along (mass ratio, chi_s, chi_a). */
  readonly E: readonly Dual[];
  readonly D: readonly Dual[];
}

export function phaseModel(mcZSeconds: number, fiducial: SpinFiducial, force?: MassRatioParameter): PhaseModel {
  const c = phaseCoefficients(fiducial, force);
  const lnEta = c.eta.log();
  const E: Dual[] = [];
  const D: Dual[] = [];
  for (let k = 0; k < 8; k++) {
    const scale = c.eta.pow(-k / 5).mul(3 / 128);
    E.push(scale.mul(c.phi[k]!.sub(c.phiLog[k]!.mul(lnEta).mul(0.2))));
    D.push(scale.mul(c.phiLog[k]!));
  }
  return { massParameter: c.massParameter, mcZ: mcZSeconds, E, D };
}

/** ln u at frequency f (Hz). */
export function lnU(model: PhaseModel, f: number): number {
  return Math.log(Math.PI * model.mcZ * f) / 3;
}

/** The full phase at the fiducial point with the given t_c, phi_c and (b, beta). */
export function phase(model: PhaseModel, f: number, tc: number, phic: number, b: number, beta: number): number {
  const lu = lnU(model, f);
  let sum = 0;
  for (let k = 0; k < 8; k++) {
    const uk = Math.exp((k - 5) * lu);
    sum += uk * (model.E[k]!.v + model.D[k]!.v * lu);
  }
  return 2 * Math.PI * f * tc - phic - Math.PI / 4 + sum + beta * Math.exp(b * lu);
}

/**
 * The seven phase derivatives (phi_c, t_c, ln Mc, mass ratio, chi_s, chi_a, beta) at frequency f,
 * written into `out` (length >= 7). Fiducial beta enters the ln Mc derivative as beta (b/3) u^b.
 */
export function phaseDerivatives(model: PhaseModel, f: number, b: number, beta: number, out: Float64Array): void {
  const lu = lnU(model, f);
  let dMc = 0;
  let dMass = 0;
  let dS = 0;
  let dA = 0;
  let uk = Math.exp(-5 * lu);
  const u = Math.exp(lu);
  for (let k = 0; k < 8; k++) {
    const e = model.E[k]!;
    const d = model.D[k]!;
    dMc += uk * (((k - 5) / 3) * (e.v + d.v * lu) + d.v / 3);
    dMass += uk * (e.d0 + d.d0 * lu);
    dS += uk * (e.d1 + d.d1 * lu);
    dA += uk * (e.d2 + d.d2 * lu);
    uk *= u;
  }
  const ub = Math.exp(b * lu);
  out[0] = -1;
  out[1] = 2 * Math.PI * f;
  out[2] = dMc + beta * (b / 3) * ub;
  out[3] = dMass;
  out[4] = dS;
  out[5] = dA;
  out[6] = ub;
}
