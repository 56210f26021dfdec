import { z } from "zod";
import { MAX_DB_INT } from "./ids.ts";
import {
  BOUND_SIDES,
  ENTRY_KINDS,
  MAPPING_KINDS,
  SLUG_PATTERN,
  SOURCE_STATUSES,
  SUBMISSION_STATUSES,
  THEORY_FAMILIES,
  VALIDITY_KINDS,
  BODY_RULE_KINDS,
  BODY_TYPES,
  COUPLING_RANGES,
  GR_VALUES,
  checkResultSchema,
  checksReportSchema,
  derivationSchema,
  qnmModeSchema,
  quotedFormSchema,
  theoryEntryObject,
  theoryEntrySchema,
} from "./theory-entry.ts";

/**
 * The catalogue API's requests and answers: theories (list, detail), revisions and their diffs,
 * submissions, review decisions, comments, references and the development outbox. The entry shape
 * itself lives in theory-entry.ts and is re-exported here, so clients import one module.
 */
export * from "./theory-entry.ts";

const text = (max: number) => z.string().trim().min(1, "must not be empty").max(max, `must be at most ${max} characters`);

// ---------------------------------------------------------------------------------------------
// Catalogue answers

export const storedReferenceSchema = z.object({
  id: z.number().int(),
  key: z.string().nullable(),
  arxiv: z.string().nullable(),
  doi: z.string().nullable(),
  authors: z.array(z.string()),
  title: z.string(),
  year: z.number().int(),
  journal: z.string().nullable(),
  volume: z.string().nullable(),
  pages: z.string().nullable(),
  locator: z.string().nullable(),
  note: z.string().nullable(),
  details_from_memory: z.boolean(),
});
export type StoredReference = z.infer<typeof storedReferenceSchema>;

/** Set when an editor retired the entry, coupling or mapping: out of translations, still readable. */
export const storedRetirementSchema = z.object({ reason: z.string(), at: z.string(), by: z.string().nullable() }).nullable();
export type StoredRetirement = z.infer<typeof storedRetirementSchema>;

export const mappingSummarySchema = z.object({
  kind: z.enum(MAPPING_KINDS),
  b: z.number().nullable(),
  a: z.number().nullable(),
  pn_order: z.number().nullable(),
  retired: z.boolean(),
  /** Where the formula comes from: read in its paper, re-derived, or recalled (source to be confirmed). */
  source_status: z.enum(SOURCE_STATUSES),
});

export const theorySummarySchema = z.object({
  slug: z.string(),
  name: z.string(),
  kind: z.enum(ENTRY_KINDS),
  family: z.enum(THEORY_FAMILIES),
  summary: z.string(),
  revision: z.number().int(),
  updated_at: z.string(),
  /** True when any mapping's formula still awaits an editor's check against its source. */
  source_to_be_confirmed: z.boolean(),
  /** latex_html: the symbol already typeset by KaTeX on the server (null if its TeX does not parse). */
  couplings: z.array(z.object({ symbol: z.string(), latex: z.string(), latex_html: z.string().nullable(), unit: z.string() })),
  mappings: z.array(mappingSummarySchema),
  references: z.array(storedReferenceSchema),
  retired: storedRetirementSchema,
});
export const theoryListResponseSchema = z.object({ theories: z.array(theorySummarySchema) });
export type TheorySummary = z.infer<typeof theorySummarySchema>;

export const theoryListQuerySchema = z.strictObject({
  family: z.enum(THEORY_FAMILIES).optional(),
  b: z.coerce.number().finite().optional(),
  pn_order: z.coerce.number().finite().optional(),
  kind: z.enum(MAPPING_KINDS).optional(),
  text: z.string().trim().max(200).optional(),
});
export type TheoryListFilters = z.input<typeof theoryListQuerySchema>;

const storedConventionSchema = z.object({
  name: z.string(),
  action_latex: z.string().nullable(),
  factor: z.number(),
  factor_expression: z.string().nullable(),
  reference: storedReferenceSchema.nullable(),
  source_status: z.enum(SOURCE_STATUSES).nullable(),
  note: z.string().nullable(),
});

