import { Badge } from "../../../components/ui/badge.tsx";
import { ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { useSubmissionComments } from "../api/get-submission.ts";

/** The editors' comments on a submission, newest last, so the author sees what to change. */
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
              <span className="font-semibold text-ink">{c.author.name}</span>, <span className="tabular-nums">{new Date(c.created_at).toLocaleString("en-GB")}</span>
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
    </section>
  );
}
