import { randomBytes } from "node:crypto";
import { z } from "zod";
import { binarySchema, boundSchema, convertResponseSchema, cosmologySchema } from "../../../common/convert.ts";
import { ringdownConvertRequestSchema, ringdownConvertResponseSchema } from "../../../common/ringdown.ts";
import {
  historyItemSchema,
  MAX_SHEET_RECORDS,
  ringdownHistoryItemSchema,
  sheetRecordSchema,
  type AppendRecordRequest,
  type CreateSheetRequest,
  type ExportFormat,
  type HistoryItem,
  type RecordRetranslation,
  type RetranslationAcceptRequest,
  type RetranslationPreview,
  type RingdownHistoryItem,
  type Sheet,
  type SheetRecord,
  type SheetSummary,
  type UpdateSheetRequest,
} from "../../../common/sheets.ts";
import type { Knex } from "../../db/knex.ts";
import { ConflictError, NotFoundError, ValidationError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import type { CompiledCatalogue } from "../convert/compiled-catalogue.ts";
import type { ConvertService } from "../convert/service.ts";
import { exportSheet, type ExportFile } from "./export-files.ts";
import { entryRevisions, recordBuilder } from "./record-build.ts";
import * as repo from "./repository.ts";
import { entryChanges, limitChanges } from "./retranslate.ts";
import type { RingdownService } from "../ringdown/service.ts";
import { ringdownEntryChanges, ringdownEntryRevisions, ringdownLimitChanges } from "./ringdown-records.ts";

/**
 * Saved sheets: an analyst's own named sets of records. Each record is computed once, when it is
 * added (a translation, a copied job result, a consistency test), and stored as computed, with its
 * provenance: reading a sheet, adding or removing a record never recomputes the others. A translation
 * computed against entries that have changed since is marked stale; re-translating it is an explicit
 * preview-then-accept action that keeps the replaced translation in the record's history. A share
 * token gives anyone read-only access.
 */
export interface SheetsService {
  list(who: Identity): Promise<SheetSummary[]>;
  create(who: Identity, input: CreateSheetRequest): Promise<Sheet>;
  get(who: Identity, id: number): Promise<Sheet>;
  update(who: Identity, id: number, input: UpdateSheetRequest): Promise<Sheet>;
  append(who: Identity, id: number, input: AppendRecordRequest): Promise<Sheet>;
  removeRecord(who: Identity, id: number, recordId: number, version: number): Promise<Sheet>;
  previewRetranslation(who: Identity, id: number, recordIds: number[] | undefined): Promise<RetranslationPreview>;
  acceptRetranslation(who: Identity, id: number, input: RetranslationAcceptRequest): Promise<Sheet>;
  remove(who: Identity, id: number, version: number | undefined): Promise<void>;
  share(who: Identity, id: number): Promise<{ token: string; path: string }>;
  unshare(who: Identity, id: number): Promise<void>;
  shared(token: string): Promise<Sheet>;
  exportOwn(who: Identity, id: number, format: ExportFormat, digits: number): Promise<ExportFile>;
  exportShared(token: string, format: ExportFormat, digits: number): Promise<ExportFile>;
}

const conventionsSchema = z.record(z.string(), z.string());
const revisionsSchema = z.record(z.string(), z.number().int()).nullable();

/**
 * A stored row as the record the API answers. Stored results are read back through today's schemas,
 * so a change to a job's result schema must keep old results readable (new fields optional or with a
 * default): tests/api/sheets-stored-records.test.ts reads records stored by an earlier version.
 */
export function toRecord(r: repo.SheetRecordRow, catalogue: CompiledCatalogue): SheetRecord {
  const base = {
    id: r.id,
    position: r.position,
    label: r.label,
    detector_network: r.detector_network,
    analysis_method: r.analysis_method,
    data_link: r.data_link,
    notes: r.notes,
    saved_at: r.saved_at.toISOString(),
  };
  if (r.kind === "ringdown") {
    const translation = ringdownConvertResponseSchema.parse(r.translation);
    const revisions = revisionsSchema.parse(r.entry_revisions ?? null);
    const entries = revisions ? ringdownEntryChanges(revisions, catalogue, ringdownEntryRevisions(catalogue), translation) : [];
    const stale = entries.length > 0 ? { catalogue_revision: catalogue.revision, entries } : !revisions && translation.catalogue_revision !== catalogue.revision ? { catalogue_revision: catalogue.revision, entries: [] } : null;
    return {
      kind: "ringdown",
      ...base,
      request: z.object({ request: ringdownConvertRequestSchema }).parse(r.payload).request,
      translation,
      translated_at: r.translated_at.toISOString(),
      entry_revisions: revisions,
      stale,
      history: z.array(ringdownHistoryItemSchema).parse(r.history ?? []),
    };
  }
  if (r.kind !== "translation") {
    // Stored JSON is read back through the same schemas that admitted it.
    return sheetRecordSchema.parse({ kind: r.kind, ...base, ...(r.payload as object) });
  }
  const translation = convertResponseSchema.parse(r.translation);
  const revisions = revisionsSchema.parse(r.entry_revisions ?? null);
  let stale: { catalogue_revision: string; entries: ReturnType<typeof entryChanges> } | null = null;
  if (revisions) {
    const entries = entryChanges(revisions, catalogue, entryRevisions(catalogue), translation);
    if (entries.length > 0) stale = { catalogue_revision: catalogue.revision, entries };
  } else if (translation.catalogue_revision !== catalogue.revision) {
    stale = { catalogue_revision: catalogue.revision, entries: [] };
  }
  return {
    kind: "translation",
    ...base,
    bound: boundSchema.parse(r.bound),
    binary: binarySchema.parse(r.binary),
    cosmology: cosmologySchema.parse(r.cosmology),
    conventions: conventionsSchema.parse(r.conventions),
    translation,
    translated_at: r.translated_at.toISOString(),
    entry_revisions: revisions,
    stale,
    history: z.array(historyItemSchema).parse(r.history ?? []),
  };
}

function toSheet(row: repo.SheetRow, records: repo.SheetRecordRow[], withToken: boolean, catalogue: CompiledCatalogue): Sheet {
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    version: row.version,
    owner: { login: row.owner_login, name: row.owner_name },
    created_at: row.created_at.toISOString(),
    updated_at: row.updated_at.toISOString(),
    share_token: withToken ? row.share_token : null,
    records: records.map((r) => toRecord(r, catalogue)),
  };
}

