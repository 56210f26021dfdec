import { bOfBound, DEFAULT_COSMOLOGY, type BibliographyEntry } from "../../../common/convert.ts";
import { consistencyJobRequestSchema, consistencyResultSchema } from "../../../common/consistency.ts";
import { samplesJobRequestSchema, samplesJobResultSchema, stackJobRequestSchema, stackJobResultSchema, type JobKind } from "../../../common/jobs.ts";
import type { RingdownConvertRequest } from "../../../common/ringdown.ts";
import type { SheetRecordInput, TranslationRecordInput } from "../../../common/sheets.ts";
import type { Knex } from "../../db/knex.ts";
import { ValidationError } from "../../errors.ts";
import { asValidation } from "../consistency/routes.ts";
import { gaussianConsistency } from "../consistency/gaussian.ts";
import type { CompiledCatalogue } from "../convert/compiled-catalogue.ts";
import type { ConvertService } from "../convert/service.ts";
import { jobsRepository, type JobRow } from "../jobs/repository.ts";
import type { RingdownService } from "../ringdown/service.ts";
import type { NewRecord } from "./repository.ts";
import { ringdownEntryRevisions } from "./ringdown-records.ts";

/**
 * Turns a record input into the record to store, computing what it needs once, now: a translation
 * against the current catalogue (with each entry's revision), a copy of a finished job's result and
 * provenance, or the Gaussian consistency test. Nothing here is recomputed when the sheet is read.
 */

/** Revision of every accepted entry that has an inspiral-phase mapping: what a translation depends on. */
export function entryRevisions(catalogue: CompiledCatalogue): Record<string, number> {
  return Object.fromEntries(catalogue.theories.filter((t) => !t.noPhaseMapping).map((t) => [t.theory.slug, t.theory.revision]));
}

/** The sources of a theory's inspiral mappings at b (all its references when none is keyed to b). */
export function mappingReferences(catalogue: CompiledCatalogue, slug: string, b: number | null): BibliographyEntry[] {
  const t = catalogue.bySlug.get(slug)?.theory;
  if (!t) return [];
  const keys = new Set<string>();
  t.entry.mappings.forEach((m, i) => {
    if (m.kind === "inspiral_phase" && (b === null || m.b === b)) for (const k of t.notes[i]?.referenceKeys ?? []) keys.add(k);
  });
  const refs = t.references.filter((r) => keys.has(r.key));
  return refs.length > 0 ? refs : t.references;
}

/** A refusal from the translator, re-addressed to the record's fields (records.2.binary.m1). */
function withPrefix(err: unknown, prefix: string, label: string): unknown {
  if (err instanceof ValidationError && err.fields) {
    const fields = Object.fromEntries(Object.entries(err.fields).map(([k, v]) => [`${prefix}.${k}`, v]));
    return new ValidationError(`Invalid ${prefix} ("${label}"): ${err.message}`, fields);
  }
  return err;
}

const provenanceOf = (r: SheetRecordInput) => ({
  label: r.label,
  detector_network: r.detector_network,
  analysis_method: r.analysis_method,
  data_link: r.data_link,
  notes: r.notes,
});

const noTranslation = { bound: null, binary: null, cosmology: null, conventions: {}, translation: null, catalogue_revision: null, entry_revisions: null };

