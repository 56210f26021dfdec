import { formatBibtexFile, type BibReference } from "../../../common/bibtex.ts";
import type { BibliographyEntry } from "../../../common/convert.ts";
import type { ExportFormat, Sheet } from "../../../common/sheets.ts";
import { sheetToCsv } from "./export-csv.ts";
import { sheetToLatex } from "./export-latex.ts";
import { fileStem } from "./export-stem.ts";

/** A sheet as a downloadable file in one of the export formats. */
export interface ExportFile {
  body: string;
  contentType: string;
  filename: string;
}

/** Every reference the sheet's limits cite (mapping sources and the published bounds compared with). Consistency results cite none. */
export function sheetBibliography(sheet: Sheet): BibliographyEntry[] {
  const cited = new Set<string>();
  const details = new Map<string, BibliographyEntry>();
  for (const record of sheet.records) {
    if (record.kind === "translation") {
      for (const r of record.translation.results) {
        for (const c of r.references) cited.add(c.key);
        for (const c of r.reference_bounds) cited.add(c.reference.key);
      }
      for (const entry of record.translation.bibliography) if (!details.has(entry.key)) details.set(entry.key, entry);
    } else if (record.kind === "ringdown") {
      for (const r of record.translation.results) {
        for (const c of r.references) cited.add(c.key);
        for (const c of r.reference_bounds) cited.add(c.reference.key);
      }
      for (const entry of record.translation.bibliography) if (!details.has(entry.key)) details.set(entry.key, entry);
    } else if (record.kind === "samples_job" || record.kind === "stack") {
      // The mapping's sources, copied from the catalogue when the result was saved.
      for (const entry of record.references) {
        cited.add(entry.key);
        if (!details.has(entry.key)) details.set(entry.key, entry);
      }
    }
  }
  return [...cited].flatMap((key) => details.get(key) ?? []).sort((a, b) => a.key.localeCompare(b.key));
}

function toBibReference(e: BibliographyEntry): BibReference {
  return {
    key: e.key,
    authors: e.authors,
    title: e.title,
    year: e.year,
    ...(e.journal ? { journal: e.journal } : {}),
    ...(e.volume ? { volume: e.volume } : {}),
    ...(e.pages ? { pages: e.pages } : {}),
    ...(e.arxiv ? { arxiv: e.arxiv } : {}),
    ...(e.doi ? { doi: e.doi } : {}),
  };
}

export function sheetToBibtex(sheet: Sheet): string {
  const refs = sheetBibliography(sheet).map(toBibReference);
  const header = `% References cited by the limits of "${sheet.name.replace(/[\r\n]+/g, " ")}", exported by Dragoman.\n\n`;
  return header + (refs.length ? formatBibtexFile(refs) : "% (no references)\n");
}

export function sheetToJson(sheet: Sheet, exportedAt: Date): string {
  const { share_token: _token, ...rest } = sheet;
  return `${JSON.stringify({ format: "dragoman-sheet", format_version: 2, exported_at: exportedAt.toISOString(), sheet: rest }, null, 2)}\n`;
}

export function exportSheet(sheet: Sheet, format: ExportFormat, options: { digits: number; now: Date }): ExportFile {
  const stem = fileStem(sheet.name);
  switch (format) {
    case "csv":
      return { body: sheetToCsv(sheet), contentType: "text/csv; charset=utf-8", filename: `${stem}.csv` };
    case "json":
      return { body: sheetToJson(sheet, options.now), contentType: "application/json; charset=utf-8", filename: `${stem}.json` };
    case "latex":
      return { body: sheetToLatex(sheet, { digits: options.digits }), contentType: "application/x-tex; charset=utf-8", filename: `${stem}.tex` };
    case "bibtex":
      return { body: sheetToBibtex(sheet), contentType: "application/x-bibtex; charset=utf-8", filename: `${stem}.bib` };
  }
}
