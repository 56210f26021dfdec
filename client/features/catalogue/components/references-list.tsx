import { useState } from "react";
import { formatBibtexReference, type BibReference } from "../../../../common/bibtex.ts";
import type { StoredReference } from "../../../../common/catalogue.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { authorList } from "./format.ts";

function toBib(r: StoredReference): BibReference {
  const ref: BibReference = { authors: r.authors, title: r.title, year: r.year };
  if (r.key) ref.key = r.key;
  if (r.arxiv) ref.arxiv = r.arxiv;
  if (r.doi) ref.doi = r.doi;
  if (r.journal) ref.journal = r.journal;
  if (r.volume) ref.volume = r.volume;
  if (r.pages) ref.pages = r.pages;
  return ref;
}

/** Clipboard access can be refused (insecure origin, permissions); the BibTeX stays visible either way. */
async function copy(text: string): Promise<boolean> {
  try {
    await navigator.clipboard.writeText(text);
    return true;
  } catch {
    return false;
  }
}

function ReferenceItem({ r }: { r: StoredReference }) {
  const [open, setOpen] = useState(false);
  const [copied, setCopied] = useState<"yes" | "no" | undefined>();
  const bibtex = formatBibtexReference(toBib(r));
  return (
    <li className="border-b border-paper-edge/70 pb-3 last:border-b-0" data-testid={`reference-${r.id}`}>
      <p>
        {authorList(r.authors)} ({r.year}). <span className="italic">{r.title}</span>
        {r.journal && (
          <span>
            . {r.journal}
            {r.volume && ` ${r.volume}`}
            {r.pages && `, ${r.pages}`}
          </span>
        )}
        .
        {r.arxiv && (
          <a className="ml-2 text-sm" href={`https://arxiv.org/abs/${r.arxiv}`} rel="noreferrer noopener" target="_blank">
            arXiv:{r.arxiv}
          </a>
        )}
        {r.doi && (
          <a className="ml-2 text-sm break-all" href={`https://doi.org/${r.doi}`} rel="noreferrer noopener" target="_blank">
            doi:{r.doi}
          </a>
        )}
      </p>
      {(r.locator || r.note) && <p className="text-sm text-ink-soft">{[r.locator, r.note].filter(Boolean).join(" — ")}</p>}
      <div className="mt-1 flex items-center gap-3">
        {r.details_from_memory && <Badge tone="caution">details from memory</Badge>}
        <Button
          kind="quiet"
          aria-expanded={open}
          onClick={() => {
            setOpen(true);
            void copy(bibtex).then((ok) => setCopied(ok ? "yes" : "no"));
          }}
        >
          cite (BibTeX)
        </Button>
        {open && (
          <span className="text-xs text-ink-faint" role="status">
            {copied === "yes" ? "copied to the clipboard" : copied === "no" ? "select and copy it below" : ""}
          </span>
        )}
      </div>
      {open && (
        <div className="mt-2">
          <pre className="overflow-x-auto rounded border border-paper-edge bg-paper p-2 font-mono text-xs" data-testid="bibtex" tabIndex={0}>
            {bibtex}
          </pre>
          <Button kind="quiet" onClick={() => setOpen(false)}>
            hide
          </Button>
        </div>
      )}
    </li>
  );
}

export function ReferencesList({ references }: { references: StoredReference[] }) {
  return (
    <ol className="flex flex-col gap-3 text-[0.95rem]">
      {references.map((r) => (
        <ReferenceItem key={r.id} r={r} />
      ))}
    </ol>
  );
}
