import type { ChecksReport, EntryDiff, RevisionDetail, TheoryDetail, TheorySummary } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import { NotFoundError } from "../../errors.ts";
import { diffSize } from "./entry-diff.ts";
import { catalogueRevision, findTheoryId, getTheoryDetail, listTheories, type ListFilters } from "./read-repository.ts";
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
    authors: r.authors,
    accepted_by: person(r.accepted_by, r.accepted_login, r.accepted_name),
    change_count: diffSize(diff),
  };
}

/** Most distinct list queries (filters) kept per catalogue revision; beyond it the oldest is dropped. */
const LIST_CACHE_LIMIT = 256;

/**
 * Reading the accepted catalogue: lists, entries, and every published revision with its diff.
 *
 * The list and the detail are the most read routes and cost 4 and 10 queries to build; they are kept
 * in process under the catalogue revision token (catalogueRevision, one aggregate query), exactly as
 * the translator keeps its compiled catalogue: a publication changes the token and the next request
 * rebuilds. A cache miss for the same key while a build is under way shares that build.
 */
export function catalogueService(db: Knex) {
  let token = "";
  let lists = new Map<string, Promise<TheorySummary[]>>();
  let details = new Map<string, Promise<TheoryDetail | undefined>>();

  async function cached<T>(pick: () => Map<string, Promise<T>>, key: string, build: () => Promise<T>): Promise<T> {
    const now = await catalogueRevision(db);
    if (now !== token) {
      token = now;
      lists = new Map();
      details = new Map();
    }
    const map = pick();
    let hit = map.get(key);
    if (!hit) {
      hit = build();
      map.set(key, hit);
      if (map.size > LIST_CACHE_LIMIT) map.delete(map.keys().next().value as string);
      // A failed build (database gone mid-way) is not remembered.
      hit.catch(() => {
        if (map.get(key) === hit) map.delete(key);
      });
    }
    return hit;
  }

  async function theoryIdOf(slug: string): Promise<number> {
    const id = await findTheoryId(db, slug);
    if (id === undefined) throw new NotFoundError(`No theory "${slug}" in the catalogue.`);
    return id;
  }

  return {
    list: (filters: ListFilters): Promise<TheorySummary[]> => cached(() => lists, JSON.stringify(filters), () => listTheories(db, filters)),

    async detail(slug: string): Promise<TheoryDetail> {
      const t = await cached(() => details, slug, () => getTheoryDetail(db, slug));
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