export function recordBuilder(db: Knex, convert: ConvertService, ringdown?: RingdownService) {
  const jobs = jobsRepository(db);

  /** Translates a ringdown bound against the current catalogue, with the revisions of the entries that have ringdown mappings. */
  async function translateRingdownNow(request: RingdownConvertRequest) {
    if (!ringdown) throw new ValidationError("Invalid kind: ringdown records cannot be saved here (no ringdown translator)", { kind: "ringdown records are not available" });
    for (let attempt = 0; ; attempt++) {
      const catalogue = await convert.catalogue();
      const translation = await ringdown.convert(request);
      if (translation.catalogue_revision === catalogue.revision || attempt > 0) {
        return { translation, entry_revisions: ringdownEntryRevisions(translation.catalogue_revision === catalogue.revision ? catalogue : await convert.catalogue()) };
      }
    }
  }

  /** Translates a bound against the current catalogue, with the revisions of the entries it was translated against. */
  async function translateNow(r: Pick<TranslationRecordInput, "bound" | "binary" | "cosmology" | "conventions">) {
    const cosmology = r.cosmology ?? { ...DEFAULT_COSMOLOGY };
    // Two tries: an editor publishing between the two reads would otherwise pair a translation with another revision's entries.
    for (let attempt = 0; ; attempt++) {
      const catalogue = await convert.catalogue();
      const translation = await convert.convert({ bound: r.bound, binary: r.binary, cosmology, ...(r.conventions ? { conventions: r.conventions } : {}) });
      if (translation.catalogue_revision === catalogue.revision || attempt > 0) {
        return { translation, cosmology, entry_revisions: translation.catalogue_revision === catalogue.revision ? entryRevisions(catalogue) : entryRevisions(await convert.catalogue()) };
      }
    }
  }

  /** A finished job of the given kind, or a 400 naming the field. */
  async function finishedJob(id: string, kind: JobKind, field: string): Promise<JobRow & { result: unknown }> {
    const row = await jobs.get(id);
    if (!row || row.kind !== kind) throw new ValidationError(`Invalid ${field}: there is no ${kind} job ${id} (finished jobs are kept for a limited time; save the result before it expires)`, { [field]: `no ${kind} job ${id}` });
    if (row.status !== "done" || row.result === null) throw new ValidationError(`Invalid ${field}: job ${id} is ${row.status}; only a finished job's result can be saved`, { [field]: `job ${id} is ${row.status}, not done` });
    return row;
  }

  const jobRef = (row: JobRow) => ({ id: row.id, created_at: row.created_at.toISOString(), finished_at: row.finished_at?.toISOString() ?? null });

  async function build(input: SheetRecordInput, prefix: string): Promise<NewRecord> {
    const base = provenanceOf(input);
    switch (input.kind) {
      case "translation": {
        let done;
        try {
          done = await translateNow(input);
        } catch (err) {
          throw withPrefix(err, prefix, input.label);
        }
        return {
          kind: "translation",
          ...base,
          bound: input.bound,
          binary: input.binary,
          cosmology: done.cosmology,
          conventions: input.conventions ?? {},
          translation: done.translation,
          catalogue_revision: done.translation.catalogue_revision,
          entry_revisions: done.entry_revisions,
          payload: null,
        };
      }
      case "samples_job": {
        const row = await finishedJob(input.job, "samples", `${prefix}.job`);
        const { max_samples: _max, ...asked } = (row.request ?? {}) as Record<string, unknown>;
        const request = samplesJobRequestSchema.parse(asked);
        const result = samplesJobResultSchema.parse(row.result);
        const catalogue = await convert.catalogue();
        return {
          kind: "samples_job",
          ...base,
          ...noTranslation,
          payload: { job: jobRef(row), request, file: result.file, result, references: mappingReferences(catalogue, result.theory, result.b) },
        };
      }
      case "stack": {
        const row = await finishedJob(input.job, "stack", `${prefix}.job`);
        const request = stackJobRequestSchema.parse(row.request);
        const result = stackJobResultSchema.parse(row.result);
        const event_files = [];
        for (const e of request.events) {
          if (!("job" in e)) {
            event_files.push({ label: e.label, job: null, file: null });
            continue;
          }
          const ev = await jobs.get(e.job);
          event_files.push({ label: e.label, job: e.job, file: ev?.file ? { name: ev.file.name, bytes: ev.file.bytes, sha256: ev.file.sha256 || null, format: ev.file.format } : null });
        }
        const b = request.parameter === "ppe_beta" ? (request.b ?? null) : request.k !== undefined ? bOfBound({ parameter: "gimr_dphi", k: request.k }) : null;
        const catalogue = await convert.catalogue();
        return { kind: "stack", ...base, ...noTranslation, payload: { job: jobRef(row), request, event_files, result, references: mappingReferences(catalogue, result.theory, b) } };
      }
      case "ringdown": {
        let done;
        try {
          done = await translateRingdownNow(input.request);
        } catch (err) {
          throw withPrefix(err, `${prefix}.request`, input.label);
        }
        return {
          kind: "ringdown",
          ...base,
          bound: null,
          binary: null,
          cosmology: null,
          conventions: {},
          translation: done.translation,
          catalogue_revision: done.translation.catalogue_revision,
          entry_revisions: done.entry_revisions,
          payload: { request: input.request },
        };
      }
      case "consistency": {
        if (input.summaries) {
          let result;
          try {
            result = asValidation(() => gaussianConsistency(input.summaries!));
          } catch (err) {
            throw withPrefix(err, `${prefix}.summaries`, input.label);
          }
          return { kind: "consistency", ...base, ...noTranslation, payload: { method: "gaussian", summaries: input.summaries, job: null, result } };
        }
        const row = await finishedJob(input.job!, "consistency", `${prefix}.job`);
        const result = consistencyResultSchema.parse(row.result);
        const request = consistencyJobRequestSchema.parse(row.request);
        // The consistency job keeps the first file's name and size only.
        const files = [
          { role: "inspiral", name: row.file?.name ?? null, bytes: row.file?.bytes ?? null },
          { role: "merger_ringdown", name: null, bytes: null },
        ];
        return { kind: "consistency", ...base, ...noTranslation, payload: { method: "samples", summaries: null, job: { ...jobRef(row), request, files }, result } };
      }
    }
  }

  return { build, translateNow, translateRingdownNow };
}
