import type { ChecksReport, TheoryEntry } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import { ConflictError } from "../../errors.ts";
import { diffEntries } from "./entry-diff.ts";
import { latestRevisionEntryOf } from "./revision-repository.ts";
import { findTheoryForUpdate, insertRevision, insertTheory, replaceTheoryContent, updateTheory } from "./write-repository.ts";

export interface PublishMeta {
  /** The accepted theory this revision replaces; null publishes a new theory. */
  targetSlug: string | null;
  submissionId: number | null;
  authorId: number | null;
  /** Every author of the accepted version (default: authorId alone). */
  authorIds?: number[];
  acceptedBy: number | null;
  now: Date;
  /** An editor's retire or restore: the entry's retirement marks are the change itself. */
  statusChange?: boolean;
}

export interface Published {
  theoryId: number;
  slug: string;
  revision: number;
}

/** "check dimension failed on mappings.0 (the b = -7 inspiral_phase mapping): ..." for a 409. */
export function describeFailedChecks(entry: TheoryEntry, checks: ChecksReport): { message: string; failed: { path: string; name: string; message: string }[] } {
  const failed = checks.results.filter((c) => !c.ok && c.severity === "error").map(({ path, name, message }) => ({ path, name, message }));
  const first = failed[0];
  if (!first) return { message: "", failed };
  const index = /^mappings\.(\d+)/.exec(first.path)?.[1];
  const mapping = index === undefined ? undefined : entry.mappings[Number(index)];
  const which = mapping ? ` (the ${mapping.kind}${mapping.b === undefined ? "" : ` b = ${mapping.b}`} mapping)` : "";
  const more = failed.length > 1 ? `; ${failed.length - 1} more failed check(s)` : "";
  return { message: `check "${first.name}" failed on ${first.path}${which}: ${first.message}${more}`, failed };
}

/**
 * Publishes an entry as the next numbered revision of its theory, in the caller's transaction: the
 * revision document (with its checks and a diff against the previous revision) and the normalised
 * theory tables. Accepting a submission and seeding the catalogue both come through here.
 */
/**
 * Retirement is an editor's act, not part of a proposed change: the published entry keeps the
 * retirement marks of the current revision (couplings by symbol, mappings by kind, exponent, mode and
 * coupling) and drops any a submission carried on its own.
 */
export function carryRetirement(previous: unknown, entry: TheoryEntry): TheoryEntry {
  const prev = (previous ?? {}) as Partial<TheoryEntry>;
  const mappingKey = (m: Pick<TheoryEntry["mappings"][number], "kind" | "b" | "a" | "mode" | "coupling">, first: string | undefined) =>
    JSON.stringify([m.kind, m.b ?? null, m.a ?? null, m.mode ?? null, m.coupling ?? first ?? null]);
  const retiredCouplings = new Map((prev.couplings ?? []).flatMap((c) => (c.retired ? [[c.symbol, c.retired] as const] : [])));
  const retiredMappings = new Map((prev.mappings ?? []).flatMap((m) => (m.retired ? [[mappingKey(m, prev.couplings?.[0]?.symbol), m.retired] as const] : [])));
  const first = entry.couplings[0]?.symbol;
  const out: TheoryEntry = {
    ...entry,
    couplings: entry.couplings.map(({ retired: _r, ...c }) => {
      const kept = retiredCouplings.get(c.symbol);
      return kept ? { ...c, retired: kept } : c;
    }),
    mappings: entry.mappings.map(({ retired: _r, ...m }) => {
      const kept = retiredMappings.get(mappingKey(m, first));
      return kept ? { ...m, retired: kept } : m;
    }),
  };
  const { retired: _entryMark, ...rest } = out;
  const live = rest.mappings.findIndex((m) => !m.retired && retiredCouplings.has(m.coupling ?? first ?? ""));
  if (live >= 0) {
    throw new ConflictError(`Mapping ${live} constrains the retired coupling ${rest.mappings[live]?.coupling ?? first}: an editor restores the coupling before this change can be published.`);
  }
  return rest;
}

export async function publishEntry(trx: Knex.Transaction, entry: TheoryEntry, checks: ChecksReport, meta: PublishMeta): Promise<Published> {
  if (!checks.ok) {
    const { message, failed } = describeFailedChecks(entry, checks);
    throw new ConflictError(`This entry cannot be published while an engine check fails: ${message}.`, { failed_checks: failed });
  }
  let theoryId: number;
  let number: number;
  let previous: unknown;
  if (meta.targetSlug) {
    const current = await findTheoryForUpdate(trx, meta.targetSlug);
    if (!current) throw new ConflictError(`The theory "${meta.targetSlug}" this submission changes is no longer in the catalogue.`);
    if (entry.slug !== current.slug) throw new ConflictError(`A change to "${current.slug}" must keep its slug; the entry says "${entry.slug}".`);
    previous = (await latestRevisionEntryOf(trx, current.id))?.entry;
    if (!meta.statusChange) {
      if (current.retired_at) throw new ConflictError(`The theory "${current.slug}" is retired; an editor restores it before a change can be published.`);
      entry = carryRetirement(previous, entry);
    }
    number = current.current_revision + 1;
    theoryId = current.id;
    await updateTheory(trx, theoryId, entry, number);
  } else {
    if (await findTheoryForUpdate(trx, entry.slug)) {
      throw new ConflictError(`A theory with slug "${entry.slug}" is already in the catalogue; propose a change to it (target_slug) or choose another slug.`, {
        slug: entry.slug,
      });
    }
    theoryId = (await insertTheory(trx, entry)).id;
    number = 1;
  }
  await replaceTheoryContent(trx, theoryId, entry, checks);
  await insertRevision(trx, {
    theoryId,
    number,
    entry,
    checks,
    diff: diffEntries(previous ?? {}, entry),
    submissionId: meta.submissionId,
    authorId: meta.authorId,
    authorIds: meta.authorIds ?? (meta.authorId === null ? [] : [meta.authorId]),
    acceptedBy: meta.acceptedBy,
    publishedAt: meta.now,
  });
  return { theoryId, slug: entry.slug, revision: number };
}
