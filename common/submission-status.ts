import type { SubmissionStatus } from "./theory-entry.ts";

/**
 * The one name of each review state, used by every page, e-mail and the API document: the word a
 * person reads is the API's value with its underscore dropped, so nothing has two names.
 */
export const SUBMISSION_STATUS_LABELS: Readonly<Record<SubmissionStatus, string>> = {
  draft: "draft",
  submitted: "submitted",
  in_review: "in review",
  returned: "returned",
  resubmitted: "resubmitted",
  accepted: "accepted",
  withdrawn: "withdrawn",
};

export function statusLabel(status: SubmissionStatus): string {
  return SUBMISSION_STATUS_LABELS[status];
}
