import { z } from "zod";
import { dbId, MAX_DB_INT } from "./ids.ts";
import { consistencyJobRequestSchema, consistencyRequestSchema, consistencyResultSchema } from "./consistency.ts";
import { bibliographyEntrySchema, binarySchema, boundSchema, convertResponseSchema, convertResultSchema, cosmologySchema, theorySlugSchema } from "./convert.ts";
import { jobIdSchema, samplesJobRequestSchema, samplesJobResultSchema, stackJobRequestSchema, stackJobResultSchema } from "./jobs.ts";
import { ringdownConvertRequestSchema, ringdownConvertResponseSchema } from "./ringdown.ts";

/**
 * Saved sheets: a named set of records (translated bounds, posterior-samples and stacking results,
 * IMR-consistency results), each with its provenance and the result as computed when it was saved.
 * Shared by the sheet forms and the /api/v1/sheets routes.
 */

const text = (what: string, max: number) => z.string({ error: `${what} must be text` }).trim().max(max, `${what} must be at most ${max} characters`);

export const MAX_SHEET_RECORDS = 50;

const provenance = {
  label: text("label", 120).min(1, "label is required: name the event or analysis"),
  detector_network: text("detector_network", 120).default(""),
  analysis_method: text("analysis_method", 200).default(""),
  data_link: z
    .union([z.literal(""), z.url({ protocol: /^https?$/, error: "data_link must be an http(s) address" }).max(500)])
    .default(""),
  notes: text("notes", 2000).default(""),
};

/**
 * What a record can be (one discriminated union on `kind`, "translation" when absent):
 * - translation: a bound and its binary, translated by the server when the record is added;
 * - samples_job / stack: a finished posterior-samples or stacking job, copied with its provenance;
 * - consistency: an IMR-consistency result, from two Gaussian summaries (computed when added) or a
 *   finished consistency job;
 * - ringdown: a bound on a quasinormal-mode shift with its remnant (or binary), translated through the
 *   catalogue's ringdown mappings when the record is added (re-translatable like a translation).
 * Every result is stored as computed and never recomputed on read; re-translating a translation
 * record is an explicit action (preview, then accept).
 */
export const translationRecordInputSchema = z.strictObject({
  kind: z.literal("translation").default("translation"),
  ...provenance,
  bound: boundSchema,
  binary: binarySchema,
  cosmology: cosmologySchema.optional(),
  conventions: z.record(theorySlugSchema, z.string().min(1).max(80)).optional(),
});

export const samplesJobRecordInputSchema = z.strictObject({ kind: z.literal("samples_job"), ...provenance, job: jobIdSchema });
export const stackRecordInputSchema = z.strictObject({ kind: z.literal("stack"), ...provenance, job: jobIdSchema });
export const consistencyRecordInputSchema = z
  .strictObject({
    kind: z.literal("consistency"),
    ...provenance,
    /** Two Gaussian remnant estimates: the server runs the test as it saves the record. */
    summaries: consistencyRequestSchema.optional(),
    /** Or a finished consistency job on posterior samples. */
    job: jobIdSchema.optional(),
  })
  .refine((r) => (r.summaries === undefined) !== (r.job === undefined), { path: ["summaries"], message: "give exactly one of summaries (Gaussian estimates) and job (a finished consistency job)" });

/** The request as POST /convert takes a ringdown bound: { bound: { parameter: qnm_dfreq | qnm_dtau, mode, upper | interval, credibility }, remnant | binary }. */
export const ringdownRecordInputSchema = z.strictObject({ kind: z.literal("ringdown"), ...provenance, request: ringdownConvertRequestSchema });

export const RECORD_KINDS = ["translation", "samples_job", "stack", "consistency", "ringdown"] as const;
export type RecordKind = (typeof RECORD_KINDS)[number];