const storedValiditySchema = z.object({
  expression: z.string(),
  /** As given, or generated from the expression. */
  latex: z.string(),
  max: z.number(),
  label: z.string(),
  kind: z.enum(VALIDITY_KINDS),
  body: z.union([z.literal(1), z.literal(2)]).nullable(),
  applies_to: z.array(z.enum(BODY_TYPES)).nullable(),
  source_status: z.enum(SOURCE_STATUSES).nullable(),
  /** The reference, when the condition cites one of the entry's references ... */
  reference: storedReferenceSchema.nullable(),
  /** ... else a note on where the threshold comes from. */
  reference_note: z.string().nullable(),
  checks: z.array(checkResultSchema),
});

export const theoryMappingSchema = z.object({
  id: z.number().int(),
  kind: z.enum(MAPPING_KINDS),
  pn_order: z.number().nullable(),
  b: z.number().nullable(),
  a: z.number().nullable(),
  mode: qnmModeSchema.nullable(),
  expression: z.string(),
  /** As given, or generated from the expression. */
  latex: z.string(),
  coupling: z.string(),
  held_fixed: z.record(z.string(), z.number()).nullable(),
  alpha_md: z.number().nullable(),
  frame_note: z.string().nullable(),
  derivation: derivationSchema.nullable(),
  gimr_equivalent: z.object({ k: z.number(), expression: z.string(), source_status: z.enum(SOURCE_STATUSES) }).nullable(),
  body_rules: z.array(
    z.object({ kind: z.enum(BODY_RULE_KINDS), description: z.string(), bodies: z.array(z.enum(BODY_TYPES)).nullable(), reference: storedReferenceSchema.nullable() }),
  ),
  validity: z.array(storedValiditySchema),
  source_status: z.enum(SOURCE_STATUSES),
  /** Shown as "source to be confirmed" until an editor checks the formula against its paper. */
  source_to_be_confirmed: z.boolean(),
  references: z.array(storedReferenceSchema),
  locator: z.string().nullable(),
  notes: z.string().nullable(),
  caution: z.string().nullable().default(null),
  checks: z.array(checkResultSchema),
  /** No engine check of this mapping (or its validity conditions) failed. */
  checks_ok: z.boolean(),
  retired: storedRetirementSchema,
});
export type TheoryMapping = z.infer<typeof theoryMappingSchema>;

export const storedCouplingSchema = z.object({
  symbol: z.string(),
  latex: z.string(),
  dimension: z.number(),
  unit: z.string(),
  quoted: quotedFormSchema.nullable(),
  description: z.string().nullable(),
  convention: z.string().nullable(),
  conventions: z.array(storedConventionSchema),
  retired: storedRetirementSchema,
  /** Physical range and GR value; null for entries stored before they were declared. */
  range: z.enum(COUPLING_RANGES).nullable().default(null),
  gr_value: z.enum(GR_VALUES).nullable().default(null),
});

export const storedReferenceBoundSchema = z.object({
  coupling: z.string(),
  quoted_symbol: z.string().nullable(),
  value: z.number(),
  unit: z.string(),
  side: z.enum(BOUND_SIDES),
  credibility: z.number().nullable(),
  data: z.string().nullable(),
  reference: storedReferenceSchema,
  source_status: z.enum(SOURCE_STATUSES).nullable(),
  convention: z.string().nullable(),
  note: z.string().nullable(),
});

export const theoryDetailSchema = z.object({
  slug: z.string(),
  name: z.string(),
  kind: z.enum(ENTRY_KINDS),
  family: z.enum(THEORY_FAMILIES),
  summary: z.string(),
  action_latex: z.string().nullable(),
  metric_latex: z.string().nullable(),
  assumptions: z.array(z.string()),
  revision: z.object({ number: z.number().int(), published_at: z.string() }),
  couplings: z.array(storedCouplingSchema),
  definitions: z.array(z.object({ symbol: z.string(), expression: z.string(), latex: z.string(), description: z.string().nullable() })),
  mappings: z.array(theoryMappingSchema),
  references: z.array(storedReferenceSchema),
  reference_bounds: z.array(storedReferenceBoundSchema),
  /** True when any mapping's formula still awaits an editor's check against its source. */
  source_to_be_confirmed: z.boolean(),
  retired: storedRetirementSchema,
});
export type TheoryDetail = z.infer<typeof theoryDetailSchema>;

