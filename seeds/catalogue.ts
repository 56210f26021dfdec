import { theoryEntrySchema, THEORY_FAMILIES, type TheoryEntry, type TheoryEntryInput } from "../common/catalogue.ts";
import type { Knex } from "../server/db/knex.ts";
import { ConflictError } from "../server/errors.ts";
import { checkEntry, guardEntryExpressions } from "../server/features/catalogue/entry-checks.ts";
import { publishEntry } from "../server/features/catalogue/publish.ts";
import { inProcessCheckRunner } from "../server/features/expressions/check-runner.ts";
import { THEORIES } from "./data/theories.ts";
import type { TheoryEntry as SeedEntry } from "./data/theory-entry.ts";
import type { SeedStep } from "./index.ts";

/**
 * The catalogue content of seeds/data/theories.ts, published as revision 1 of each theory through
 * the same code as an accepted submission: validated with the submission schema, checked by the
 * engine (the checks are stored), refused if a check fails.
 */

/** "quadratic gravity" -> "quadratic-gravity", the catalogue's family vocabulary. */
function familyOf(label: string, slug: string): TheoryEntryInput["family"] {
  const family = label.trim().toLowerCase().replace(/\s+/g, "-");
  if (!(THEORY_FAMILIES as readonly string[]).includes(family)) throw new Error(`seed entry ${slug}: unknown family "${label}"`);
  return family as TheoryEntryInput["family"];
}

/** "N. Yunes, F. Pretorius" -> ["N. Yunes", "F. Pretorius"]; a corporate author stays whole. */
function authorList(authors: string): string[] {
  return authors.split(/,\s+/).map((a) => a.trim()).filter(Boolean);
}

/**
 * Seed references write the journal as cited in running text ("Phys. Rev. D 80, 122003"); the
 * catalogue stores journal, volume and pages apart so that BibTeX gets its own fields.
 */
export function splitJournal(text: string): { journal: string; volume?: string; pages?: string; note?: string } {
  const [main = text, ...rest] = text.split(/;\s*/);
  const note = rest.length ? rest.join("; ").replace(/^erratum/i, "Erratum:") : undefined;
  const withNote = <T extends object>(v: T) => (note ? { ...v, note } : v);
  const comma = /^(.+?)\s+(\d+),\s*([A-Za-z]?\d+(?:-\d+)?)(?:\(R\))?$/.exec(main.trim());
  if (comma) return withNote({ journal: comma[1] as string, volume: comma[2] as string, pages: comma[3] as string });
  const yearStyle = /^(.+?)\s+(\d+)\s+\(\d{4}\)\s+(\d+)$/.exec(main.trim());
  if (yearStyle) return withNote({ journal: yearStyle[1] as string, volume: yearStyle[2] as string, pages: yearStyle[3] as string });
  return withNote({ journal: main.trim() });
}

/** The seed data's shape is the submission shape, except for families as labels and authors as one string. */
export function toSubmissionEntry(e: SeedEntry): TheoryEntry {
  const input = {
    ...e,
    family: familyOf(e.family, e.slug),
    references: e.references.map((r) => ({ ...r, ...(r.journal ? splitJournal(r.journal) : {}), authors: authorList(r.authors) })),
  };
  const parsed = theoryEntrySchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new Error(`seed entry ${e.slug}: ${issue?.path.join(".")}: ${issue?.message}`);
  }
  return parsed.data;
}

/** Publishes one seed entry; an entry whose checks fail is refused (409), exactly as an editor's accept would be. */
export async function publishSeedEntry(trx: Knex.Transaction, seed: SeedEntry, acceptedBy: number | null, now: Date) {
  const entry = toSubmissionEntry(seed);
  const runner = inProcessCheckRunner();
  await guardEntryExpressions(entry, runner, "seed", `${seed.slug}.`);
  const checks = await checkEntry(entry, runner, "seed", now);
  return publishEntry(trx, entry, checks, { targetSlug: null, submissionId: null, authorId: null, acceptedBy, now });
}

export const catalogueSeed: SeedStep = {
  name: "catalogue",
  run: async (trx) => {
    // Signed off by the demo editor when the accounts step created one.
    const editor = await trx("users").where({ login: "demo-editor" }).first<{ id: number } | undefined>("id");
    const now = new Date();
    for (const seed of THEORIES) {
      try {
        await publishSeedEntry(trx, seed, editor?.id ?? null, now);
      } catch (err) {
        // A refused entry must not take the demo down; tests/physics/seeded-mappings.test.ts fails on it instead.
        if (!(err instanceof ConflictError)) throw err;
        process.stderr.write(`catalogue seed: left out "${seed.slug}": ${err.message}\n`);
      }
    }
  },
};
