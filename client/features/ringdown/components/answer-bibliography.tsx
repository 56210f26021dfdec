import { useId, useState } from "react";
import { formatBibtexFile, type BibReference } from "../../../../common/bibtex.ts";
import type { BibliographyEntry } from "../../../../common/convert.ts";
import { Button } from "../../../components/ui/button.tsx";
import { authorList } from "../../catalogue/components/format.ts";

function toBib(r: BibliographyEntry): BibReference {
  const ref: BibReference = { key: r.key, authors: r.authors, title: r.title, year: r.year };
  if (r.arxiv) ref.arxiv = r.arxiv;
  if (r.doi) ref.doi = r.doi;
  if (r.journal) ref.journal = r.journal;
  if (r.volume) ref.volume = r.volume;
  if (r.pages) ref.pages = r.pages;
  return ref;
}

/** The references an answer cites, and all of them as one BibTeX block to copy (keys as the answer cites them). */
export function AnswerBibliography({ entries, testId }: { entries: readonly BibliographyEntry[]; testId?: string }) {
  const [open, setOpen] = useState(false);
  const [copied, setCopied] = useState<"yes" | "no" | undefined>();
  const id = useId();
  if (entries.length === 0) return null;
  const bibtex = formatBibtexFile(entries.map(toBib));
  return (
    <section aria-labelledby={`${id}-title`} className="flex flex-col gap-2 text-sm" data-testid={testId}>
      <h3 id={`${id}-title`} className="text-lg">
        References
      </h3>
      <ul className="flex flex-col gap-1">
        {entries.map((r) => (
          <li key={r.key}>
            {authorList(r.authors)} ({r.year}). <span className="italic">{r.title}</span>
            {r.journal ? `. ${r.journal}` : ""}
            {r.arxiv && <span className="ml-1 text-ink-soft">arXiv:{r.arxiv}</span>}
          </li>
        ))}
      </ul>
      <div className="flex items-center gap-3">
        <Button
          kind="quiet"
          aria-expanded={open}
          onClick={() => {
            setOpen((v) => !v);
            if (!open) {
              void navigator.clipboard
                ?.writeText(bibtex)
                .then(() => setCopied("yes"))
                .catch(() => setCopied("no"));
            }
          }}
        >
          {open ? "hide BibTeX" : "BibTeX of these references"}
        </Button>
        {open && (
          <span className="text-xs text-ink-faint" role="status">
            {copied === "yes" ? "copied to the clipboard" : copied === "no" ? "select and copy it below" : ""}
          </span>
        )}
      </div>
      {open && (
        <pre className="max-h-64 overflow-auto rounded border border-paper-edge bg-paper p-2 font-mono text-xs" data-testid={testId ? `${testId}-bibtex` : undefined} tabIndex={0}>
          {bibtex}
        </pre>
      )}
    </section>
  );
}
