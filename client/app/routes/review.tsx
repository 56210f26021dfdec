import { Link, useParams } from "react-router-dom";
import { useAuth } from "../../features/auth/components/auth-context.tsx";
import { RequireAuth } from "../../features/auth/components/require-auth.tsx";
import { useReviewSubmission } from "../../features/review/api/get-review-submission.ts";
import { CommentsThread } from "../../features/review/components/comments-thread.tsx";
import { DecisionPanel } from "../../features/review/components/decision-panel.tsx";
import { EntryPreview } from "../../features/review/components/entry-preview.tsx";
import { ReviewDiffs } from "../../features/review/components/review-diffs.tsx";
import { Badge } from "../../components/ui/badge.tsx";
import { CheckBadge } from "../../components/ui/check-list.tsx";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";
import { paths } from "../../lib/paths.ts";
import { statusLabel } from "../../../common/submission-status.ts";

function Review({ id }: { id: number }) {
  const { user } = useAuth();
  const sub = useReviewSubmission(id);
  if (sub.isPending) return <Loading what={`submission ${id}`} />;
  if (sub.isError) return <ErrorNote error={sub.error} retry={() => void sub.refetch()} />;
  const s = sub.data;
  return (
    <div>
      <nav aria-label="Breadcrumb" className="text-sm mb-2">
        <Link to={paths.reviewQueue()}>Review queue</Link> <span className="text-ink-faint">/</span> <span className="text-ink-soft">#{s.id}</span>
      </nav>
      <h1 className="text-3xl leading-tight" data-page-title={`Review of submission ${s.id}: ${s.name}`}>
        {s.name}
      </h1>
      <p className="mt-1 flex flex-wrap items-center gap-3 text-sm text-ink-soft tabular-nums">
        <span>by {s.author.name}</span>
        <Badge tone="info">{statusLabel(s.status)}</Badge>
        <span>version {s.version}</span>
        <span>{s.target_slug ? `changes “${s.target_slug}” (now at revision ${s.target_revision ?? "?"})` : "a new entry"}</span>
        <CheckBadge outcome={s.checks.failures > 0 ? "failed" : s.checks.warnings > 0 ? "warning" : "ok"} title={`${s.checks.failures} failed, ${s.checks.warnings} warnings`} />
        {s.status === "in_review" || s.status === "submitted" || s.status === "resubmitted" ? (
          <Link to={paths.editSubmission(s.id)}>edit it</Link>
        ) : null}
      </p>
      <div className="mt-8">
        <ReviewDiffs submission={s} />
      </div>
      <div className="mt-10 grid gap-10 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="flex flex-col gap-10 min-w-0">
          <section>
            <h2 className="text-xl mb-2">The submitted entry</h2>
            <EntryPreview entry={s.theory} checks={s.checks} />
          </section>
        </div>
        <aside className="flex flex-col gap-10 min-w-0">
          <section className="rounded border border-sea/30 bg-sea-wash/40 p-4">
            <h2 className="text-xl mb-3">Decision</h2>
            <DecisionPanel submission={s} ownSubmission={user?.login === s.author.login} />
          </section>
          <CommentsThread id={s.id} />
        </aside>
      </div>
    </div>
  );
}

export function Component() {
  const { id } = useParams();
  const n = Number(id);
  return <RequireAuth role="editor">{Number.isInteger(n) && n > 0 ? <Review id={n} /> : <ErrorNote error={new Error(`“${id}” is not a submission number.`)} />}</RequireAuth>;
}
