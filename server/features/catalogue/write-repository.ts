import type { ChecksReport, CheckResult, EntryDiff, TheoryEntry } from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import { toLatex } from "../../physics/expr/latex.ts";
import { upsertLiterature } from "../references/repository.ts";

/**
 * Writes an accepted entry into the theory tables. The entry document is the source of truth (it is
 * stored whole with each revision); these rows are its queryable projection, rebuilt from scratch
 * for every revision inside the publishing transaction.
 */

export interface TheoryRowRef {
  id: number;
  slug: string;
  current_revision: number;
  retired_at?: Date | null;
}

export async function findTheoryForUpdate(trx: Knex.Transaction, slug: string): Promise<TheoryRowRef | undefined> {
  return trx<TheoryRowRef>("theories").where({ slug }).forUpdate().first("id", "slug", "current_revision", "retired_at");
}

function theoryColumns(entry: TheoryEntry) {
  return {
    name: entry.name,
    kind: entry.kind,
    family: entry.family,
    summary: entry.summary,
    action_latex: entry.action_latex ?? null,
    metric_latex: entry.metric_latex ?? null,
    assumptions: JSON.stringify(entry.assumptions),
    needs_source_confirmation: needsConfirmation(entry),
    ...retiredColumns(entry.retired),
  };
}

function retiredColumns(r: { reason: string; at: string; by?: string | undefined } | undefined) {
  return { retired_at: r ? new Date(r.at) : null, retired_reason: r?.reason ?? null, retired_by: r?.by ?? null };
}

/** Any formula recalled from memory, or an explicit flag, puts the entry on an editor's list. */
export function needsConfirmation(entry: TheoryEntry): boolean {
  return entry.needs_source_confirmation === true || entry.mappings.some((m) => m.source_status === "memory");
}

export async function insertTheory(trx: Knex.Transaction, entry: TheoryEntry): Promise<TheoryRowRef> {
  const [row] = await trx("theories")
    .insert({ slug: entry.slug, ...theoryColumns(entry), current_revision: 1 })
    .returning<TheoryRowRef[]>(["id", "slug", "current_revision"]);
  if (!row) throw new Error("theory insert returned no row");
  return row;
}

export async function updateTheory(trx: Knex.Transaction, id: number, entry: TheoryEntry, revision: number): Promise<void> {
  await trx("theories")
    .where({ id })
    .update({ ...theoryColumns(entry), current_revision: revision, updated_at: trx.fn.now() });
}

export interface RevisionInsert {
  theoryId: number;
  number: number;
  entry: TheoryEntry;
  checks: ChecksReport;
  diff: EntryDiff;
  submissionId: number | null;
  authorId: number | null;
  /** Everyone who wrote a version of the accepted submission, first contribution first. */
  authorIds: number[];
  acceptedBy: number | null;
  publishedAt: Date;
}

export async function insertRevision(trx: Knex.Transaction, r: RevisionInsert): Promise<void> {
  await trx("theory_revisions").insert({
    theory_id: r.theoryId,
    number: r.number,
    entry: JSON.stringify(r.entry),
    checks: JSON.stringify(r.checks),
    diff: JSON.stringify(r.diff),
    submission_id: r.submissionId,
    author_id: r.authorId,
    author_ids: r.authorIds,
    accepted_by: r.acceptedBy,
    published_at: r.publishedAt,
  });
}

const checksAt = (results: CheckResult[], path: string) => results.filter((c) => c.path === path || c.path.startsWith(`${path}.`));
const failed = (results: CheckResult[]) => results.some((c) => !c.ok && c.severity === "error");

/** The latex given, else one generated from the expression (the guard already accepted it). */
function latexOf(given: string | undefined, expression: string): string {
  return given ?? toLatex(expression);
}

