import type { ChecksReport, SubmissionComment, SubmissionStatus, TheoryEntry } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";

/** Submissions, their comments and state changes. Plain objects out, never query builders. */

export interface SubmissionRecord {
  id: number;
  author: { id: number; login: string; name: string; email: string | null };
  target_theory_id: number | null;
  target_slug: string | null;
  status: SubmissionStatus;
  version: number;
  entry: TheoryEntry;
  checks: ChecksReport;
  checks_ok: boolean;
  created_at: Date;
  updated_at: Date;
  submitted_at: Date | null;
  decided_at: Date | null;
  published_revision: number | null;
}

interface Row {
  id: number;
  author_id: number;
  author_login: string;
  author_name: string;
  author_email: string | null;
  target_theory_id: number | null;
  target_slug: string | null;
  status: SubmissionStatus;
  version: number;
  entry: TheoryEntry;
  checks: ChecksReport;
  checks_ok: boolean;
  created_at: Date;
  updated_at: Date;
  submitted_at: Date | null;
  decided_at: Date | null;
  published_revision: number | null;
}

function baseQuery(db: Knex | Knex.Transaction) {
  return db("submissions as s")
    .join("users as u", "u.id", "s.author_id")
    .leftJoin("theories as t", "t.id", "s.target_theory_id")
    .select<Row[]>("s.*", "u.login as author_login", "u.name as author_name", "u.email as author_email", "t.slug as target_slug");
}

function toRecord(r: Row): SubmissionRecord {
  return {
    id: r.id,
    author: { id: r.author_id, login: r.author_login, name: r.author_name, email: r.author_email },
    target_theory_id: r.target_theory_id,
    target_slug: r.target_slug,
    status: r.status,
    version: r.version,
    entry: r.entry,
    checks: r.checks,
    checks_ok: r.checks_ok,
    created_at: r.created_at,
    updated_at: r.updated_at,
    submitted_at: r.submitted_at,
    decided_at: r.decided_at,
    published_revision: r.published_revision,
  };
}

export async function findSubmission(db: Knex | Knex.Transaction, id: number): Promise<SubmissionRecord | undefined> {
  const rows = await baseQuery(db).where("s.id", id);
  return rows[0] ? toRecord(rows[0]) : undefined;
}

/** Locks the row for the rest of the transaction, so concurrent saves and transitions serialise. */
export async function lockSubmission(trx: Knex.Transaction, id: number): Promise<SubmissionRecord | undefined> {
  const locked = await trx("submissions").where({ id }).forUpdate().first<{ id: number } | undefined>("id");
  return locked ? findSubmission(trx, id) : undefined;
}

export async function listSubmissions(db: Knex, f: { authorId?: number; statuses?: SubmissionStatus[] }): Promise<SubmissionRecord[]> {
  const q = baseQuery(db).orderBy("s.updated_at", "desc").orderBy("s.id", "desc");
  if (f.authorId !== undefined) q.where("s.author_id", f.authorId);
  if (f.statuses?.length) q.whereIn("s.status", f.statuses);
  return (await q).map(toRecord);
}

export async function insertSubmission(
  trx: Knex.Transaction,
  s: { authorId: number; targetTheoryId: number | null; entry: TheoryEntry; checks: ChecksReport; now: Date },
): Promise<number> {
  const [row] = await trx("submissions")
    .insert({
      author_id: s.authorId,
      target_theory_id: s.targetTheoryId,
      status: "draft",
      version: 1,
      entry: JSON.stringify(s.entry),
      checks: JSON.stringify(s.checks),
      checks_ok: s.checks.ok,
      created_at: s.now,
      updated_at: s.now,
    })
    .returning<{ id: number }[]>("id");
  if (!row) throw new Error("submission insert returned no row");
  await insertVersion(trx, { submissionId: row.id, version: 1, entry: s.entry, savedBy: s.authorId, at: s.now });
  return row.id;
}

async function insertVersion(trx: Knex.Transaction, v: { submissionId: number; version: number; entry: TheoryEntry; savedBy: number; at: Date }): Promise<void> {
  await trx("submission_versions").insert({ submission_id: v.submissionId, version: v.version, entry: JSON.stringify(v.entry), saved_by: v.savedBy, saved_at: v.at });
}

/** Saves a new version if `expectedVersion` is still current; returns the new version, or undefined when stale. */
export async function saveVersion(
  trx: Knex.Transaction,
  id: number,
  expectedVersion: number,
  entry: TheoryEntry,
  checks: ChecksReport,
  now: Date,
  savedBy: number,
): Promise<number | undefined> {
  const [row] = await trx("submissions")
    .where({ id, version: expectedVersion })
    .update({ entry: JSON.stringify(entry), checks: JSON.stringify(checks), checks_ok: checks.ok, version: expectedVersion + 1, updated_at: now })
    .returning<{ version: number }[]>("version");
  if (row) await insertVersion(trx, { submissionId: id, version: row.version, entry, savedBy, at: now });
  return row?.version;
}

