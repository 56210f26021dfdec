import type { SubmissionStatus } from "../../../../common/catalogue.ts";
import { Badge, type Tone } from "../../../components/ui/badge.tsx";
import { statusLabel } from "../../../../common/submission-status.ts";

const tone: Record<SubmissionStatus, Tone> = {
  draft: "neutral",
  submitted: "info",
  resubmitted: "info",
  in_review: "info",
  returned: "caution",
  accepted: "ok",
  withdrawn: "neutral",
};


export function StatusBadge({ status }: { status: SubmissionStatus }) {
  return <Badge tone={tone[status]}>{statusLabel(status)}</Badge>;
}
