import type { CouplingDeclaration, DefinitionDeclaration } from "../expr/symbols.ts";

/** "evaluation": the checks that had not finished when the job's time limit stopped it. */
export type CheckName = "parse" | "symbols" | "dimension" | "gr_limit" | "pn_order" | "symmetry" | "derivation" | "propagation" | "evaluation";
/**
 * "inconclusive": the check could not finish (a time limit stopped it); ok is false but it is not a
 * failure: it says nothing about the expression and runs again on the next save.
 */
export type Severity = "error" | "warning" | "inconclusive";

export interface CheckResult {
  readonly name: CheckName;
  readonly ok: boolean;
  /** "warning" marks an ok check the contributor should still read; "error" a failed one. */
  readonly severity?: Severity;
  readonly message: string;
}

export type MappingTarget = "ppe_phase" | "ppe_amplitude" | "ringdown_frequency" | "ringdown_damping" | "remnant_mass" | "remnant_spin" | "validity";

export const MAPPING_TARGETS: readonly MappingTarget[] = [
  "ppe_phase",
  "ppe_amplitude",
  "ringdown_frequency",
  "ringdown_damping",
  "remnant_mass",
  "remnant_spin",
  "validity",
];

/** A relative PN order n and the coefficient (A, B or gamma) in declared symbols. */
export interface DerivationTerm {
  readonly order: number;
  readonly coefficient: string;
}

export interface DerivationInput {
  /** E(v) = -(1/2) M eta v^2 [1 + A v^(2p)]: order p, coefficient A. */
  readonly energy?: DerivationTerm;
  /** F(v) = (32/5) eta^2 v^10 [1 + B v^(2q)]: order q, coefficient B. */
  readonly flux?: DerivationTerm;
  /** df/dt = (df/dt)_GR [1 + gamma u^(2n)]: order n, coefficient gamma. */
  readonly frequency_drift?: DerivationTerm;
  /** A modified dispersion relation the signal propagates with (see PropagationInput). */
  readonly propagation?: PropagationInput;
}

/**
 * E^2 = p^2 + A p^alpha_md (c = 1) for the graviton: the coefficient is A / h^(2 - alpha_md), a power
 * of length L^(alpha_md - 2) with its sign (1/lambda_g^2 for a graviton mass, alpha_md = 0).
 */
export interface PropagationInput {
  readonly alpha_md: number;
  readonly coefficient: string;
  /** Relative PN order the contributor states; must be (3 alpha_md + 2) / 2 when given. */
  readonly order?: number;
}

export interface MappingInput {
  readonly expression: string;
  readonly target: MappingTarget;
  readonly b?: number;
  readonly a?: number;
  readonly pn_order?: number;
  readonly couplings: readonly CouplingDeclaration[];
  readonly definitions?: readonly DefinitionDeclaration[];
  readonly derivation?: DerivationInput;
}

export interface MappingReport {
  readonly ok: boolean;
  readonly checks: readonly CheckResult[];
  /** LaTeX of the expression as typed; null when it does not parse. */
  readonly latex: string | null;
}
