import { BibtexError, formatBibtexFile, type BibReference } from "../../../common/bibtex.ts";
import { parsedReferenceSchema, referenceInputSchema, type ParsedReference, type StoredReference } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import { NotFoundError, ValidationError, type FieldErrors } from "../../errors.ts";
import { readBibtexReference } from "./bibtex-read.ts";
import { findLiteratureByIds, listLiterature, listTheoryReferences } from "./repository.ts";

function toBib(r: StoredReference): BibReference {
  return {
    ...(r.key ? { key: r.key } : {}),
    ...(r.arxiv ? { arxiv: r.arxiv } : {}),
    ...(r.doi ? { doi: r.doi } : {}),
    authors: r.authors,
    title: r.title,
    year: r.year,
    ...(r.journal ? { journal: r.journal } : {}),
    ...(r.volume ? { volume: r.volume } : {}),
    ...(r.pages ? { pages: r.pages } : {}),
  };
}

/** BibTeX in (one entry, validated like a typed reference) and out (any set, or a theory's). */
export type ReferencesService = ReturnType<typeof referencesService>;

export function referencesService(db: Knex) {
  return {
    parseBibtex(text: string): ParsedReference {
      let parsed: BibReference;
      try {
        parsed = readBibtexReference(text);
      } catch (err) {
        if (err instanceof BibtexError) throw new ValidationError(`Invalid BibTeX: ${err.field}: ${err.message}`, { [err.field]: err.message });
        throw err;
      }
      // The same format rules as a reference typed into a submission (arXiv id, DOI, year ...).
      const checked = referenceInputSchema.safeParse(parsed);
      if (!checked.success) {
        const fields: FieldErrors = {};
        for (const issue of checked.error.issues) fields[issue.path.map(String).join(".") || "bibtex"] ??= issue.message;
        const [field, message] = Object.entries(fields)[0] ?? ["bibtex", "invalid"];
        throw new ValidationError(`Invalid BibTeX: ${field}: ${message}`, fields);
      }
      return parsedReferenceSchema.parse(checked.data);
    },

    async exportIds(ids: number[]): Promise<string> {
      const refs = await findLiteratureByIds(db, ids);
      const found = new Set(refs.map((r) => r.id));
      const missing = ids.filter((id) => !found.has(id));
      if (missing.length) throw new NotFoundError(`No reference with id ${missing.join(", ")}.`);
      return formatBibtexFile(refs.map(toBib));
    },

    async exportTheory(theoryId: number): Promise<string> {
      return formatBibtexFile((await listTheoryReferences(db, theoryId)).map(toBib));
    },

    list: (): Promise<StoredReference[]> => listLiterature(db),
  };
}
