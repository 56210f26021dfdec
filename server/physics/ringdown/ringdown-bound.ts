/**
 * Translates a bound on a fractional QNM shift (frequency or damping time of one mode) into limits on
 * a theory's coupling through its ringdown mapping F(x), around the coupling's GR value x = 0.
 *
 * The bound is a set of allowed shifts: |delta| <= U (upper) or lo <= delta <= hi (interval). The
 * coupling's limits are where F(x) first leaves that set, searched on each side of x = 0 that the
 * coupling's physical range allows. A side on which F never leaves the set (F has one sign there and
 * the bound's other side is the only one it could reach, or F saturates) is not constrained: that is
 * said, never turned into a limit.
 */
import { PhysicsInputError } from "../input-error.ts";
import type { ValidityResult, Verdict } from "../convert-types.ts";
import { judgeCondition, verdictOf } from "../verdict.ts";
import type { CompiledRingdownMapping, RingdownValidity } from "./ringdown-mapping.ts";

/** |shift| <= upper, or lo <= shift <= hi with a null end meaning unbounded on that side. */
export type ShiftBound = { readonly upper: number } | { readonly interval: readonly [number | null, number | null] };

export type { Verdict };

/** A condition that could not be evaluated at the limit (it needs the binary, or has no finite value). */
export interface UnassessedCondition {
  readonly label: string;
  readonly condition: string;
  readonly reason: string;
}

export interface SideLimit {
  /** The coupling at the limit, in its canonical unit. */
  readonly value: number;
  /** The shift the theory predicts there (equals the bound's edge). */
  readonly shift: number;
  readonly verdict: Verdict;
  /** The worst failing condition when outside validity. */
  readonly failing: ValidityResult | null;
  readonly validity: ValidityResult[];
  readonly unassessed: UnassessedCondition[];
}

export interface RingdownTranslation {
  /** Limit for x < 0 (a lower limit), when that side is physical and constrained. */
  readonly lower: SideLimit | null;
  /** Limit for x > 0 (an upper limit). */
  readonly upper: SideLimit | null;
  /** Why a side gave no limit. */
  readonly unconstrained: { side: "negative" | "positive"; reason: string }[];
  readonly verdict: Verdict;
}

export function allowedSet(bound: ShiftBound): [number, number] {
  if ("upper" in bound) {
    if (!(bound.upper > 0)) throw new PhysicsInputError("bound.upper", "bound.upper must be positive: it bounds |shift|");
    return [-bound.upper, bound.upper];
  }
  const lo = bound.interval[0] ?? -Infinity;
  const hi = bound.interval[1] ?? Infinity;
  if (!(lo < hi)) throw new PhysicsInputError("bound.interval", "bound.interval must be [lo, hi] with lo < hi");
  if (lo > 0 || hi < 0) {
    throw new PhysicsInputError("bound.interval", "bound.interval excludes 0 (general relativity): that is a claimed deviation, not a bound a coupling limit can come from");
  }
  return [lo, hi];
}

/**
 * Evaluates the validity conditions of a mapping at coupling x, with the translator's verdict rule
 * (server/physics/verdict.ts): a rule of thumb failing by at most the stretch factor stays valid.
 */
export function assessValidity(
  conditions: readonly RingdownValidity[],
  x: number,
  env: Readonly<Record<string, number>>,
): { verdict: Verdict; failing: ValidityResult | null; validity: ValidityResult[]; unassessed: UnassessedCondition[] } {
  const validity: ValidityResult[] = [];
  const unassessed: UnassessedCondition[] = [];
  for (const c of conditions) {
    const missing = c.uses.filter((s) => env[s] === undefined);
    if (missing.length > 0) {
      unassessed.push({ label: c.label, condition: c.condition, reason: `needs ${missing.join(", ")}` });
      continue;
    }
    validity.push(judgeCondition(c, c.evaluate(x, env)));
  }
  const { verdict, failing } = verdictOf(validity, unassessed.length);
  return { verdict, failing, validity, unassessed };
}

const MIN_T = 1e-40;
const MAX_T = 1e40;
const STEPS_PER_DECADE = 4;

/** First t > 0 at which F(sign t) leaves [lo, hi], or a reason why there is none. */
function firstExit(F: (x: number) => number, sign: 1 | -1, lo: number, hi: number): { t: number; shift: number } | { reason: string } {
  const inside = (v: number) => v >= lo && v <= hi;
  let prev = MIN_T;
  const v0 = F(sign * prev);
  if (!Number.isFinite(v0)) return { reason: "the mapping has no finite value near the GR value on this side" };
  if (!inside(v0)) return { reason: "the mapping is already outside the bound arbitrarily close to the GR value" };
  const factor = 10 ** (1 / STEPS_PER_DECADE);
  for (let t = MIN_T * factor; t <= MAX_T; t *= factor) {
    const v = F(sign * t);
    if (!Number.isFinite(v)) return { reason: `the mapping has no finite value beyond |coupling| ~ ${prev.toPrecision(3)} on this side` };
    if (!inside(v)) {
      let a = prev;
      let b = t;
      for (let k = 0; k < 200 && b / a - 1 > 1e-13; k += 1) {
        const mid = Math.sqrt(a * b);
        if (inside(F(sign * mid))) a = mid;
        else b = mid;
      }
      const edge = F(sign * b) > hi ? hi : lo;
      return { t: b, shift: edge };
    }
    prev = t;
  }
  return { reason: "the theory's shift never leaves the bound on this side (it has the other sign there, or saturates)" };
}

export function translateRingdownBound(mapping: CompiledRingdownMapping, bound: ShiftBound, env: Readonly<Record<string, number>>): RingdownTranslation {
  const missing = mapping.uses.filter((s) => env[s] === undefined);
  if (missing.length > 0) throw new PhysicsInputError(missing[0]!, `the ringdown mapping of ${mapping.slug} needs ${missing.join(", ")}`);
  const [lo, hi] = allowedSet(bound);
  const F = (x: number) => mapping.evaluate(x, env);
  const sides: ("negative" | "positive")[] = mapping.coupling.range === "any_sign" ? ["negative", "positive"] : ["positive"];
  const unconstrained: { side: "negative" | "positive"; reason: string }[] = [];
  let lower: SideLimit | null = null;
  let upper: SideLimit | null = null;
  for (const side of sides) {
    const sign = side === "positive" ? 1 : -1;
    const exit = firstExit(F, sign, lo, hi);
    if ("reason" in exit) {
      unconstrained.push({ side, reason: exit.reason });
      continue;
    }
    const x = sign * exit.t;
    const v = assessValidity(mapping.validity, x, env);
    const limit: SideLimit = { value: x, shift: exit.shift, ...v };
    if (side === "positive") upper = limit;
    else lower = limit;
  }
  const limits = [lower, upper].filter((l): l is SideLimit => l !== null);
  const verdict: Verdict =
    limits.length === 0 ? "not_assessed" : limits.some((l) => l.verdict === "outside_validity") ? "outside_validity" : limits.every((l) => l.verdict === "valid") ? "valid" : "not_assessed";
  return { lower, upper, unconstrained, verdict };
}
