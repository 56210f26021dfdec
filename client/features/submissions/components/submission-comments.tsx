import { useState } from "react";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { Field, TextArea } from "../../../components/ui/field.tsx";
import { ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useAddSubmissionComment } from "../api/add-comment.ts";
import { useSubmissionComments } from "../api/get-submission.ts";
import { formatDateTime } from "../../../../common/dates.ts";

/** The editors' comments on a submission, newest last, so the author sees what to change and can answer. */
export function SubmissionComments({ id }: { id: number }) {
  const comments = useSubmissionComments(id);
  if (comments.isPending) return <Loading what="comments" />;
  if (comments.isError) return <ErrorNote error={comments.error} />;
  if (comments.data.comments.length === 0) return null;
  return (
    <section aria-label="Comments" className="mb-6 rounded border border-amber/40 bg-amber-wash/60 p-4">
      <h2 className="text-lg mb-2">Comments</h2>
      <ol className="flex flex-col gap-3">
        {comments.data.comments.map((c) => (
          <li key={c.id} className="text-[0.95rem]">
            <p className="text-sm text-ink-soft">
              <span className="font-semibold text-ink">{c.author.name}</span>, <span className="tabular-nums">{formatDateTime(c.created_at)}</span>
              {c.kind !== "comment" && (
                <Badge tone={c.kind === "returned" ? "caution" : "ok"} className="ml-2">
                  {c.kind === "returned" ? "returned for changes" : "accepted"}
                </Badge>
              )}
            </p>
            <p className="whitespace-pre-wrap">{c.body}</p>
          </li>
        ))}
      </ol>
      <ReplyBox id={id} />
    </section>
  );
}

function ReplyBox({ id }: { id: number }) {
  const [body, setBody] = useState("");
  const add = useAddSubmissionComment(id);
  const error = add.error ? (add.error instanceof ApiError ? (add.error.fields.body ?? add.error.message) : add.error.message) : undefined;
  return (
    <form
      className="mt-4 flex flex-col gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        if (!body.trim()) return;
        add.mutate(body.trim(), { onSuccess: () => setBody("") });
      }}
    >
      <Field label="Answer the editors" error={error}>
        {(control) => <TextArea {...control} mono={false} rows={3} value={body} onChange={(e) => setBody(e.target.value)} />}
      </Field>
      <div>
        <Button type="submit" busy={add.isPending} disabled={!body.trim()}>
          Post answer
        </Button>
      </div>
    </form>
  );
}
