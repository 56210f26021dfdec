import type { SubmissionDetail } from "../../../../common/catalogue.ts";
import { formatDateTime } from "../../../../common/dates.ts";
import { changesFromDiff, DiffView } from "../../../components/ui/diff-view.tsx";
import { ScrollBox } from "../../../components/ui/scroll-box.tsx";

/**
 * What a reviewer compares: for a resubmission, what the author changed since the version an editor
 * returned, beside what the submission changes in the published revision. On a wide screen the two
 * sit side by side; on a narrow one the change since the return comes first.
 */
export function ReviewDiffs({ submission: s }: { submission: SubmissionDetail }) {
  const since = s.since_returned;
  const panels = [
    since && (
      <section key="since" data-testid="since-returned" className="min-w-0">
        <h2 className="text-xl mb-1">Changes since the returned version {since.version}</h2>
        <p className="mb-2 text-sm text-ink-soft">
          {since.returned_by ? `${since.returned_by.name} returned` : "Returned"} version {since.version} on {formatDateTime(since.returned_at)}; this is version {s.version}.
        </p>
        <ScrollBox label={`Changes since the returned version ${since.version}`} className="rounded border border-amber/40 bg-white/40 p-3">
          {since.diff ? (
            <DiffView changes={changesFromDiff(since.diff)} testId="review-diff-since-returned" />
          ) : (
            <p className="text-sm text-ink-soft">Version {since.version} was saved before Dragoman kept every version, so the changes since it cannot be shown. The comment thread says what was asked.</p>
          )}
        </ScrollBox>
      </section>
    ),
    s.diff && (
      <section key="published" className="min-w-0">
        <h2 className="text-xl mb-1">Changes against the published revision {s.target_revision}</h2>
        <p className="mb-2 text-sm text-ink-soft">Everything this submission would change in the catalogue if accepted.</p>
        <ScrollBox label={`Changes against the published revision ${s.target_revision}`} className="rounded border border-paper-edge bg-white/40 p-3">
          <DiffView changes={changesFromDiff(s.diff)} testId="review-diff" />
        </ScrollBox>
      </section>
    ),
  ].filter(Boolean);
  if (panels.length === 0) return null;
  return <div className={panels.length === 2 ? "grid gap-8 xl:grid-cols-2" : ""}>{panels}</div>;
}
