import { RequireAuth } from "../../features/auth/components/require-auth.tsx";
import { useReviewQueue } from "../../features/review/api/get-review-queue.ts";
import { ReviewQueueTable } from "../../features/review/components/review-queue-table.tsx";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";

function Queue() {
  const queue = useReviewQueue();
  if (queue.isPending) return <Loading what="the review queue" />;
  if (queue.isError) return <ErrorNote error={queue.error} retry={() => void queue.refetch()} />;
  return <ReviewQueueTable submissions={queue.data.submissions} />;
}

export function Component() {
  return (
    <RequireAuth role="editor">
      <h1 className="text-3xl mb-2">Review queue</h1>
      <p className="mb-6 max-w-prose text-ink-soft">Submissions submitted, resubmitted after a return, or in review now. Open one to read it, its checks and its diff.</p>
      <Queue />
    </RequireAuth>
  );
}