export const sheetRecordInputSchema = z.discriminatedUnion("kind", [translationRecordInputSchema, samplesJobRecordInputSchema, stackRecordInputSchema, consistencyRecordInputSchema, ringdownRecordInputSchema], {
  error: `kind must be one of ${RECORD_KINDS.join(", ")}`,
});
export type SheetRecordInput = z.output<typeof sheetRecordInputSchema>;
export type SheetRecordFormInput = z.input<typeof sheetRecordInputSchema>;
export type TranslationRecordInput = z.output<typeof translationRecordInputSchema>;
export type RingdownRecordInput = z.output<typeof ringdownRecordInputSchema>;

/** In PATCH records: keep an existing record exactly as stored (at this place in the list). */
export const keepRecordSchema = z.strictObject({ kind: z.literal("keep"), id: dbId("id") });

const name = text("name", 200).min(1, "name is required");
const description = text("description", 4000);
const records = z.array(sheetRecordInputSchema).max(MAX_SHEET_RECORDS, `a sheet holds at most ${MAX_SHEET_RECORDS} records`);
/** PATCH: the new list; `{ "kind": "keep", "id": n }` keeps record n as stored, any other item is a new record. */
const patchRecords = z
  .array(
    z.discriminatedUnion("kind", [keepRecordSchema, translationRecordInputSchema, samplesJobRecordInputSchema, stackRecordInputSchema, consistencyRecordInputSchema, ringdownRecordInputSchema], {
      error: `kind must be keep or one of ${RECORD_KINDS.join(", ")}`,
    }),
  )
  .max(MAX_SHEET_RECORDS, `a sheet holds at most ${MAX_SHEET_RECORDS} records`);

export const createSheetSchema = z.strictObject({
  name,
  description: description.default(""),
  records: records.default([]),
});
export type CreateSheetRequest = z.output<typeof createSheetSchema>;

export const updateSheetSchema = z
  .strictObject({
    /** The version the client last read: a stale one gets 409. */
    version: z.number({ error: "version is required (the version you last read)" }).int().positive().max(MAX_DB_INT, `version must be at most ${MAX_DB_INT}`),
    name: name.optional(),
    description: description.optional(),
    records: patchRecords.optional(),
  })
  .refine((u) => u.name !== undefined || u.description !== undefined || u.records !== undefined, {
    message: "nothing to change: give name, description or records",
    path: ["name"],
  });
export type UpdateSheetRequest = z.output<typeof updateSheetSchema>;

export const sheetIdSchema = dbId("id");
export const recordIdSchema = dbId("record");

const version = z.number({ error: "version is required (the version you last read)" }).int().positive().max(MAX_DB_INT, `version must be at most ${MAX_DB_INT}`);

/** POST /sheets/:id/records: add one record; the others are not touched. */
export const appendRecordSchema = z.strictObject({ version, record: sheetRecordInputSchema });
export type AppendRecordRequest = z.output<typeof appendRecordSchema>;
export const recordVersionQuerySchema = z.strictObject({ version: dbId("version") });

/** POST /sheets/:id/retranslation/preview: which translation records to re-translate (default: all). */
export const retranslationPreviewRequestSchema = z.strictObject({
  records: z.array(dbId("records.n")).min(1, "records must name at least one record").max(MAX_SHEET_RECORDS).optional(),
});
/** POST /sheets/:id/retranslation: accept the previewed re-translation (refused if the catalogue moved since). */
export const retranslationAcceptSchema = z.strictObject({
  version,
  /** The catalogue version the preview was made against. */
  catalogue_revision: z.string({ error: "catalogue_revision is required (the preview's)" }).min(1).max(100),
  records: z.array(dbId("records.n")).min(1, "records must name at least one record").max(MAX_SHEET_RECORDS),
});
export type RetranslationAcceptRequest = z.output<typeof retranslationAcceptSchema>;

export const EXPORT_FORMATS = ["csv", "json", "latex", "bibtex"] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];
export const exportQuerySchema = z.strictObject({
  format: z.enum(EXPORT_FORMATS, { error: `format must be one of ${EXPORT_FORMATS.join(", ")}` }),
  digits: z.coerce.number().int().min(1, "digits must be 1 to 6").max(6, "digits must be 1 to 6").default(2),
});

