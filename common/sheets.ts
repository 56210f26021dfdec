import { z } from "zod";
import { dbId, MAX_DB_INT } from "./ids.ts";
import { binarySchema, boundSchema, convertResponseSchema, cosmologySchema, theorySlugSchema } from "./convert.ts";

/**
 * Saved sheets: a named set of bound records, each with its provenance and the translation the
 * server made when it was saved. Shared by the sheet forms and the /api/v1/sheets routes.
 */

const text = (what: string, max: number) => z.string({ error: `${what} must be text` }).trim().max(max, `${what} must be at most ${max} characters`);

export const MAX_SHEET_RECORDS = 50;

export const sheetRecordInputSchema = z.strictObject({
  label: text("label", 120).min(1, "label is required: name the event or analysis"),
  detector_network: text("detector_network", 120).default(""),
  analysis_method: text("analysis_method", 200).default(""),
  data_link: z
    .union([z.literal(""), z.url({ protocol: /^https?$/, error: "data_link must be an http(s) address" }).max(500)])
    .default(""),
  notes: text("notes", 2000).default(""),
  bound: boundSchema,
  binary: binarySchema,
  cosmology: cosmologySchema.optional(),
  conventions: z.record(theorySlugSchema, z.string().min(1).max(80)).optional(),
});
export type SheetRecordInput = z.output<typeof sheetRecordInputSchema>;
export type SheetRecordFormInput = z.input<typeof sheetRecordInputSchema>;

const name = text("name", 200).min(1, "name is required");
const description = text("description", 4000);
const records = z.array(sheetRecordInputSchema).max(MAX_SHEET_RECORDS, `a sheet holds at most ${MAX_SHEET_RECORDS} records`);

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
    records: records.optional(),
  })
  .refine((u) => u.name !== undefined || u.description !== undefined || u.records !== undefined, {
    message: "nothing to change: give name, description or records",
    path: ["name"],
  });
export type UpdateSheetRequest = z.output<typeof updateSheetSchema>;

export const sheetIdSchema = dbId("id");

export const EXPORT_FORMATS = ["csv", "json", "latex", "bibtex"] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];
export const exportQuerySchema = z.strictObject({
  format: z.enum(EXPORT_FORMATS, { error: `format must be one of ${EXPORT_FORMATS.join(", ")}` }),
  digits: z.coerce.number().int().min(1, "digits must be 1 to 6").max(6, "digits must be 1 to 6").default(2),
});

export const sheetRecordSchema = z.object({
  id: z.number().int(),
  position: z.number().int(),
  label: z.string(),
  detector_network: z.string(),
  analysis_method: z.string(),
  data_link: z.string(),
  notes: z.string(),
  bound: boundSchema,
  binary: binarySchema,
  cosmology: cosmologySchema,
  conventions: z.record(z.string(), z.string()),
  translation: convertResponseSchema,
  translated_at: z.string(),
});
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
