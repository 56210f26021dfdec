import { suggestKey } from "../../../common/bibtex.ts";
import type { Reference, StoredReference } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";

/** The papers the catalogue cites ("literature"), one row per paper, shared by every theory. */

interface LiteratureRow {
  id: number;
  citation_key: string;
  arxiv: string | null;
  doi: string | null;
  authors: string[];
  title: string;
  year: number;
  journal: string | null;
  volume: string | null;
  pages: string | null;
  note: string | null;
  details_from_memory: boolean;
}

export function toStoredReference(row: LiteratureRow, key: string | null, locator: string | null): StoredReference {
  return {
    id: row.id,
    key: key ?? row.citation_key,
    arxiv: row.arxiv,
    doi: row.doi,
    authors: row.authors,
    title: row.title,
    year: row.year,
    journal: row.journal,
    volume: row.volume,
    pages: row.pages,
    locator,
    note: row.note,
    details_from_memory: row.details_from_memory,
  };
}

const stripVersion = (arxiv: string) => arxiv.replace(/v\d+$/, "");

/**
 * Finds the row for this paper (by DOI, else arXiv id, else title and year) and refreshes it with
 * the details given, or inserts it. Returns the row id.
 */
export async function upsertLiterature(trx: Knex.Transaction, ref: Reference): Promise<number> {
  const q = trx<LiteratureRow>("literature").select("id");
  const found = await q
    .where((w) => {
      if (ref.doi) w.orWhereRaw("lower(doi) = lower(?)", [ref.doi]);
      if (ref.arxiv) w.orWhereRaw("regexp_replace(arxiv, 'v[0-9]+$', '') = ?", [stripVersion(ref.arxiv)]);
      if (!ref.doi && !ref.arxiv) w.whereRaw("lower(title) = lower(?) and year = ? and doi is null and arxiv is null", [ref.title, ref.year]);
    })
    .orderBy("id")
    .first();
  const values = {
    arxiv: ref.arxiv ?? null,
    doi: ref.doi ?? null,
    authors: JSON.stringify(ref.authors),
    title: ref.title,
    year: ref.year,
    journal: ref.journal ?? null,
    volume: ref.volume ?? null,
    pages: ref.pages ?? null,
    note: ref.note ?? null,
    details_from_memory: ref.details_from_memory ?? false,
  };
  if (found) {
    // Keep identifiers another theory supplied when this one leaves them out.
    const update: Record<string, unknown> = { ...values, updated_at: trx.fn.now() };
    if (!ref.doi) delete update.doi;
    if (!ref.arxiv) delete update.arxiv;
    await trx("literature").where({ id: found.id }).update(update);
    return found.id;
  }
  const [row] = await trx("literature")
    .insert({ ...values, citation_key: ref.key ?? suggestKey(ref) })
    .returning<{ id: number }[]>("id");
  if (!row) throw new Error("literature insert returned no row");
  return row.id;
}

export async function findLiteratureByIds(db: Knex, ids: number[]): Promise<StoredReference[]> {
  if (!ids.length) return [];
  const rows = await db<LiteratureRow>("literature").whereIn("id", ids).select("*");
  const byId = new Map(rows.map((r) => [r.id, r]));
  return ids.flatMap((id) => {
    const r = byId.get(id);
    return r ? [toStoredReference(r, null, null)] : [];
  });
}

export async function listLiterature(db: Knex): Promise<StoredReference[]> {
  const rows = await db<LiteratureRow>("literature").orderBy([{ column: "year" }, { column: "id" }]).select("*");
  return rows.map((r) => toStoredReference(r, null, null));
}

/** The references one theory cites, in the entry's order, with the theory's own keys and locators. */
export async function listTheoryReferences(db: Knex, theoryId: number): Promise<StoredReference[]> {
  return (await listReferencesOfTheories(db, [theoryId])).get(theoryId) ?? [];
}

/** The same for several theories at once, keyed by theory id. */
export async function listReferencesOfTheories(db: Knex, theoryIds: number[]): Promise<Map<number, StoredReference[]>> {
  const out = new Map<number, StoredReference[]>(theoryIds.map((id) => [id, []]));
  if (!theoryIds.length) return out;
  const rows = await db("theory_references as tr")
    .join("literature as l", "l.id", "tr.literature_id")
    .whereIn("tr.theory_id", theoryIds)
    .orderBy([{ column: "tr.theory_id" }, { column: "tr.position" }])
    .select<(LiteratureRow & { theory_id: number; key: string; locator: string | null })[]>("l.*", "tr.theory_id", "tr.key", "tr.locator");
  for (const r of rows) out.get(r.theory_id)?.push(toStoredReference(r, r.key, r.locator));
  return out;
}
