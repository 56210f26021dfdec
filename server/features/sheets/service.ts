import { randomBytes } from "node:crypto";
import { binarySchema, boundSchema, convertResponseSchema, cosmologySchema, DEFAULT_COSMOLOGY } from "../../../common/convert.ts";
import type { CreateSheetRequest, ExportFormat, Sheet, SheetRecordInput, SheetSummary, UpdateSheetRequest } from "../../../common/sheets.ts";
import { z } from "zod";
import type { Knex } from "../../db/knex.ts";
import { ConflictError, NotFoundError, ValidationError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import type { ConvertService } from "../convert/service.ts";
import { exportSheet, type ExportFile } from "./export-files.ts";
import * as repo from "./repository.ts";

/**
 * Saved sheets: an analyst's own named sets of bound records. Each record is translated when it is
 * written and stored with that translation (and the catalogue revision it used), so reading a sheet
 * never recomputes it behind the reader's back. A share token gives anyone read-only access.
 */
export interface SheetsService {
  list(who: Identity): Promise<SheetSummary[]>;
  create(who: Identity, input: CreateSheetRequest): Promise<Sheet>;
  get(who: Identity, id: number): Promise<Sheet>;
  update(who: Identity, id: number, input: UpdateSheetRequest): Promise<Sheet>;
  remove(who: Identity, id: number, version: number | undefined): Promise<void>;
  share(who: Identity, id: number): Promise<{ token: string; path: string }>;
  unshare(who: Identity, id: number): Promise<void>;
  shared(token: string): Promise<Sheet>;
  exportOwn(who: Identity, id: number, format: ExportFormat, digits: number): Promise<ExportFile>;
  exportShared(token: string, format: ExportFormat, digits: number): Promise<ExportFile>;
}

const conventionsSchema = z.record(z.string(), z.string());

function toSheet(row: repo.SheetRow, records: repo.SheetRecordRow[], withToken: boolean): Sheet {
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    version: row.version,
    owner: { login: row.owner_login, name: row.owner_name },
    created_at: row.created_at.toISOString(),
    updated_at: row.updated_at.toISOString(),
    share_token: withToken ? row.share_token : null,
    records: records.map((r) => ({
      id: r.id,
      position: r.position,
      label: r.label,
      detector_network: r.detector_network,
      analysis_method: r.analysis_method,
      data_link: r.data_link,
      notes: r.notes,
      // Stored JSON is read back through the same schemas that admitted it.
      bound: boundSchema.parse(r.bound),
      binary: binarySchema.parse(r.binary),
      cosmology: cosmologySchema.parse(r.cosmology),
      conventions: conventionsSchema.parse(r.conventions),
      translation: convertResponseSchema.parse(r.translation),
      translated_at: r.translated_at.toISOString(),
    })),
  };
}

export function sheetsService(db: Knex, convert: ConvertService, clock: () => Date = () => new Date()): SheetsService {
  /** Translates every record; a refusal names the record's field (records.2.binary.m1). */
  const translateAll = async (records: readonly SheetRecordInput[]): Promise<repo.NewRecord[]> => {
    const out: repo.NewRecord[] = [];
    for (const [i, r] of records.entries()) {
      const cosmology = r.cosmology ?? { ...DEFAULT_COSMOLOGY };
      let translation;
      try {
        translation = await convert.convert({ bound: r.bound, binary: r.binary, cosmology, ...(r.conventions ? { conventions: r.conventions } : {}) });
      } catch (err) {
        if (err instanceof ValidationError && err.fields) {
          const fields = Object.fromEntries(Object.entries(err.fields).map(([k, v]) => [`records.${i}.${k}`, v]));
          throw new ValidationError(`Invalid record ${i} ("${r.label}"): ${err.message}`, fields);
        }
        throw err;
      }
      out.push({
        position: i,
        label: r.label,
        detector_network: r.detector_network,
        analysis_method: r.analysis_method,
        data_link: r.data_link,
        notes: r.notes,
        bound: r.bound,
        binary: r.binary,
        cosmology,
        conventions: r.conventions ?? {},
        translation,
        catalogue_revision: translation.catalogue_revision,
      });
    }
    return out;
  };

  /** The sheet if `who` owns it. Someone else's sheet is "not found": its existence is not theirs to learn. */
  const own = async (who: Identity, id: number): Promise<repo.SheetRow> => {
    const row = await repo.findSheet(db, id);
    if (!row || row.owner_id !== who.id) throw new NotFoundError(`You have no sheet ${id}.`);
    return row;
  };

  const load = async (row: repo.SheetRow, withToken: boolean) => toSheet(row, await repo.recordsOf(db, row.id), withToken);

  const byToken = async (token: string): Promise<repo.SheetRow> => {
    const row = await repo.findSheetByToken(db, token);
    if (!row) throw new NotFoundError("This share link does not open any sheet: it was never issued or has been withdrawn.");
    return row;
  };

  const get = async (who: Identity, id: number): Promise<Sheet> => load(await own(who, id), true);

  return {
    get,

    async list(who) {
      const rows = await repo.listSheetsOf(db, who.id);
      return rows.map((r) => ({ ...r, updated_at: r.updated_at.toISOString() }));
    },

    async create(who, input) {
      const records = await translateAll(input.records);
      const id = await db.transaction(async (trx) => {
        const sheetId = await repo.insertSheet(trx, { owner_id: who.id, name: input.name, description: input.description });
        await repo.replaceRecords(trx, sheetId, records);
        return sheetId;
      });
      return get(who, id);
    },

    async update(who, id, input) {
      await own(who, id);
      // Translate outside the transaction: it may read the catalogue, and the write stays short.
      const records = input.records ? await translateAll(input.records) : undefined;
      await db.transaction(async (trx) => {
        const changes = { ...(input.name !== undefined ? { name: input.name } : {}), ...(input.description !== undefined ? { description: input.description } : {}) };
        const next = await repo.updateSheetIfVersion(trx, id, input.version, changes);
        if (next === undefined) {
          const current = await repo.findSheet(trx, id);
          throw new ConflictError(`The sheet changed since you read it (you sent version ${input.version}; it is now at version ${current?.version ?? "?"}). Reload it and apply your change again.`, {
            current_version: current?.version ?? null,
          });
        }
        if (records) await repo.replaceRecords(trx, id, records);
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
