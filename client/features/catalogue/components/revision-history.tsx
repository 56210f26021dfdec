import { useState } from "react";
import { Button } from "../../../components/ui/button.tsx";
import { changesFromDiff, DiffView } from "../../../components/ui/diff-view.tsx";
import { ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { useRevision, useRevisions } from "../api/get-revisions.ts";
import { shortDate } from "./format.ts";

function RevisionDiff({ slug, n }: { slug: string; n: number }) {
  const rev = useRevision(slug, n);
  if (rev.isPending) return <Loading what={`the changes of revision ${n}`} />;
  if (rev.isError) return <ErrorNote error={rev.error} retry={() => void rev.refetch()} />;
  return (
    <div className="mt-2 rounded border border-paper-edge bg-paper p-3">
      {n === 1 && <p className="mb-2 text-sm text-ink-soft">The first revision: everything in it is new.</p>}
      <DiffView changes={changesFromDiff(rev.data.diff)} testId={`revision-diff-${n}`} />
    </div>
  );
}

export function RevisionHistory({ slug, current }: { slug: string; current: number }) {
  const revs = useRevisions(slug);
  const [open, setOpen] = useState<number | undefined>();
  if (revs.isPending) return <Loading what="the revision history" />;
  if (revs.isError) return <ErrorNote error={revs.error} retry={() => void revs.refetch()} />;
  const list = [...revs.data.revisions].sort((a, b) => b.number - a.number);
  return (
    <ol className="flex flex-col gap-2" data-testid="revision-history">
      {list.map((r) => (
        <li key={r.number} className="border-b border-paper-edge/70 pb-2 last:border-b-0" data-testid={`revision-${r.number}`}>
          <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1 text-[0.95rem]">
            <span className="font-semibold tabular-nums">Revision {r.number}</span>
            {r.number === current && <span className="text-xs uppercase tracking-wide text-moss">current</span>}
            <span className="tabular-nums text-ink-soft">{shortDate(r.published_at)}</span>
            <span className="text-ink-soft">
              {r.authors.length > 0 ? `written by ${joinNames(r.authors.map((a) => a.name))}` : r.author ? `proposed by ${r.author.name}` : "seeded"}
              {r.accepted_by ? `, accepted by ${r.accepted_by.name}` : ""}
            </span>
            <span className="tabular-nums text-ink-faint text-sm">
              {r.change_count} change{r.change_count === 1 ? "" : "s"}
            </span>
            <Button kind="quiet" aria-expanded={open === r.number} onClick={() => setOpen(open === r.number ? undefined : r.number)}>
              {open === r.number ? "hide changes" : "show changes"}
            </Button>
          </div>
          {open === r.number && <RevisionDiff slug={slug} n={r.number} />}
        </li>
      ))}
    </ol>
  );
}

/** "A", "A and B", "A, B and C". */
function joinNames(names: string[]): string {
  return names.length <= 1 ? (names[0] ?? "") : `${names.slice(0, -1).join(", ")} and ${names[names.length - 1]}`;
}
