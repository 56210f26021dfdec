import type { ExportFormat } from "../../../../common/sheets.ts";

const FORMATS: { format: ExportFormat; label: string; hint: string }[] = [
  { format: "latex", label: "LaTeX table", hint: "booktabs; plain scientific numbers" },
  { format: "bibtex", label: "BibTeX", hint: "every reference the limits cite" },
  { format: "csv", label: "CSV", hint: "one row per record and theory" },
  { format: "json", label: "JSON", hint: "the sheet with its translations" },
];

/** Plain links: the browser downloads the file the server names (Content-Disposition), cookies and all. */
export function ExportLinks({ hrefFor }: { hrefFor: (format: ExportFormat) => string }) {
  return (
    <ul className="flex flex-wrap gap-3 text-sm" aria-label="Downloads" data-testid="sheet-exports">
      {FORMATS.map((f) => (
        <li key={f.format}>
          <a href={hrefFor(f.format)} download className="inline-flex items-baseline gap-1 rounded border border-sea/40 bg-paper px-2 py-1 no-underline hover:bg-sea-wash" data-testid={`export-${f.format}`}>
            <span className="font-semibold">{f.label}</span>
            <span className="text-xs text-ink-faint">{f.hint}</span>
          </a>
        </li>
      ))}
    </ul>
  );
}
