import { useId, useState } from "react";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useAddComment, useComments } from "../api/comments.ts";
import { formatDateTime } from "../../../../common/dates.ts";

export function CommentsThread({ id }: { id: number }) {
  const fieldId = useId();
  const comments = useComments(id);
  const add = useAddComment(id);
  const [body, setBody] = useState("");
  const fieldError = add.error instanceof ApiError ? add.error.fields.body : undefined;
  return (
    <section aria-labelledby={`${fieldId}-h`}>
      <h2 id={`${fieldId}-h`} className="text-xl mb-2">
        Comments
      </h2>
      {comments.isPending ? (
        <Loading what="comments" />
      ) : comments.isError ? (
        <ErrorNote error={comments.error} retry={() => void comments.refetch()} />
      ) : comments.data.comments.length === 0 ? (
        <p className="text-sm text-ink-faint">No comments yet.</p>
      ) : (
        <ol className="flex flex-col gap-3" data-testid="comments">
          {comments.data.comments.map((c) => (
            <li key={c.id} className="rounded border border-paper-edge bg-white/40 p-3">
              <p className="text-sm text-ink-soft">
                <span className="font-semibold text-ink">{c.author.name}</span> · <span className="tabular-nums">{formatDateTime(c.created_at)}</span>
                {c.kind !== "comment" && (
                  <Badge tone={c.kind === "returned" ? "caution" : "ok"} className="ml-2">
                    {c.kind}
                  </Badge>
                )}
              </p>
              <p className="mt-1 whitespace-pre-wrap">{c.body}</p>
            </li>
          ))}
        </ol>
      )}
      <form
        className="mt-3 flex flex-col gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          if (!body.trim()) return;
          add.mutate(body, { onSuccess: () => setBody("") });
        }}
      >
        <label htmlFor={`${fieldId}-body`} className="text-sm font-semibold">
          Add a comment
        </label>
        <textarea
          id={`${fieldId}-body`}
          rows={3}
          value={body}
          onChange={(e) => setBody(e.target.value)}
          aria-invalid={Boolean(fieldError)}
          className="rounded border border-paper-edge bg-white/70 px-2 py-1.5 text-[0.95rem] aria-[invalid=true]:border-brick"
        />
        {fieldError && <p className="text-sm text-brick">{fieldError}</p>}
        {add.isError && !fieldError && <ErrorNote error={add.error} title="The comment was not saved." />}
        <div>
          <Button type="submit" disabled={!body.trim()} busy={add.isPending}>
            Post comment
          </Button>
        </div>
      </form>
    </section>
  );
}
