import type { SubmissionStatus } from "../../../../common/catalogue.ts";
import { Badge, type Tone } from "../../../components/ui/badge.tsx";

const tone: Record<SubmissionStatus, Tone> = {
  draft: "neutral",
  submitted: "info",
  resubmitted: "info",
  in_review: "info",
  returned: "caution",
  accepted: "ok",
  withdrawn: "neutral",
};

const label: Record<SubmissionStatus, string> = {
  draft: "draft",
  submitted: "submitted",
  resubmitted: "sent back",
  in_review: "in review",
  returned: "returned to author",
  accepted: "accepted",
  withdrawn: "withdrawn",
};

export function StatusBadge({ status }: { status: SubmissionStatus }) {
  return <Badge tone={tone[status]}>{label[status]}</Badge>;
}
