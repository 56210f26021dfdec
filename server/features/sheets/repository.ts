import type { RecordKind } from "../../../common/sheets.ts";
import type { Knex } from "../../db/knex.ts";

/** Saved sheets and their records. Knex in, plain objects out; JSON columns come back as parsed JSON. */

export interface SheetRow {
  id: number;
  owner_id: number;
  owner_login: string;
  owner_name: string;
  name: string;
  description: string;
  version: number;
  share_token: string | null;
  created_at: Date;
  updated_at: Date;
}

/**
 * A record to write. A translation record fills bound, binary, cosmology, conventions, translation,
 * catalogue_revision and entry_revisions; the other kinds put their provenance and result in payload.
 */
export interface NewRecord {
  kind: RecordKind;
  label: string;
  detector_network: string;
  analysis_method: string;
  data_link: string;
  notes: string;
  bound: unknown;
  binary: unknown;
  cosmology: unknown;
  conventions: unknown;
  translation: unknown;
  catalogue_revision: string | null;
  entry_revisions: Record<string, number> | null;
  payload: unknown;
}

/** A stored record: what was written, plus where it sits, when it was saved and translated, and its history. */
export interface SheetRecordRow extends NewRecord {
  id: number;
  sheet_id: number;
  position: number;
  translated_at: Date;
  saved_at: Date;
  history: unknown[];
}

export interface SheetSummaryRow {
  id: number;
  name: string;
  description: string;
  version: number;
  record_count: number;
  shared: boolean;
  updated_at: Date;
}

const sheetColumns = [
  "s.id",
  "s.owner_id",
  "u.login as owner_login",
  "u.name as owner_name",
  "s.name",
  "s.description",
  "s.version",
  "s.share_token",
  "s.created_at",
  "s.updated_at",
];

function sheets(db: Knex | Knex.Transaction) {
  return db("sheets as s").join("users as u", "u.id", "s.owner_id");
}

export async function findSheet(db: Knex | Knex.Transaction, id: number): Promise<SheetRow | undefined> {
  return sheets(db).where("s.id", id).first<SheetRow | undefined>(sheetColumns);
}

export async function findSheetByToken(db: Knex, token: string): Promise<SheetRow | undefined> {
  return sheets(db).where("s.share_token", token).first<SheetRow | undefined>(sheetColumns);
}

export async function listSheetsOf(db: Knex, ownerId: number): Promise<SheetSummaryRow[]> {
  return db("sheets as s")
    .where("s.owner_id", ownerId)
    .orderBy("s.updated_at", "desc")
    .select<SheetSummaryRow[]>(
      "s.id",
      "s.name",
      "s.description",
      "s.version",
      db.raw("(select count(*)::int from sheet_records r where r.sheet_id = s.id) as record_count"),
      db.raw("(s.share_token is not null) as shared"),
      "s.updated_at",
    );
}

export async function recordsOf(db: Knex | Knex.Transaction, sheetId: number): Promise<SheetRecordRow[]> {
  return db("sheet_records").where({ sheet_id: sheetId }).orderBy("position").select<SheetRecordRow[]>("*");
}

export async function insertSheet(trx: Knex.Transaction, values: { owner_id: number; name: string; description: string }): Promise<number> {
  const [row] = await trx("sheets").insert(values).returning<{ id: number }[]>("id");
  if (!row) throw new Error("sheet insert returned no row");
  return row.id;
}

const json = (v: unknown) => (v === null || v === undefined ? null : JSON.stringify(v));

const asJson = (r: NewRecord) => ({
  ...r,
  bound: json(r.bound),
  binary: json(r.binary),
  cosmology: json(r.cosmology),
  conventions: JSON.stringify(r.conventions ?? {}),
  translation: json(r.translation),
  entry_revisions: json(r.entry_revisions),
  payload: json(r.payload),
});

/** Inserts new records at the given positions. */
export async function insertRecords(trx: Knex.Transaction, sheetId: number, records: { record: NewRecord; position: number }[]): Promise<void> {
  if (records.length > 0) await trx("sheet_records").insert(records.map(({ record, position }) => ({ ...asJson(record), position, sheet_id: sheetId })));
}

/** Deletes the sheet's records whose id is not in `keep`. */
export async function deleteRecordsExcept(trx: Knex.Transaction, sheetId: number, keep: number[]): Promise<void> {
  await trx("sheet_records").where({ sheet_id: sheetId }).whereNotIn("id", keep).delete();
}

/** Moves kept records to their new positions (through negative ones, so the unique (sheet, position) never clashes). */
export async function setPositions(trx: Knex.Transaction, sheetId: number, positions: { id: number; position: number }[]): Promise<void> {
  for (const p of positions) await trx("sheet_records").where({ sheet_id: sheetId, id: p.id }).update({ position: -1 - p.position });
  for (const p of positions) await trx("sheet_records").where({ sheet_id: sheetId, id: p.id }).update({ position: p.position });
}

/** Replaces a translation or ringdown record's translation, keeping the one it replaces in its history. */
export async function replaceTranslation(
  trx: Knex.Transaction,
  recordId: number,
  values: { translation: unknown; catalogue_revision: string; entry_revisions: Record<string, number>; history: unknown[] },
): Promise<void> {
  await trx("sheet_records")
    .where({ id: recordId })
    .whereIn("kind", ["translation", "ringdown"])
    .update({
      translation: JSON.stringify(values.translation),
      catalogue_revision: values.catalogue_revision,
      entry_revisions: JSON.stringify(values.entry_revisions),
      history: JSON.stringify(values.history),
      translated_at: trx.fn.now(),
    });
}

/**
 * Applies the change only if the stored version is still `expectedVersion`, bumping it. Returns the
 * new version, or undefined when the sheet moved on (the caller answers 409).
 */
export async function updateSheetIfVersion(
  trx: Knex.Transaction,
  id: number,
  expectedVersion: number,
  changes: { name?: string; description?: string },
): Promise<number | undefined> {
  const [row] = await trx("sheets")
    .where({ id, version: expectedVersion })
    .update({ ...changes, version: trx.raw("version + 1"), updated_at: trx.fn.now() })
    .returning<{ version: number }[]>("version");
  return row?.version;
}

export async function deleteSheet(db: Knex, id: number): Promise<boolean> {
  return (await db("sheets").where({ id }).delete()) > 0;
}

export async function setShareToken(db: Knex, id: number, token: string | null): Promise<void> {
  await db("sheets")
    .where({ id })
    .update({ share_token: token, shared_at: token ? db.fn.now() : null });
}