/** One limit as it read in a translation: what a re-translation compares. */
export const limitSnapshotSchema = z.object({
  symbol: z.string(),
  latex: z.string(),
  unit: z.string(),
  side: z.enum(["upper", "lower"]),
  value: z.number(),
  verdict: convertResultSchema.shape.verdict,
  signed_interval: z.object({ lower: z.number().nullable(), upper: z.number().nullable() }).nullable(),
});
export type LimitSnapshot = z.infer<typeof limitSnapshotSchema>;

/** Entries whose revision differs from the one a record was translated against (was/now null: absent). */
export const entryChangeSchema = z.object({ theory: z.string(), name: z.string(), was: z.number().int().nullable(), now: z.number().int().nullable() });
export type EntryChange = z.infer<typeof entryChangeSchema>;

/** Set when the catalogue moved since the record was translated: the stored result is kept, marked. */
export const staleSchema = z.object({
  /** The current catalogue version. */
  catalogue_revision: z.string(),
  /** Which entries changed (empty for records saved before entry revisions were kept: only the version differs). */
  entries: z.array(entryChangeSchema),
});

export const historyItemSchema = z.object({
  translation: convertResponseSchema,
  translated_at: z.string(),
  entry_revisions: z.record(z.string(), z.number().int()).nullable(),
  /** When a re-translation replaced it. */
  replaced_at: z.string(),
});
export type HistoryItem = z.infer<typeof historyItemSchema>;

/** A ringdown record's replaced translation. */
export const ringdownHistoryItemSchema = z.object({
  translation: ringdownConvertResponseSchema,
  translated_at: z.string(),
  entry_revisions: z.record(z.string(), z.number().int()).nullable(),
  replaced_at: z.string(),
});
export type RingdownHistoryItem = z.infer<typeof ringdownHistoryItemSchema>;

const fileSchema = z.object({ name: z.string(), bytes: z.number().int(), sha256: z.string().nullable(), format: z.string() });
const jobRefSchema = z.object({ id: z.string(), created_at: z.string(), finished_at: z.string().nullable() });

const recordBase = {
  id: z.number().int(),
  position: z.number().int(),
  label: z.string(),
  detector_network: z.string(),
  analysis_method: z.string(),
  data_link: z.string(),
  notes: z.string(),
  /** When the record was added to the sheet. */
  saved_at: z.string(),
};

export const translationRecordSchema = z.object({
  kind: z.literal("translation"),
  ...recordBase,
  bound: boundSchema,
  binary: binarySchema,
  cosmology: cosmologySchema,
  conventions: z.record(z.string(), z.string()),
  translation: convertResponseSchema,
  translated_at: z.string(),
  /** Revision of each accepted entry when it was translated (null for records saved before these were kept). */
  entry_revisions: z.record(z.string(), z.number().int()).nullable(),
  stale: staleSchema.nullable(),
  /** Earlier translations, replaced by an accepted re-translation (oldest first). */
  history: z.array(historyItemSchema),
});
export type TranslationRecord = z.infer<typeof translationRecordSchema>;

export const samplesJobRecordSchema = z.object({
  kind: z.literal("samples_job"),
  ...recordBase,
  job: jobRefSchema,
  request: samplesJobRequestSchema,
  file: fileSchema,
  result: samplesJobResultSchema,
  /** The mapping's sources, from the catalogue when the record was saved (cite and BibTeX exports). */
  references: z.array(bibliographyEntrySchema),
});
export type SamplesJobRecord = z.infer<typeof samplesJobRecordSchema>;

export const stackRecordSchema = z.object({
  kind: z.literal("stack"),
  ...recordBase,
  job: jobRefSchema,
  request: stackJobRequestSchema,
  /** Each event's file, for events that were samples jobs still kept when the record was saved. */
  event_files: z.array(z.object({ label: z.string(), job: z.string().nullable(), file: fileSchema.nullable() })),
  result: stackJobResultSchema,
  references: z.array(bibliographyEntrySchema),
});
export type StackRecord = z.infer<typeof stackRecordSchema>;

