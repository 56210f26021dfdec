import type { Knex } from "../../db/knex.ts";

/** Published revisions: each entry document as accepted, with its checks and its diff. Never updated. */

export interface RevisionRow {
  number: number;
  published_at: Date;
  submission_id: number | null;
  entry: unknown;
  checks: unknown;
  diff: { added: unknown[]; removed: unknown[]; changed: unknown[] };
  author_id: number | null;
  author_login: string | null;
  author_name: string | null;
  /** Every author of the revision, first contribution first. */
  authors: { id: number; login: string; name: string }[];
  accepted_by: number | null;
  accepted_login: string | null;
  accepted_name: string | null;
}

function revisionQuery(db: Knex, theoryId: number) {
  return db("theory_revisions as r")
    .leftJoin("users as a", "a.id", "r.author_id")
    .leftJoin("users as e", "e.id", "r.accepted_by")
    .where("r.theory_id", theoryId)
    .select<RevisionRow[]>(
      "r.number",
      "r.published_at",
      "r.submission_id",
      "r.entry",
      "r.checks",
      "r.diff",
      "r.author_id",
      "a.login as author_login",
      "a.name as author_name",
      db.raw(
        `coalesce((select json_agg(json_build_object('id', u.id, 'login', u.login, 'name', u.name) order by array_position(r.author_ids, u.id))
                     from users u where u.id = any(r.author_ids)), '[]'::json) as authors`,
      ),
      "r.accepted_by",
      "e.login as accepted_login",
      "e.name as accepted_name",
    );
}

export async function listRevisions(db: Knex, theoryId: number): Promise<RevisionRow[]> {
  return revisionQuery(db, theoryId).orderBy("r.number", "desc");
}

export async function getRevision(db: Knex, theoryId: number, number: number): Promise<RevisionRow | undefined> {
  const rows = await revisionQuery(db, theoryId).where("r.number", number);
  return rows[0];
}

/** The entry document of a theory's current revision, for diffs against a proposed change. */
export async function latestRevisionEntryOf(db: Knex, theoryId: number): Promise<{ number: number; entry: unknown } | undefined> {
  return db("theory_revisions").where({ theory_id: theoryId }).orderBy("number", "desc").first<{ number: number; entry: unknown } | undefined>("number", "entry");
}