// ---------------------------------------------------------------------------------------------
// Revisions and diffs

export const diffEntrySchema = z.object({
  /** Dotted path into the entry, e.g. "mappings.0.expression". */
  path: z.string(),
  before: z.unknown().optional(),
  after: z.unknown().optional(),
});
export const entryDiffSchema = z.object({
  added: z.array(diffEntrySchema),
  removed: z.array(diffEntrySchema),
  changed: z.array(diffEntrySchema),
});
export type EntryDiff = z.infer<typeof entryDiffSchema>;

export const personSchema = z.object({ id: z.number().int(), login: z.string(), name: z.string() });

export const revisionSummarySchema = z.object({
  number: z.number().int(),
  published_at: z.string(),
  submission_id: z.number().int().nullable(),
  /** Who opened the submission (null for seeded revisions). */
  author: personSchema.nullable(),
  /** Everyone who wrote a version of the accepted submission (editors' edits included), first contribution first. */
  authors: z.array(personSchema),
  accepted_by: personSchema.nullable(),
  /** Added + removed + changed paths against the previous revision. */
  change_count: z.number().int(),
});
export const revisionListResponseSchema = z.object({ slug: z.string(), revisions: z.array(revisionSummarySchema) });

export const revisionDetailSchema = revisionSummarySchema.extend({
  slug: z.string(),
  entry: theoryEntryObject,
  checks: checksReportSchema,
  /** Against the previous revision; revision 1 lists everything as added. */
  diff: entryDiffSchema,
});
export type RevisionDetail = z.infer<typeof revisionDetailSchema>;

// ---------------------------------------------------------------------------------------------
// Submissions

export const createSubmissionSchema = z.strictObject({
  /** Slug of the accepted theory this submission changes; absent for a new entry. */
  target_slug: z.string().regex(SLUG_PATTERN, "must be the slug of an accepted theory").optional(),
  theory: theoryEntrySchema,
});
export type CreateSubmissionInput = z.input<typeof createSubmissionSchema>;

export const updateSubmissionSchema = z.strictObject({
  /** The version the caller last read; a stale one answers 409. */
  version: z.number().int().positive(),
  theory: theoryEntrySchema,
});
export type UpdateSubmissionInput = z.input<typeof updateSubmissionSchema>;

export const submissionSavedSchema = z.object({
  id: z.number().int(),
  status: z.enum(SUBMISSION_STATUSES),
  version: z.number().int(),
  checks: checksReportSchema,
});

export const submissionSummarySchema = z.object({
  id: z.number().int(),
  status: z.enum(SUBMISSION_STATUSES),
  version: z.number().int(),
  target_slug: z.string().nullable(),
  slug: z.string(),
  name: z.string(),
  author: personSchema,
  checks_ok: z.boolean(),
  created_at: z.string(),
  updated_at: z.string(),
  submitted_at: z.string().nullable(),
  decided_at: z.string().nullable(),
  /** Revision number published by accepting this submission. */
  revision: z.number().int().nullable(),
});
export type SubmissionSummary = z.infer<typeof submissionSummarySchema>;

export const submissionListQuerySchema = z.strictObject({
  mine: z.enum(["1", "0", "true", "false"]).transform((v) => v === "1" || v === "true").optional(),
  status: z
    .string()
    .transform((v) => v.split(",").map((s) => s.trim()).filter(Boolean))
    .pipe(z.array(z.enum(SUBMISSION_STATUSES)))
    .optional(),
});
export const submissionListResponseSchema = z.object({ submissions: z.array(submissionSummarySchema) });

export const submissionDetailSchema = submissionSummarySchema.extend({
  theory: theoryEntryObject,
  checks: checksReportSchema,
  /** Current accepted revision of the target, so a reviewer can diff against it. */
  target_revision: z.number().int().nullable(),
  /** Against the target's current accepted revision (null for a new entry). */
  diff: entryDiffSchema.nullable(),
  /** Everyone who wrote a version so far (the author, and editors who saved a change), first contribution first. */
  authors: z.array(personSchema),
  /**
   * For a submission an editor has returned: the version they returned (the latest return), and the
   * diff from that version to the current one, i.e. what the author changed since. The diff is null
   * when that version was saved before versions were kept. Null when the submission was never returned.
   */
  since_returned: z
    .object({
      version: z.number().int(),
      returned_at: z.string(),
      returned_by: personSchema.nullable(),
      diff: entryDiffSchema.nullable(),
    })
    .nullable(),
});
export type SubmissionDetail = z.infer<typeof submissionDetailSchema>;