export const consistencyRecordSchema = z.object({
  kind: z.literal("consistency"),
  ...recordBase,
  method: z.enum(["gaussian", "samples"]),
  summaries: consistencyRequestSchema.nullable(),
  job: jobRefSchema.extend({ request: consistencyJobRequestSchema, files: z.array(z.object({ role: z.string(), name: z.string().nullable(), bytes: z.number().int().nullable() })) }).nullable(),
  result: consistencyResultSchema,
});
export type ConsistencyRecord = z.infer<typeof consistencyRecordSchema>;

/** A ringdown translation as computed when saved (or last re-translated), with what it was computed against. */
export const ringdownRecordSchema = z.object({
  kind: z.literal("ringdown"),
  ...recordBase,
  request: ringdownConvertRequestSchema,
  translation: ringdownConvertResponseSchema,
  translated_at: z.string(),
  /** Revision of each accepted entry with a ringdown mapping when it was translated. */
  entry_revisions: z.record(z.string(), z.number().int()).nullable(),
  stale: staleSchema.nullable(),
  history: z.array(ringdownHistoryItemSchema),
});
export type RingdownRecord = z.infer<typeof ringdownRecordSchema>;

export const sheetRecordSchema = z.discriminatedUnion("kind", [translationRecordSchema, samplesJobRecordSchema, stackRecordSchema, consistencyRecordSchema, ringdownRecordSchema]);
export type SheetRecord = z.infer<typeof sheetRecordSchema>;

export const sheetSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  description: z.string(),
  version: z.number().int(),
  owner: z.object({ login: z.string(), name: z.string() }),
  created_at: z.string(),
  updated_at: z.string(),
  /** Only the owner sees the share token; a shared reader gets null. */
  share_token: z.string().nullable(),
  records: z.array(sheetRecordSchema),
});
export type Sheet = z.infer<typeof sheetSchema>;

export const sheetSummarySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  description: z.string(),
  version: z.number().int(),
  record_count: z.number().int(),
  shared: z.boolean(),
  updated_at: z.string(),
});
export const sheetListSchema = z.object({ sheets: z.array(sheetSummarySchema) });
export type SheetSummary = z.infer<typeof sheetSummarySchema>;

export const shareResponseSchema = z.object({ token: z.string(), path: z.string() });
export const shareTokenSchema = z.string().regex(/^[A-Za-z0-9_-]{32,64}$/, "token is not a share token");

// ---------------------------------------------------------------------------------------------
// Re-translation: what would change, shown before the owner accepts it

export const limitChangeSchema = z.object({
  theory: z.string(),
  theory_name: z.string(),
  coupling_symbol: z.string(),
  status: z.enum(["same", "changed", "added", "removed"]),
  old: limitSnapshotSchema.nullable(),
  new: limitSnapshotSchema.nullable(),
  verdict_changed: z.boolean(),
  /** new / old value, when both exist in the same symbol and unit. */
  ratio: z.number().nullable(),
  /** For a removed limit: why the theory no longer gives one. */
  reason: z.string().nullable(),
});
export type LimitChange = z.infer<typeof limitChangeSchema>;

export const recordRetranslationSchema = z.object({
  id: z.number().int(),
  label: z.string(),
  old_catalogue_revision: z.string(),
  entries: z.array(entryChangeSchema),
  /** False when every limit and verdict reads the same. */
  changed: z.boolean(),
  limits: z.array(limitChangeSchema),
  /** The new translation: an inspiral one, or a ringdown one (kind "ringdown") for a ringdown record. */
  translation: z.union([convertResponseSchema, ringdownConvertResponseSchema]),
});
export type RecordRetranslation = z.infer<typeof recordRetranslationSchema>;

export const retranslationPreviewSchema = z.object({
  catalogue_revision: z.string(),
  records: z.array(recordRetranslationSchema),
});
export type RetranslationPreview = z.infer<typeof retranslationPreviewSchema>;