export function sheetsService(db: Knex, convert: ConvertService, clock: () => Date = () => new Date(), ringdown?: RingdownService): SheetsService {
  const builder = recordBuilder(db, convert, ringdown);

  /** Builds the new records in order; a refusal names the record's field (records.2.binary.m1). */
  const buildAll = async (items: { input: Parameters<typeof builder.build>[0]; prefix: string }[]): Promise<repo.NewRecord[]> => {
    const out: repo.NewRecord[] = [];
    for (const item of items) out.push(await builder.build(item.input, item.prefix));
    return out;
  };

  /** The sheet if `who` owns it. Someone else's sheet is "not found": its existence is not theirs to learn. */
  const own = async (who: Identity, id: number): Promise<repo.SheetRow> => {
    const row = await repo.findSheet(db, id);
    if (!row || row.owner_id !== who.id) throw new NotFoundError(`You have no sheet ${id}.`);
    return row;
  };

  const load = async (row: repo.SheetRow, withToken: boolean) => toSheet(row, await repo.recordsOf(db, row.id), withToken, await convert.catalogue());

  const byToken = async (token: string): Promise<repo.SheetRow> => {
    const row = await repo.findSheetByToken(db, token);
    if (!row) throw new NotFoundError("This share link does not open any sheet: it was never issued or has been withdrawn.");
    return row;
  };

  const get = async (who: Identity, id: number): Promise<Sheet> => load(await own(who, id), true);

  /** Bumps the version if it is still `version`, or 409 naming the current one. */
  const claimVersion = async (trx: Knex.Transaction, id: number, version: number, changes: { name?: string; description?: string } = {}) => {
    const next = await repo.updateSheetIfVersion(trx, id, version, changes);
    if (next === undefined) {
      const current = await repo.findSheet(trx, id);
      throw new ConflictError(`The sheet changed since you read it (you sent version ${version}; it is now at version ${current?.version ?? "?"}). Reload it and apply your change again.`, {
        current_version: current?.version ?? null,
      });
    }
  };

  type Translatable = Extract<SheetRecord, { kind: "translation" | "ringdown" }>;
  const translatable = (r: SheetRecord): r is Translatable => r.kind === "translation" || r.kind === "ringdown";

  /** The translation and ringdown records named (all of them when none are named), or a 400 naming the one that is not. */
  const translationRecords = (sheet: Sheet, ids: number[] | undefined): Translatable[] => {
    const all = sheet.records.filter(translatable);
    if (ids === undefined) return all;
    return ids.map((id, i) => {
      const r = sheet.records.find((x) => x.id === id);
      if (!r) throw new ValidationError(`Invalid records.${i}: the sheet has no record ${id}`, { [`records.${i}`]: `no record ${id} in this sheet` });
      if (!translatable(r)) throw new ValidationError(`Invalid records.${i}: record ${id} is a ${r.kind.replace("_", " ")} result, not a translation: it is kept as computed`, { [`records.${i}`]: "only translations can be re-translated" });
      return r;
    });
  };

  const retranslate = async (records: Translatable[]): Promise<RecordRetranslation[]> => {
    const out: RecordRetranslation[] = [];
    for (const r of records) {
      if (r.kind === "ringdown") {
        const done = await builder.translateRingdownNow(r.request);
        out.push({
          id: r.id,
          label: r.label,
          old_catalogue_revision: r.translation.catalogue_revision,
          entries: r.entry_revisions ? ringdownEntryChanges(r.entry_revisions, await convert.catalogue(), done.entry_revisions, r.translation) : [],
          changed: false,
          limits: ringdownLimitChanges(r.translation, done.translation),
          translation: done.translation,
        });
        continue;
      }
      const done = await builder.translateNow(r);
      out.push({
        id: r.id,
        label: r.label,
        old_catalogue_revision: r.translation.catalogue_revision,
        entries: r.entry_revisions ? entryChanges(r.entry_revisions, await convert.catalogue(), done.entry_revisions, r.translation) : [],
        changed: false,
        limits: limitChanges(r.translation, done.translation),
        translation: done.translation,
      });
    }
    for (const x of out) x.changed = x.limits.some((l) => l.status !== "same");
    return out;
  };

  return {
    get,

    async list(who) {
      const rows = await repo.listSheetsOf(db, who.id);
      return rows.map((r) => ({ ...r, updated_at: r.updated_at.toISOString() }));
    },

    async create(who, input) {
      const records = await buildAll(input.records.map((r, i) => ({ input: r, prefix: `records.${i}` })));
      const id = await db.transaction(async (trx) => {
        const sheetId = await repo.insertSheet(trx, { owner_id: who.id, name: input.name, description: input.description });
        await repo.insertRecords(trx, sheetId, records.map((record, position) => ({ record, position })));
        return sheetId;
      });
      return get(who, id);
    },

    async update(who, id, input) {
      await own(who, id);
      const existing = await repo.recordsOf(db, id);
      const items = input.records ?? [];
      const seen = new Set<number>();
      items.forEach((item, i) => {
        if (item.kind !== "keep") return;
        if (!existing.some((r) => r.id === item.id)) throw new ValidationError(`Invalid records.${i}.id: the sheet has no record ${item.id}`, { [`records.${i}.id`]: `no record ${item.id} in this sheet` });
        if (seen.has(item.id)) throw new ValidationError(`Invalid records.${i}.id: record ${item.id} is kept twice`, { [`records.${i}.id`]: `record ${item.id} is listed twice` });
        seen.add(item.id);
      });
      // Only the new records are computed, outside the transaction: the write stays short.
      const fresh = await buildAll(items.flatMap((item, i) => (item.kind === "keep" ? [] : [{ input: item, prefix: `records.${i}` }])));
      await db.transaction(async (trx) => {
        const changes = { ...(input.name !== undefined ? { name: input.name } : {}), ...(input.description !== undefined ? { description: input.description } : {}) };
        await claimVersion(trx, id, input.version, changes);
        if (!input.records) return;
        await repo.deleteRecordsExcept(trx, id, [...seen]);
        await repo.setPositions(
          trx,
          id,
          items.flatMap((item, position) => (item.kind === "keep" ? [{ id: item.id, position }] : [])),
        );
        let next = 0;
        await repo.insertRecords(
          trx,
          id,
          items.flatMap((item, position) => (item.kind === "keep" ? [] : [{ record: fresh[next++]!, position }])),
        );
      });
      return get(who, id);
    },

    async append(who, id, input) {
      await own(who, id);
      const [record] = await buildAll([{ input: input.record, prefix: "record" }]);
      await db.transaction(async (trx) => {
        await claimVersion(trx, id, input.version);
        const existing = await repo.recordsOf(trx, id);
        if (existing.length >= MAX_SHEET_RECORDS) throw new ValidationError(`Invalid record: a sheet holds at most ${MAX_SHEET_RECORDS} records`, { record: `the sheet already holds ${MAX_SHEET_RECORDS} records` });
        const position = existing.reduce((m, r) => Math.max(m, r.position + 1), 0);
        await repo.insertRecords(trx, id, [{ record: record!, position }]);
      });
      return get(who, id);
    },

    async removeRecord(who, id, recordId, version) {
      await own(who, id);
      const existing = await repo.recordsOf(db, id);
      if (!existing.some((r) => r.id === recordId)) throw new NotFoundError(`Sheet ${id} has no record ${recordId}.`);
      await db.transaction(async (trx) => {
        await claimVersion(trx, id, version);
        const kept = existing.filter((r) => r.id !== recordId);
        await repo.deleteRecordsExcept(trx, id, kept.map((r) => r.id));
        await repo.setPositions(trx, id, kept.map((r, position) => ({ id: r.id, position })));
      });
      return get(who, id);
    },

    async previewRetranslation(who, id, recordIds) {
      const sheet = await get(who, id);
      const records = translationRecords(sheet, recordIds);
      const catalogue = await convert.catalogue();
      const out = await retranslate(records);
      if (out.some((x) => x.translation.catalogue_revision !== catalogue.revision)) {
        throw new ConflictError("The catalogue changed while the preview was computed: ask for it again.");
      }
      return { catalogue_revision: catalogue.revision, records: out };
    },

    async acceptRetranslation(who, id, input) {
      const sheet = await get(who, id);
      const records = translationRecords(sheet, input.records);
      const catalogue = await convert.catalogue();
      if (catalogue.revision !== input.catalogue_revision) {
        throw new ConflictError("The catalogue changed since your preview: preview the re-translation again and check what changed before accepting it.", {
          catalogue_revision: catalogue.revision,
        });
      }
      const fresh = await retranslate(records);
      if (fresh.some((x) => x.translation.catalogue_revision !== input.catalogue_revision)) {
        throw new ConflictError("The catalogue changed since your preview: preview the re-translation again.", { catalogue_revision: catalogue.revision });
      }
      const now = clock().toISOString();
      await db.transaction(async (trx) => {
        await claimVersion(trx, id, input.version);
        for (const [i, r] of records.entries()) {
          const next = fresh[i]!;
          if (r.kind === "ringdown") {
            const replaced: RingdownHistoryItem = { translation: r.translation, translated_at: r.translated_at, entry_revisions: r.entry_revisions, replaced_at: now };
            await repo.replaceTranslation(trx, r.id, {
              translation: next.translation,
              catalogue_revision: next.translation.catalogue_revision,
              entry_revisions: ringdownEntryRevisions(catalogue),
              history: [...r.history, replaced],
            });
            continue;
          }
          const replaced: HistoryItem = { translation: r.translation, translated_at: r.translated_at, entry_revisions: r.entry_revisions, replaced_at: now };
          await repo.replaceTranslation(trx, r.id, {
            translation: next.translation,
            catalogue_revision: next.translation.catalogue_revision,
            entry_revisions: entryRevisions(catalogue),
            history: [...r.history, replaced],
          });
        }
      });
      return get(who, id);
    },

    async remove(who, id, version) {
      const row = await own(who, id);
      if (version !== undefined && version !== row.version) {
        throw new ConflictError(`The sheet changed since you read it (you sent version ${version}; it is now at version ${row.version}).`, { current_version: row.version });
      }
      await repo.deleteSheet(db, id);
    },

    async share(who, id) {
      await own(who, id);
      // 32 random bytes: unguessable, and a new link replaces (and so withdraws) the old one.
      const token = randomBytes(32).toString("base64url");
      await repo.setShareToken(db, id, token);
      return { token, path: `/shared/${token}` };
    },

    async unshare(who, id) {
      await own(who, id);
      await repo.setShareToken(db, id, null);
    },

    async shared(token) {
      return load(await byToken(token), false);
    },

    async exportOwn(who, id, format, digits) {
      return exportSheet(await load(await own(who, id), false), format, { digits, now: clock() });
    },

    async exportShared(token, format, digits) {
      return exportSheet(await load(await byToken(token), false), format, { digits, now: clock() });
    },
  };
}
