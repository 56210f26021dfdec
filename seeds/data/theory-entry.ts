/**
 * The shape of one catalogue entry: a theory, its couplings and conventions, and the mappings
 * from its coupling to ppE deviations, each with its validity conditions and sources.
 *
 * Expressions use the safe infix syntax of server/physics/expr (^ powers, explicit *, sqrt exp
 * log abs sin cos, pi) in these symbols, lengths in km and masses source-frame:
 *   primitive: m1, m2 (m1 >= m2), chi1, chi2, s1, s2 (EdGB charge factors), sigma1, sigma2
 *   (scalar-tensor sensitivities), z, D_0, D_alpha (km), and the entry's couplings;
 *   standard definitions: M, eta, Mc, dm, q, chi_s, chi_a; plus the entry's own `definitions`.
 */

export type SourceStatus = "confirmed" | "derived" | "memory";
export type BodyKind = "bh" | "ns";
export type ValidityKind = "hard" | "rule_of_thumb";
export type QuotedFormName =
  | "identity"
  | "sqrt"
  | "per_year"
  | "micrometre"
  | "solar_mass_per_year"
  | "graviton_wavelength"
  | "dispersion_length";

export interface ReferenceEntry {
  /** Key used by mappings, bounds and conventions to cite this reference. */
  readonly key: string;
  readonly arxiv?: string;
  readonly doi?: string;
  readonly authors: string;
  readonly title: string;
  readonly year: number;
  readonly journal?: string;
  /** Where in the paper: equation, table, section. */
  readonly locator?: string;
  /** True when the bibliographic details were written from memory and need an editor's check. */
  readonly details_from_memory?: boolean;
}

export interface CouplingConventionEntry {
  readonly name: string;
  readonly action_latex?: string;
  /** coupling in the entry's reference convention = factor * coupling in this convention. */
  readonly factor: number;
  /** The same factor as an expression, for display. */
  readonly factor_expression?: string;
  readonly reference?: string;
  readonly source_status?: SourceStatus;
  readonly note?: string;
}

export interface CouplingEntry {
  readonly symbol: string;
  readonly latex: string;
  /** Dimension as a power of length: "L^2", "L", "L^-1", "1". */
  readonly dimension: string;
  /** Canonical unit the mappings take: "km^2", "km", "1/km", "1". */
  readonly unit: string;
  readonly description?: string;
  /** How the limit is quoted (e.g. sqrt(alpha) in km for alpha in km^2). */
  readonly quoted?: {
    readonly form: QuotedFormName;
    readonly symbol: string;
    readonly latex: string;
    readonly unit: string;
    readonly alpha_md?: number;
  };
  /** Name of the convention the mappings use. */
  readonly convention?: string;
  readonly conventions?: readonly CouplingConventionEntry[];
  /** Physical range: x > 0, x >= 0, or either sign (decides, per binary, whether beta has one sign). */
  readonly range: "positive" | "non_negative" | "any_sign";
  /** The coupling's value in general relativity. */
  readonly gr_value: "zero" | "infinity";
}

export interface DefinitionEntry {
  readonly symbol: string;
  readonly expression: string;
  readonly latex?: string;
  readonly description?: string;
}

export interface ValidityEntry {
  readonly expression: string;
  readonly max: number;
  readonly label: string;
  readonly kind?: ValidityKind;
  readonly reference?: string;
  readonly source_status?: SourceStatus;
  /** Only for body 1 or 2, and only when that body is of these kinds. */
  readonly body?: 1 | 2;
  readonly applies_to?: readonly BodyKind[];
}

/** How beta follows from a modified binding energy and flux (energy balance and the stationary-phase approximation), for the derive check. */
export interface DerivationInput {
  readonly kind: "energy_flux" | "frequency_drift" | "propagation";
  /** Relative PN order of the modification. */
  readonly order: number;
  /** E = E_GR [1 + A v^(2 order)]. */
  readonly A?: string;
  /** F = F_GR [1 + B v^(2 order)]. */
  readonly B?: string;
  /** df/dt = (df/dt)_GR [1 + gamma u^(b+5)]. */
  readonly gamma?: string;
  readonly note?: string;
}

export interface BodyRule {
  readonly kind: "charge" | "derived_for" | "only_for";
  readonly description: string;
  readonly bodies?: readonly BodyKind[];
  readonly reference?: string;
}

export interface MappingEntry {
  readonly kind: "inspiral_phase";
  readonly pn_order: number;
  readonly b: number;
  /** beta as an expression. */
  readonly expression: string;
  readonly latex?: string;
  /** The coupling this mapping constrains (default: the entry's first coupling). */
  readonly coupling?: string;
  /** Other couplings of the expression, held at these values. */
  readonly held_fixed?: Readonly<Record<string, number>>;
  /** Propagation effects: the distance measure D_alpha of this dispersion exponent. */
  readonly alpha_md?: number;
  readonly frame_note?: string;
  readonly derivation?: DerivationInput;
  /** The same correction as a gIMR deviation dphi_k, when it has one. */
  readonly gimr_equivalent?: { readonly k: number; readonly expression: string; readonly source_status: SourceStatus };
  readonly body_rules?: readonly BodyRule[];
  readonly validity?: readonly ValidityEntry[];
  /** Shown beside every translation with this mapping (where the number can mislead). */
  readonly caution?: string;
  readonly source_status: SourceStatus;
  readonly references?: readonly string[];
  readonly notes?: string;
}

export interface ReferenceBound {
  readonly coupling: string;
  /** In the quoted unit of the coupling. */
  readonly quoted_symbol: string;
  readonly value: number;
  readonly unit: string;
  readonly side: "upper" | "lower";
  readonly reference: string;
  readonly source_status: SourceStatus;
  readonly credibility?: number;
  readonly convention?: string;
  readonly note?: string;
}

export interface TheoryEntry {
  readonly slug: string;
  readonly name: string;
  readonly family: string;
  readonly summary: string;
  readonly action_latex?: string;
  readonly metric_latex?: string;
  readonly assumptions?: readonly string[];
  readonly couplings: readonly CouplingEntry[];
  readonly definitions?: readonly DefinitionEntry[];
  readonly mappings: readonly MappingEntry[];
  readonly references: readonly ReferenceEntry[];
  readonly reference_bounds?: readonly ReferenceBound[];
  /** Set when any mapping or bound rests on a [memory] formula: an editor must confirm it. */
  readonly needs_source_confirmation?: boolean;
}
