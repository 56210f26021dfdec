import type { ChecksReport, EntryDiff, RevisionDetail, TheoryDetail, TheorySummary } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import { NotFoundError } from "../../errors.ts";
import { diffSize } from "./entry-diff.ts";
import { findTheoryId, getTheoryDetail, listTheories, type ListFilters } from "./read-repository.ts";
import { getRevision, listRevisions, type RevisionRow } from "./revision-repository.ts";

function person(id: number | null, login: string | null, name: string | null) {
  return id === null || login === null ? null : { id, login, name: name ?? login };
}

function revisionSummary(r: RevisionRow) {
  const diff = r.diff as EntryDiff;
  return {
    number: r.number,
    published_at: r.published_at.toISOString(),
    submission_id: r.submission_id,
    author: person(r.author_id, r.author_login, r.author_name),
    accepted_by: person(r.accepted_by, r.accepted_login, r.accepted_name),
    change_count: diffSize(diff),
  };
}

/** Reading the accepted catalogue: lists, entries, and every published revision with its diff. */
export function catalogueService(db: Knex) {
  async function theoryIdOf(slug: string): Promise<number> {
    const id = await findTheoryId(db, slug);
    if (id === undefined) throw new NotFoundError(`No theory "${slug}" in the catalogue.`);
    return id;
  }

  return {
    list: (filters: ListFilters): Promise<TheorySummary[]> => listTheories(db, filters),

    async detail(slug: string): Promise<TheoryDetail> {
      const t = await getTheoryDetail(db, slug);
      if (!t) throw new NotFoundError(`No theory "${slug}" in the catalogue.`);
      return t;
    },

    async revisions(slug: string) {
      const rows = await listRevisions(db, await theoryIdOf(slug));
      return { slug, revisions: rows.map(revisionSummary) };
    },

    async revision(slug: string, number: number): Promise<RevisionDetail> {
      const r = await getRevision(db, await theoryIdOf(slug), number);
      if (!r) throw new NotFoundError(`Theory "${slug}" has no revision ${number}.`);
      return {
        ...revisionSummary(r),
        slug,
        entry: r.entry as RevisionDetail["entry"],
        checks: r.checks as ChecksReport,
        diff: r.diff as EntryDiff,
      };
    },

    theoryIdOf,
  };
}

export type CatalogueService = ReturnType<typeof catalogueService>;
