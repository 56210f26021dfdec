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
