/**
 * The one verdict rule of the translator, for every bound kind (inspiral phase, ringdown, remnant):
 * a validity condition at a limit holds (ok), is a rule of thumb exceeded by at most
 * RULE_OF_THUMB_STRETCH (stretched: kept as valid, with a caution), or fails. The limit is valid when
 * nothing fails, outside its validity when something does (the worst failure is reported), and not
 * assessed when no condition could be evaluated for this input.
 */
import { RULE_OF_THUMB_STRETCH } from "../../common/convert.ts";
import type { ValidityKind, ValidityResult, Verdict } from "./convert-types.ts";

export interface ConditionInput {
  readonly label: string;
  readonly condition: string;
  readonly max: number;
  readonly kind: ValidityKind;
  readonly reference?: string | undefined;
}

/** How one condition fares at value (NaN or infinite: fails). */
export function judgeCondition(c: ConditionInput, value: number): ValidityResult {
  const ok = Number.isFinite(value) && value <= c.max;
  const factor = c.max > 0 && Number.isFinite(value) ? value / c.max : Number.NaN;
  const status = ok ? "ok" : c.kind === "rule_of_thumb" && factor <= RULE_OF_THUMB_STRETCH ? "stretched" : "fails";
  return {
    label: c.label,
    condition: c.condition,
    value,
    max: c.max,
    ok,
    kind: c.kind,
    factor,
    status,
    ...(c.reference ? { reference: c.reference } : {}),
  };
}

/**
 * valid: every assessed condition holds (stretched counts as holding); outside_validity: one fails;
 * not_assessed: no condition applies, or some could not be evaluated (`unassessed` > 0) and none fails.
 */
export function verdictOf(validity: readonly ValidityResult[], unassessed = 0): { verdict: Verdict; failing: ValidityResult | null } {
  const failures = validity.filter((v) => v.status === "fails");
  if (failures.length > 0) {
    const worst = failures.reduce((a, v) => (!(a.factor >= v.factor) ? v : a));
    return { verdict: "outside_validity", failing: worst };
  }
  if (validity.length === 0 || unassessed > 0) return { verdict: "not_assessed", failing: null };
  return { verdict: "valid", failing: null };
}
