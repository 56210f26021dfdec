import type { SubmissionStatus } from "../../../common/catalogue.ts";
import { ConflictError } from "../../errors.ts";

/**
 * The review process as data: which action may move a submission from which state, and to where.
 * Who may act (author, editor) is the service's business; this table only knows states.
 *
 *   draft -submit-> submitted -start_review-> in_review -accept-> accepted
 *                                                       -return-> returned -submit-> resubmitted -start_review-> in_review ...
 *   draft | submitted | resubmitted | returned -withdraw-> withdrawn
 */
export type SubmissionAction = "save" | "submit" | "start_review" | "accept" | "return" | "withdraw";

const TRANSITIONS: Record<Exclude<SubmissionAction, "save">, Partial<Record<SubmissionStatus, SubmissionStatus>>> = {
  submit: { draft: "submitted", returned: "resubmitted" },
  start_review: { submitted: "in_review", resubmitted: "in_review" },
  accept: { in_review: "accepted" },
  return: { in_review: "returned" },
  withdraw: { draft: "withdrawn", submitted: "withdrawn", resubmitted: "withdrawn", returned: "withdrawn" },
};

/** States in which the author may save a new version, and those in which an editor may. */
export const AUTHOR_EDITABLE: readonly SubmissionStatus[] = ["draft", "returned"];
export const EDITOR_EDITABLE: readonly SubmissionStatus[] = ["submitted", "resubmitted", "in_review"];

const ACTION_WORDS: Record<SubmissionAction, string> = {
  save: "save changes to",
  submit: "submit",
  start_review: "start reviewing",
  accept: "accept",
  return: "return",
  withdraw: "withdraw",
};

export function allowedFrom(action: Exclude<SubmissionAction, "save">): SubmissionStatus[] {
  return Object.keys(TRANSITIONS[action]) as SubmissionStatus[];
}

export function illegalTransition(action: SubmissionAction, current: SubmissionStatus, allowed: readonly SubmissionStatus[]): ConflictError {
  return new ConflictError(
    `Cannot ${ACTION_WORDS[action]} a submission that is ${current.replace("_", " ")}; that needs it to be ${allowed.map((s) => s.replace("_", " ")).join(" or ")}.`,
    { current_status: current, attempted_action: action, allowed_from: [...allowed] },
  );
}

/** The state after `action`, or a 409 naming the current state and the attempted action. */
export function nextStatus(action: Exclude<SubmissionAction, "save">, current: SubmissionStatus): SubmissionStatus {
  const next = TRANSITIONS[action][current];
  if (!next) throw illegalTransition(action, current, allowedFrom(action));
  return next;
}