/** The entry as it stood at `version`, or undefined for versions saved before versions were kept. */
export async function findVersionEntry(db: Knex | Knex.Transaction, submissionId: number, version: number): Promise<TheoryEntry | undefined> {
  const row = await db("submission_versions").where({ submission_id: submissionId, version }).first<{ entry: TheoryEntry } | undefined>("entry");
  return row?.entry;
}

/** The latest time an editor returned the submission: the version they returned, who, and when. */
export async function lastReturn(
  db: Knex | Knex.Transaction,
  submissionId: number,
): Promise<{ version: number; at: Date; by: { id: number; login: string; name: string } | null } | undefined> {
  const row = await db("submission_events as e")
    .leftJoin("users as u", "u.id", "e.actor_id")
    .where({ "e.submission_id": submissionId, "e.action": "return" })
    .orderBy("e.at", "desc")
    .orderBy("e.id", "desc")
    .first<{ version: number; at: Date; id: number | null; login: string | null; name: string | null } | undefined>("e.version", "e.at", "u.id", "u.login", "u.name");
  if (!row) return undefined;
  return { version: row.version, at: row.at, by: row.id === null || row.login === null || row.name === null ? null : { id: row.id, login: row.login, name: row.name } };
}

export async function setStatus(
  trx: Knex.Transaction,
  id: number,
  status: SubmissionStatus,
  extra: { submitted_at?: Date; decided_at?: Date; decided_by?: number; published_revision?: number; updated_at: Date },
): Promise<void> {
  await trx("submissions").where({ id }).update({ status, ...extra });
}

export async function recordEvent(
  trx: Knex.Transaction,
  e: { submissionId: number; actorId: number | null; action: string; from: SubmissionStatus | null; to: SubmissionStatus; version: number; at: Date },
): Promise<void> {
  await trx("submission_events").insert({
    submission_id: e.submissionId,
    actor_id: e.actorId,
    action: e.action,
    from_status: e.from,
    to_status: e.to,
    version: e.version,
    at: e.at,
  });
}

export async function insertComment(
  trx: Knex.Transaction | Knex,
  c: { submissionId: number; authorId: number; kind: SubmissionComment["kind"]; body: string; at: Date },
): Promise<number> {
  const [row] = await trx("submission_comments")
    .insert({ submission_id: c.submissionId, author_id: c.authorId, kind: c.kind, body: c.body, created_at: c.at })
    .returning<{ id: number }[]>("id");
  if (!row) throw new Error("comment insert returned no row");
  return row.id;
}

export async function listComments(db: Knex, submissionId: number): Promise<SubmissionComment[]> {
  const rows = await db("submission_comments as c")
    .join("users as u", "u.id", "c.author_id")
    .where("c.submission_id", submissionId)
    .orderBy("c.created_at")
    .orderBy("c.id")
    .select<{ id: number; submission_id: number; author_id: number; login: string; name: string; kind: SubmissionComment["kind"]; body: string; created_at: Date }[]>(
      "c.id",
      "c.submission_id",
      "c.author_id",
      "u.login",
      "u.name",
      "c.kind",
      "c.body",
      "c.created_at",
    );
  return rows.map((r) => ({
    id: r.id,
    submission_id: r.submission_id,
    author: { id: r.author_id, login: r.login, name: r.name },
    kind: r.kind,
    body: r.body,
    created_at: r.created_at.toISOString(),
  }));
}

/**
 * The authors of a submission up to `version`: everyone who created or saved a version, with the
 * versions each wrote, first contribution first. An editor's typo fix makes the editor an author too.
 */
export async function listVersionAuthors(
  db: Knex | Knex.Transaction,
  submissionId: number,
  version: number,
): Promise<{ id: number; login: string; name: string; versions: number[] }[]> {
  const rows = await db("submission_events as e")
    .join("users as u", "u.id", "e.actor_id")
    .where("e.submission_id", submissionId)
    .whereIn("e.action", ["create", "save"])
    .where("e.version", "<=", version)
    .groupBy("u.id", "u.login", "u.name")
    .orderByRaw("min(e.at), u.id")
    .select<{ id: number; login: string; name: string; versions: number[] }[]>("u.id", "u.login", "u.name", db.raw("array_agg(distinct e.version order by e.version) as versions"));
  return rows;
}

/** Editors with an address, for the "waiting for review" message. */
export async function listEditors(db: Knex | Knex.Transaction): Promise<{ id: number; login: string; name: string; email: string | null }[]> {
  return db("users").whereRaw("'editor' = any(roles)").orderBy("id").select("id", "login", "name", "email");
}

export async function findUser(db: Knex | Knex.Transaction, id: number): Promise<{ id: number; login: string; name: string; email: string | null } | undefined> {
  return db("users").where({ id }).first("id", "login", "name", "email");
}
