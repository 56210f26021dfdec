import type { z } from "zod";
import type { createSubmissionSchema } from "../../../../common/catalogue.ts";

/** The form edits exactly the POST body, so server error paths ("theory.mappings.0.b") are form paths. */
export type SubmissionFormInput = z.input<typeof createSubmissionSchema>;
export type SubmissionFormOutput = z.output<typeof createSubmissionSchema>;
export type EntryInput = SubmissionFormInput["theory"];
export type MappingInput = EntryInput["mappings"][number];
export type ReferenceFormInput = EntryInput["references"][number];

export function emptyMapping(): MappingInput {
  return { kind: "inspiral_phase", pn_order: undefined, b: undefined, expression: "", source_status: "confirmed", references: [], validity: [], body_rules: [] };
}

export function emptyEntry(): EntryInput {
  return {
    slug: "",
    name: "",
    kind: "theory",
    family: "other",
    summary: "",
    action_latex: "",
    assumptions: [],
    couplings: [{ symbol: "", latex: "", dimension: 0, unit: "", conventions: [] }],
    definitions: [],
    mappings: [emptyMapping()],
    references: [],
    reference_bounds: [],
  };
}

/** Number inputs: an empty box means "not given" (undefined), never NaN or 0. */
export function optionalNumber(v: unknown): number | undefined {
  if (v === "" || v === null || v === undefined) return undefined;
  const n = typeof v === "number" ? v : Number(String(v).trim());
  return Number.isNaN(n) ? (v as unknown as number) : n;
}

/** Text inputs whose schema rejects "" (identifiers like arXiv ids): empty means absent. */
export function optionalString(v: unknown): string | undefined {
  if (typeof v !== "string") return v === undefined || v === null ? undefined : String(v);
  return v.trim() === "" ? undefined : v;
}

/** Authors are typed "A. Author and B. Author", as BibTeX writes them; lists are shown that way too. */
export function authorsText(authors: string | string[] | undefined): string {
  if (authors === undefined) return "";
  return Array.isArray(authors) ? authors.join(" and ") : authors;
}

/**
 * An entry from the server (a saved submission or an accepted revision) as form values: author lists
 * become the "A and B" text the authors box edits.
 */
export function toFormEntry(entry: EntryInput): EntryInput {
  return { ...entry, references: entry.references.map((r) => ({ ...r, authors: authorsText(r.authors) })) };
}
