/**
 * The data the conversion core takes and returns (see convert.ts for the algorithm).
 */
import type { BodyKind } from "./binary.ts";
import type { Cosmology } from "./cosmology.ts";
import type { QuotedFormSpec, QuotedValue, Side } from "./quoted-forms.ts";
import type { GimrIndex, SignConvention } from "./taylorf2.ts";

export type Env = Readonly<Record<string, number>>;

export interface CouplingConvention {
  readonly name: string;
  /** alpha_reference = factor * alpha_this (the reference is the convention the mapping uses). */
  readonly factor: number;
  readonly reference?: string;
}

export interface CouplingSpec {
  readonly symbol: string;
  readonly latex: string;
  /** Canonical (geometric) unit of the coupling the mapping takes, e.g. "km^2", "km", "1/km", "1". */
  readonly unit: string;
  readonly quoted: QuotedFormSpec;
  /** Name of the convention the mapping uses (default "A"). */
  readonly convention?: string;
  readonly conventions?: readonly CouplingConvention[];
  /** Physical range of the coupling (default "positive": x > 0). */
  readonly range?: "positive" | "non_negative" | "any_sign";
  /** Value of the coupling in GR (default: found from the mapping, the end where beta vanishes). */
  readonly grValue?: "zero" | "infinity";
}

export type ValidityKind = "hard" | "rule_of_thumb";

export interface ValidityCondition {
  readonly label: string;
  /** Human-readable condition, e.g. "16 pi alpha^2 / m2^4 <= 1/6". */
  readonly condition: string;
  readonly evaluate: (coupling: number, env: Env) => number;
  readonly max: number;
  readonly kind: ValidityKind;
  readonly reference?: string;
  /** Evaluate only when body `body` is one of `appliesTo` (e.g. horizon conditions: black holes). */
  readonly body?: 1 | 2;
  readonly appliesTo?: readonly BodyKind[];
}

/**
 * Which part of the waveform a mapping gives: the phase (beta at b) or the amplitude (alpha at a,
 * held in `b`). A distance ratio d_L^GW/d_L^EM = r is the amplitude term at a = 0: alpha = 1/r - 1.
 */
export type MappingChannel = "phase" | "amplitude";

export interface MappingSpec {
  /** The ppE exponent: b for the phase, a for the amplitude. */
  readonly b: number;
  /** Default "phase". */
  readonly channel?: MappingChannel;
  readonly coupling: CouplingSpec;
  /** beta as a function of the canonical coupling and the binary's symbols. */
  readonly evaluate: (coupling: number, env: Env) => number;
  /** Optional fast path: the same function with the environment bound once. */
  readonly bind?: (env: Env) => (coupling: number) => number;
  /** Symbols that must be present in the environment (e.g. "D_0", "sigma2"). */
  readonly requires?: readonly string[];
  /** Propagation effect: the environment gets D_alpha (km) for this exponent, and D_0 when it is 0. */
  readonly distance?: { readonly alphaMd: number };
  readonly validity?: readonly ValidityCondition[];
  /** Bodies the formula was derived for; other bodies get a caution. */
  readonly derivedFor?: readonly BodyKind[];
  /** The mapping answers only when every body is one of these; otherwise the binary is not covered. */
  readonly onlyFor?: { readonly bodies: readonly BodyKind[]; readonly description: string };
  readonly cautions?: readonly string[];
  /** Coupling range searched by the numeric inversion, canonical units. */
  readonly domain?: readonly [number, number];
}

export type BoundInput =
  | {
      readonly kind: "ppe";
      readonly b: number;
      /** Symmetric bound |beta| <= beta_max ... */
      readonly beta_max?: number;
      /** ... or an interval [low, high] containing 0 (null = unbounded on that side). */
      readonly interval?: readonly [number | null, number | null];
      readonly convention?: SignConvention;
      readonly credibility?: number;
    }
  | {
      /** ppE amplitude: a bound on alpha in h = h_GR (1 + alpha u^a). */
      readonly kind: "amplitude";
      readonly a: number;
      readonly alpha_max?: number;
      readonly interval?: readonly [number | null, number | null];
      readonly credibility?: number;
    }
  | {
      readonly kind: "gimr";
      readonly k: GimrIndex;
      readonly dphi_max?: number;
      readonly interval?: readonly [number | null, number | null];
      readonly includes_spin?: boolean;
      readonly credibility?: number;
    };

export interface ValidityResult {
  readonly label: string;
  readonly condition: string;
  readonly value: number;
  readonly max: number;
  readonly ok: boolean;
  readonly kind: ValidityKind;
  /** value / max (NaN when the value is not a number). */
  readonly factor: number;
  /** ok; stretched: a rule of thumb exceeded by at most the stretch factor; fails. */
  readonly status: "ok" | "stretched" | "fails";
  readonly reference?: string;
}

export type Verdict = "valid" | "outside_validity" | "not_assessed";

/** The interval on a coupling of either sign, in its signed quoted quantity (null = unbounded). */
export interface SignedInterval {
  readonly symbol: string;
  readonly latex: string;
  readonly unit: string;
  readonly lower: number | null;
  readonly upper: number | null;
}

export interface BoundedResult {
  readonly status: "bounded";
  readonly side: Side;
  readonly coupling: { readonly symbol: string; readonly latex: string; readonly value: number; readonly unit: string };
  readonly quoted: QuotedValue;
  readonly extras: readonly QuotedValue[];
  readonly conventions: readonly { readonly name: string; readonly quoted: QuotedValue; readonly factor: number }[];
  readonly method: "closed_form" | "numeric_root";
  /** For a power law: |beta| = prefactor * coupling^power (canonical units). */
  readonly power?: number;
  readonly prefactor?: number;
  readonly latex: string;
  readonly b: number;
  /** The |beta| the limit saturates (after sign conventions and one-signed theories). */
  readonly beta_max: number;
  /** Sign of beta predicted by the theory for this binary over the coupling's range (0: either sign). */
  readonly theory_sign: -1 | 0 | 1;
  /** The bound on beta in the +Psi convention (null = unbounded side). */
  readonly beta_interval: readonly [number | null, number | null];
  /** Which end of the interval bounded the coupling. */
  readonly side_used: "lower" | "upper" | "both";
  /** For a coupling of either sign, the signed interval; null otherwise. */
  readonly signed_interval: SignedInterval | null;
  /** True when the headline is one end of the signed interval rather than a bound on the magnitude. */
  readonly signed_headline: boolean;
  readonly beta_at_limit: number;
  readonly validity: readonly ValidityResult[];
  readonly verdict: Verdict;
  /** The worst failing condition when the verdict is outside_validity. */
  readonly failing: ValidityResult | null;
  /** verdict === "valid". */
  readonly valid: boolean;
  readonly warnings: readonly string[];
  readonly cautions: readonly string[];
}

export type NoConstraintCode =
  | "vanishing_mapping"
  | "coupling_independent"
  | "degenerate_b"
  | "no_ppe_equivalent"
  | "interval_excludes_gr"
  | "unreachable_side"
  | "bodies_not_covered"
  | "out_of_range";

export interface NoConstraintResult {
  readonly status: "no_constraint";
  readonly code: NoConstraintCode;
  readonly reason: string;
  readonly warnings: readonly string[];
  readonly cautions: readonly string[];
}

export type ConversionResult = BoundedResult | NoConstraintResult;

export interface ConvertOptions {
  readonly cosmology?: Cosmology;
  /** Lowest frequency of the analysis band (Hz, observed); default 20 Hz (common practice). */
  readonly fLowHz?: number;
}