/** Replaces the theory's normalised rows with those of `entry`. */
export async function replaceTheoryContent(trx: Knex.Transaction, theoryId: number, entry: TheoryEntry, checks: ChecksReport): Promise<void> {
  for (const table of ["couplings", "definitions", "mappings", "reference_bounds", "theory_references"]) {
    await trx(table).where({ theory_id: theoryId }).del();
  }

  // References first: everything else cites them by key.
  const litByKey = new Map<string, number>();
  const usedKeys = new Set(entry.references.flatMap((r) => (r.key ? [r.key] : [])));
  for (const [i, ref] of entry.references.entries()) {
    const literatureId = await upsertLiterature(trx, ref);
    let key = ref.key;
    for (let n = i + 1; !key || (key !== ref.key && usedKeys.has(key)); n++) key = `ref-${n}`;
    usedKeys.add(key);
    litByKey.set(key, literatureId);
    await trx("theory_references").insert({ theory_id: theoryId, literature_id: literatureId, key, position: i, locator: ref.locator ?? null });
  }
  const lit = (key: string | undefined) => (key === undefined ? null : (litByKey.get(key) ?? null));

  for (const [i, c] of entry.couplings.entries()) {
    const [row] = await trx("couplings")
      .insert({
        theory_id: theoryId,
        position: i,
        symbol: c.symbol,
        latex: c.latex,
        dimension: c.dimension,
        unit: c.unit,
        quoted_form: c.quoted?.form ?? null,
        quoted_symbol: c.quoted?.symbol ?? null,
        quoted_latex: c.quoted?.latex ?? null,
        quoted_unit: c.quoted?.unit ?? null,
        quoted_alpha_md: c.quoted?.alpha_md ?? null,
        description: c.description ?? null,
        convention: c.convention ?? null,
        ...retiredColumns(c.retired),
        range: c.range ?? null,
        gr_value: c.gr_value ?? null,
      })
      .returning<{ id: number }[]>("id");
    if (!row) throw new Error("coupling insert returned no row");
    if (c.conventions.length) {
      await trx("coupling_conventions").insert(
        c.conventions.map((cv, j) => ({
          coupling_id: row.id,
          position: j,
          name: cv.name,
          action_latex: cv.action_latex ?? null,
          factor: cv.factor,
          factor_expression: cv.factor_expression ?? null,
          literature_id: lit(cv.reference),
          source_status: cv.source_status ?? null,
          note: cv.note ?? null,
        })),
      );
    }
  }

  if (entry.definitions.length) {
    await trx("definitions").insert(
      entry.definitions.map((d, i) => ({
        theory_id: theoryId,
        position: i,
        symbol: d.symbol,
        expression: d.expression,
        latex: latexOf(d.latex, d.expression),
        description: d.description ?? null,
      })),
    );
  }

  const firstCoupling = entry.couplings[0]?.symbol ?? "";
  for (const [i, m] of entry.mappings.entries()) {
    // The mapping row keeps its own results; each validity row keeps its own; checks_ok covers both.
    const own = checks.results.filter((c) => c.path === `mappings.${i}`);
    const all = checksAt(checks.results, `mappings.${i}`);
    const [row] = await trx("mappings")
      .insert({
        theory_id: theoryId,
        position: i,
        kind: m.kind,
        pn_order: m.pn_order ?? null,
        b: m.b ?? null,
        a: m.a ?? null,
        mode: m.mode ? JSON.stringify(m.mode) : null,
        expression: m.expression,
        latex: latexOf(m.latex, m.expression),
        coupling_symbol: m.coupling ?? firstCoupling,
        held_fixed: m.held_fixed ? JSON.stringify(m.held_fixed) : null,
        alpha_md: m.alpha_md ?? null,
        frame_note: m.frame_note ?? null,
        derivation: m.derivation ? JSON.stringify(m.derivation) : null,
        gimr_equivalent: m.gimr_equivalent ? JSON.stringify(m.gimr_equivalent) : null,
        body_rules: JSON.stringify(m.body_rules),
        source_status: m.source_status,
        locator: m.locator ?? null,
        notes: m.notes ?? null,
        caution: m.caution ?? null,
        checks: JSON.stringify(own),
        checks_ok: !failed(all),
        ...retiredColumns(m.retired),
      })
      .returning<{ id: number }[]>("id");
    if (!row) throw new Error("mapping insert returned no row");
    const refs = [...new Set(m.references.map((k) => lit(k)).filter((x): x is number => x !== null))];
    if (refs.length) await trx("mapping_references").insert(refs.map((literatureId, j) => ({ mapping_id: row.id, literature_id: literatureId, position: j })));
    if (m.validity.length) {
      await trx("mapping_validity").insert(
        m.validity.map((v, j) => ({
          mapping_id: row.id,
          position: j,
          expression: v.expression,
          latex: latexOf(v.latex, v.expression),
          max: v.max,
          label: v.label,
          kind: v.kind,
          body: v.body ?? null,
          applies_to: v.applies_to ? JSON.stringify(v.applies_to) : null,
          source_status: v.source_status ?? null,
          reference_text: v.reference ?? null,
          literature_id: lit(v.reference),
          checks: JSON.stringify(checksAt(checks.results, `mappings.${i}.validity.${j}`)),
        })),
      );
    }
  }

  if (entry.reference_bounds.length) {
    await trx("reference_bounds").insert(
      entry.reference_bounds.map((b, i) => {
        const literatureId = lit(b.reference);
        // The entry schema guarantees every bound cites a reference of the entry.
        if (literatureId === null) throw new Error(`reference bound ${i} cites unknown key ${b.reference}`);
        return {
          theory_id: theoryId,
          position: i,
          coupling_symbol: b.coupling,
          quoted_symbol: b.quoted_symbol ?? null,
          value: b.value,
          unit: b.unit,
          side: b.side,
          credibility: b.credibility ?? null,
          data: b.data ?? null,
          literature_id: literatureId,
          source_status: b.source_status ?? null,
          convention: b.convention ?? null,
          note: b.note ?? null,
        };
      }),
    );
  }
}
