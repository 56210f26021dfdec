import { theoryEntrySchema, type ChecksReport, type Retirement, type RetirementRequest, type RestoreRequest, type TheoryEntry } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import { ConflictError, NotFoundError, ValidationError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import { publishEntry } from "./publish.ts";
import { findTheoryForUpdate } from "./write-repository.ts";

/**
 * Retiring and restoring: an editor takes a whole entry, one coupling (with every mapping that
 * constrains it) or one mapping out of translations and forecasts, with a reason, or brings it back.
 * Each is published as a numbered revision like any other change, so the history shows who did it,
 * when and why; the entry stays readable with a "retired" mark.
 */

type Target = { what: "entry" } | { what: "coupling"; symbol: string } | { what: "mapping"; index: number };

function targetOf(entry: TheoryEntry, body: { coupling?: string | undefined; mapping?: number | undefined }): Target {
  if (body.coupling !== undefined && body.mapping !== undefined) {
    throw new ValidationError("Give either a coupling or a mapping to retire or restore, not both.", { mapping: "give either coupling or mapping, not both" });
  }
  if (body.coupling !== undefined) {
    if (!entry.couplings.some((c) => c.symbol === body.coupling)) {
      throw new ValidationError(`"${body.coupling}" is not a coupling of ${entry.slug}.`, { coupling: `not a coupling of ${entry.slug}` });
    }
    return { what: "coupling", symbol: body.coupling };
  }
  if (body.mapping !== undefined) {
    if (body.mapping >= entry.mappings.length) {
      throw new ValidationError(`${entry.slug} has ${entry.mappings.length} mapping(s); there is no mapping ${body.mapping} (counted from 0).`, {
        mapping: `must be below ${entry.mappings.length}`,
      });
    }
    return { what: "mapping", index: body.mapping };
  }
  return { what: "entry" };
}

function describe(entry: TheoryEntry, t: Target): string {
  if (t.what === "entry") return `the entry "${entry.name}"`;
  if (t.what === "coupling") return `the coupling ${t.symbol} of "${entry.name}"`;
  const m = entry.mappings[t.index];
  return `mapping ${t.index} (${m?.kind ?? "?"}${m?.b === undefined ? "" : ` at b = ${m.b}`}) of "${entry.name}"`;
}

function retirementAt(entry: TheoryEntry, t: Target): Retirement | undefined {
  if (t.what === "entry") return entry.retired;
  if (t.what === "coupling") return entry.couplings.find((c) => c.symbol === t.symbol)?.retired;
  return entry.mappings[t.index]?.retired;
}

function constrains(entry: TheoryEntry, m: TheoryEntry["mappings"][number]): string | undefined {
  return m.coupling ?? entry.couplings[0]?.symbol;
}

/** The entry with the target retired (or restored, when `retirement` is undefined). */
function withRetirement(entry: TheoryEntry, t: Target, retirement: Retirement | undefined): TheoryEntry {
  const set = <T extends { retired?: Retirement | undefined }>(x: T): T => {
    const { retired: _old, ...rest } = x;
    return (retirement ? { ...rest, retired: retirement } : rest) as T;
  };
  if (t.what === "entry") return set(entry);
  if (t.what === "mapping") return { ...entry, mappings: entry.mappings.map((m, i) => (i === t.index ? set(m) : m)) };
  // A coupling takes every mapping that constrains it along: a live mapping of a retired coupling is not allowed.
  const previous = entry.couplings.find((c) => c.symbol === t.symbol)?.retired;
  return {
    ...entry,
    couplings: entry.couplings.map((c) => (c.symbol === t.symbol ? set(c) : c)),
    mappings: entry.mappings.map((m) => {
      if (constrains(entry, m) !== t.symbol) return m;
      // Restoring the coupling restores the mappings it retired, not those retired on their own before.
      if (!retirement && m.retired && previous && m.retired.at !== previous.at) return m;
      return set(m);
    }),
  };
}

export interface RetireResult {
  slug: string;
  revision: number;
  target: string;
  retired: { reason: string; at: string; by: string | null } | null;
}

async function change(db: Knex, slug: string, who: Identity, body: RetirementRequest | RestoreRequest, retire: boolean, now: Date): Promise<RetireResult> {
  return db.transaction(async (trx) => {
    const theory = await findTheoryForUpdate(trx, slug);
    if (!theory) throw new NotFoundError(`No theory "${slug}" in the catalogue.`);
    const latest = await trx("theory_revisions")
      .where({ theory_id: theory.id })
      .orderBy("number", "desc")
      .first<{ entry: unknown; checks: ChecksReport } | undefined>("entry", "checks");
    if (!latest) throw new Error(`theory ${slug} has no revision`);
    const entry = theoryEntrySchema.parse(latest.entry);
    const target = targetOf(entry, body);
    const current = retirementAt(entry, target);
    const what = describe(entry, target);
    if (retire && current) throw new ConflictError(`${what[0]?.toUpperCase()}${what.slice(1)} is already retired (since ${current.at.slice(0, 10)}: ${current.reason}).`);
    if (!retire && !current) throw new ConflictError(`${what[0]?.toUpperCase()}${what.slice(1)} is not retired; there is nothing to restore.`);
    if (!retire && target.what !== "entry" && entry.retired) {
      throw new ConflictError(`The entry "${entry.name}" is retired as a whole; restore the entry first.`);
    }
    if (!retire && target.what === "mapping") {
      const symbol = constrains(entry, entry.mappings[target.index] as TheoryEntry["mappings"][number]);
      if (symbol && entry.couplings.find((c) => c.symbol === symbol)?.retired) {
        throw new ValidationError(`Mapping ${target.index} constrains the retired coupling ${symbol}: restore the coupling instead.`, { mapping: `constrains the retired coupling ${symbol}` });
      }
    }
    const retirement: Retirement | undefined = retire ? { reason: (body as RetirementRequest).reason, at: now.toISOString(), by: who.login } : undefined;
    const next = withRetirement(entry, target, retirement);
    const published = await publishEntry(trx, next, latest.checks, {
      targetSlug: slug,
      submissionId: null,
      authorId: who.id,
      acceptedBy: who.id,
      now,
      statusChange: true,
    });
    return { slug: published.slug, revision: published.revision, target: what, retired: retirement ? { reason: retirement.reason, at: retirement.at, by: retirement.by ?? null } : null };
  });
}

export function retirementService(db: Knex, clock: () => Date = () => new Date()) {
  return {
    retire: (slug: string, who: Identity, body: RetirementRequest) => change(db, slug, who, body, true, clock()),
    restore: (slug: string, who: Identity, body: RestoreRequest) => change(db, slug, who, body, false, clock()),
  };
}
export type RetirementService = ReturnType<typeof retirementService>;