export const statusResponseSchema = z.object({
  id: z.number().int(),
  status: z.enum(SUBMISSION_STATUSES),
  version: z.number().int(),
  revision: z.number().int().nullable().optional(),
});

export const decisionSchema = z
  .strictObject({
    decision: z.enum(["accept", "return"]),
    comment: z.string().trim().max(8000).optional(),
  })
  .superRefine((d, ctx) => {
    if (d.decision === "return" && !d.comment) ctx.addIssue({ code: "custom", path: ["comment"], message: "is required when returning a submission: say what to change" });
  });
export type DecisionInput = z.input<typeof decisionSchema>;

// ---------------------------------------------------------------------------------------------
// Comments

export const COMMENT_KINDS = ["comment", "returned", "accepted"] as const;
export const commentSchema = z.object({
  id: z.number().int(),
  submission_id: z.number().int(),
  author: personSchema,
  kind: z.enum(COMMENT_KINDS),
  body: z.string(),
  created_at: z.string(),
});
export type SubmissionComment = z.infer<typeof commentSchema>;
export const createCommentSchema = z.strictObject({ body: text(8000) });
export const commentListResponseSchema = z.object({ comments: z.array(commentSchema) });

// ---------------------------------------------------------------------------------------------
// References API

export const parseBibtexRequestSchema = z.strictObject({ bibtex: z.string().min(1, "must not be empty").max(20_000) });
/** parse-bibtex answers a reference in the entry's input shape, ready to paste into a form. */
export const parsedReferenceSchema = z.object({
  key: z.string().optional(),
  arxiv: z.string().optional(),
  doi: z.string().optional(),
  authors: z.array(z.string()),
  title: z.string(),
  year: z.number().int(),
  journal: z.string().optional(),
  volume: z.string().optional(),
  pages: z.string().optional(),
  locator: z.string().optional(),
  note: z.string().optional(),
});
export type ParsedReference = z.infer<typeof parsedReferenceSchema>;
export const referenceListResponseSchema = z.object({ references: z.array(storedReferenceSchema) });
export const bibtexExportQuerySchema = z.strictObject({
  ids: z
    .string()
    .min(1, "must list reference ids, e.g. ids=1,2,3")
    .transform((v) => v.split(",").map((s) => Number(s.trim())))
    .pipe(z.array(z.number().int("must be integer ids").positive("must be positive integer ids").max(MAX_DB_INT, "must be existing reference ids")).min(1).max(500)),
});

// ---------------------------------------------------------------------------------------------
// Development outbox

export const outboxMessageSchema = z.object({ to: z.string(), subject: z.string(), text: z.string(), date: z.string() });
export const outboxResponseSchema = z.object({ messages: z.array(outboxMessageSchema) });

// ---------------------------------------------------------------------------------------------
// Retiring and restoring (editors)

const retireTarget = {
  /** Retire one coupling (and every mapping that constrains it) instead of the whole entry. */
  coupling: z.string().regex(/^[A-Za-z][A-Za-z0-9_]*$/, "must be a coupling symbol").max(40).optional(),
  /** Retire one mapping, by its position in the entry (from 0), instead of the whole entry. */
  mapping: z.number().int().min(0, "must be a mapping position, from 0").max(1000).optional(),
};
export const retirementRequestSchema = z.strictObject({
  reason: text(1000),
  ...retireTarget,
});
export type RetirementRequest = z.infer<typeof retirementRequestSchema>;
export const restoreRequestSchema = z.strictObject({ ...retireTarget });
export type RestoreRequest = z.infer<typeof restoreRequestSchema>;
export const retirementResponseSchema = z.object({
  slug: z.string(),
  revision: z.number().int(),
  /** What was retired or restored, in words. */
  target: z.string(),
  retired: storedRetirementSchema,
});
