import { useId, useState } from "react";
import { decisionSchema, type SubmissionDetail } from "../../../../common/catalogue.ts";
import { Button } from "../../../components/ui/button.tsx";
import { checkLabel } from "../../../components/ui/check-list.tsx";
import { Caution, ErrorNote } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useDecide, useStartReview } from "../api/review-actions.ts";
import { statusLabel } from "../../../../common/submission-status.ts";

interface Props {
  submission: SubmissionDetail;
  /** The signed-in editor wrote this submission: the server refuses their decision, so we say so first. */
  ownSubmission: boolean;
}

/** The failed checks that block acceptance, in words ("mappings.0: Dimension — …"). */
export function blockingChecks(s: SubmissionDetail): string[] {
  return s.checks.results.filter((r) => !r.ok && r.severity === "error").map((r) => `${r.path}: ${checkLabel(r.name)} — ${r.message}`);
}

/** Checks stopped by their time limit: the server refuses to accept until a save re-runs them. */
export function inconclusiveChecks(s: SubmissionDetail): string[] {
  return s.checks.results.filter((r) => r.severity === "inconclusive").map((r) => `${r.path}: ${checkLabel(r.name)} — ${r.message}`);
}

export function DecisionPanel({ submission: s, ownSubmission }: Props) {
  const id = useId();
  const start = useStartReview(s.id);
  const decide = useDecide(s.id);
  const [comment, setComment] = useState("");
  const [commentError, setCommentError] = useState<string | undefined>();
  const blocking = blockingChecks(s);
  const unfinished = inconclusiveChecks(s);

  function send(decision: "accept" | "return") {
    const parsed = decisionSchema.safeParse({ decision, comment: comment.trim() || undefined });
    if (!parsed.success) {
      setCommentError(parsed.error.issues.find((i) => i.path[0] === "comment")?.message ?? parsed.error.issues[0]?.message);
      return;
    }
    setCommentError(undefined);
    decide.mutate(parsed.data, {
      onSuccess: () => setComment(""),
      onError: (err) => {
        if (err instanceof ApiError && err.fields.comment) setCommentError(err.fields.comment);
      },
    });
  }

  if (ownSubmission) {
    return (
      <Caution title="You wrote this submission">
        Another editor has to review it: nobody decides on their own work.
      </Caution>
    );
  }
  if (s.status === "submitted" || s.status === "resubmitted") {
    return (
      <div className="flex flex-col gap-2">
        <p className="text-sm text-ink-soft">Starting the review tells the author an editor is reading it; the decision comes after.</p>
        <div>
          <Button kind="primary" busy={start.isPending} onClick={() => start.mutate()}>
            Start review
          </Button>
        </div>
        {start.isError && <ErrorNote error={start.error} title="The review could not start." />}
      </div>
    );
  }
  if (s.status !== "in_review") {
    return <p className="text-sm text-ink-soft">This submission is {statusLabel(s.status)}; there is nothing to decide.</p>;
  }
  return (
    <div className="flex flex-col gap-3">
      <label htmlFor={`${id}-comment`} className="text-sm font-semibold">
        Comment to the author
      </label>
      <textarea
        id={`${id}-comment`}
        rows={4}
        value={comment}
        onChange={(e) => setComment(e.target.value)}
        aria-invalid={Boolean(commentError)}
        aria-describedby={commentError ? `${id}-err` : `${id}-hint`}
        className="rounded border border-paper-edge bg-white/70 px-2 py-1.5 text-[0.95rem] aria-[invalid=true]:border-brick"
      />
      {commentError ? (
        <p id={`${id}-err`} role="alert" className="text-sm text-brick">
          comment {commentError}
        </p>
      ) : (
        <p id={`${id}-hint`} className="text-xs text-ink-faint">
          Required when returning; optional when accepting. The author receives it by e-mail.
        </p>
      )}
      {blocking.length > 0 && (
        <div role="note" className="rounded border border-brick/40 bg-brick-wash p-3 text-sm" data-testid="accept-blocked">
          <p className="font-semibold text-brick">Accepting is not possible while a check fails:</p>
          <ul className="mt-1 list-disc pl-5">
            {blocking.map((b) => (
              <li key={b}>{b}</li>
            ))}
          </ul>
        </div>
      )}
      {unfinished.length > 0 && (
        <div role="note" className="rounded border border-paper-edge bg-paper-deep p-3 text-sm" data-testid="accept-inconclusive">
          <p className="font-semibold">Accepting is not possible while a check is inconclusive (it was stopped by its time limit):</p>
          <ul className="mt-1 list-disc pl-5">
            {unfinished.map((b) => (
              <li key={b}>{b}</li>
            ))}
          </ul>
          <p className="mt-1 text-ink-soft">Saving the submission runs the checks again.</p>
        </div>
      )}
      <div className="flex flex-wrap gap-3">
        <Button kind="primary" disabled={blocking.length > 0 || unfinished.length > 0} busy={decide.isPending && decide.variables?.decision === "accept"} onClick={() => send("accept")}>
          Accept and publish
        </Button>
        <Button kind="danger" busy={decide.isPending && decide.variables?.decision === "return"} onClick={() => send("return")}>
          Return to the author
        </Button>
      </div>
      {decide.isError && !commentError && <ErrorNote error={decide.error} title="The decision was not recorded." />}
    </div>
  );
}
