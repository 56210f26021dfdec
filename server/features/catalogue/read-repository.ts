import type {
  CheckResult,
  COUPLING_RANGES,
  GR_VALUES,
  QUOTED_FORMS,
  StoredReference,
  StoredRetirement,
  TheoryDetail,
  TheoryMapping,
  TheorySummary,
} from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import { listReferencesOfTheories, listTheoryReferences } from "../references/repository.ts";
import { texToHtml } from "./tex-html.ts";
import { searchTerms } from "./search-terms.ts";

/** Reads of the accepted catalogue, from the normalised tables. Plain objects out. */

interface RetiredColumns {
  retired_at: Date | null;
  retired_reason: string | null;
  retired_by: string | null;
}

/** The retirement as the API shows it, or null for a live row. */
function retirementOf(r: RetiredColumns): StoredRetirement {
  return r.retired_at ? { reason: r.retired_reason ?? "", at: r.retired_at.toISOString(), by: r.retired_by } : null;
}

interface TheoryRow extends RetiredColumns {
  id: number;
  slug: string;
  name: string;
  kind: TheorySummary["kind"];
  family: TheorySummary["family"];
  summary: string;
  action_latex: string | null;
  metric_latex: string | null;
  assumptions: string[];
  needs_source_confirmation: boolean;
  current_revision: number;
  updated_at: Date;
}

// Row shapes of the normalised tables (written by write-repository.ts).
type Source = TheoryMapping["source_status"];
interface CouplingRow extends RetiredColumns {
  id: number;
  theory_id: number;
  symbol: string;
  latex: string;
  dimension: number;
  unit: string;
  quoted_form: (typeof QUOTED_FORMS)[number] | null;
  quoted_symbol: string;
  quoted_latex: string;
  quoted_unit: string;
  quoted_alpha_md: number | null;
  description: string | null;
  convention: string | null;
  range: (typeof COUPLING_RANGES)[number] | null;
  gr_value: (typeof GR_VALUES)[number] | null;
}
interface ConventionRow {
  coupling_id: number;
  name: string;
  action_latex: string | null;
  factor: number;
  factor_expression: string | null;
  literature_id: number | null;
  source_status: Source | null;
  note: string | null;
}
interface DefinitionRow {
  symbol: string;
  expression: string;
  latex: string;
  description: string | null;
}
interface MappingRow extends RetiredColumns {
  id: number;
  theory_id: number;
  kind: TheoryMapping["kind"];
  pn_order: number | null;
  b: number | null;
  a: number | null;
  mode: TheoryMapping["mode"];
  expression: string;
  latex: string;
  coupling_symbol: string;
  held_fixed: Record<string, number> | null;
  alpha_md: number | null;
  frame_note: string | null;
  derivation: TheoryMapping["derivation"];
  gimr_equivalent: TheoryMapping["gimr_equivalent"];
  body_rules: { kind: "charge" | "derived_for"; description: string; bodies?: ("bh" | "ns")[]; reference?: string }[];
  source_status: Source;
  locator: string | null;
  notes: string | null;
  caution: string | null;
  checks: CheckResult[];
  checks_ok: boolean;
}
interface MappingRefRow {
  mapping_id: number;
  literature_id: number;
}
interface ValidityRow {
  mapping_id: number;
  expression: string;
  latex: string;
  max: number;
  label: string;
  kind: "hard" | "rule_of_thumb";
  body: 1 | 2 | null;
  applies_to: ("bh" | "ns")[] | null;
  source_status: Source | null;
  reference_text: string | null;
  literature_id: number | null;
  checks: CheckResult[];
}
interface BoundRow {
  coupling_symbol: string;
  quoted_symbol: string | null;
  value: number;
  unit: string;
  side: "upper" | "lower";
  credibility: number | null;
  data: string | null;
  literature_id: number;
  source_status: Source | null;
  convention: string | null;
  note: string | null;
}

export interface ListFilters {
  family?: string | undefined;
  b?: number | undefined;
  pn_order?: number | undefined;
  kind?: string | undefined;
  text?: string | undefined;
}

/**
 * Runs independent reads in parallel on the pool, but one after another inside a transaction: a
 * transaction is one connection, and pg refuses overlapping queries on it.
 */
async function reads<T extends readonly unknown[]>(db: Knex, thunks: { [K in keyof T]: () => PromiseLike<T[K]> }): Promise<T> {
  if ((db as Knex & { isTransaction?: boolean }).isTransaction) {
    const out: unknown[] = [];
    for (const f of thunks) out.push(await f());
    return out as unknown as T;
  }
  return Promise.all(thunks.map((f) => f())) as unknown as Promise<T>;
}

function escapeLike(s: string): string {
  return s.replace(/[\\%_]/g, (m) => `\\${m}`);
}

/**
 * A cheap token (one aggregate query) that changes whenever the accepted catalogue changes: every
 * publication bumps a theory's current_revision and updated_at, and adds or keeps the row count.
 * The catalogue reads and the translator cache what they build under it.
 */
export async function catalogueRevision(db: Knex): Promise<string> {
  const row = await db("theories").first<{ n: number; s: number; u: Date | null }>(
    db.raw("count(*)::int as n"),
    db.raw("coalesce(sum(current_revision), 0)::int as s"),
    db.raw("max(updated_at) as u"),
  );
  return `${row.n}.${row.s}.${row.u ? row.u.getTime().toString(36) : "0"}`;
}

export async function listTheories(db: Knex, f: ListFilters): Promise<TheorySummary[]> {
  const q = db<TheoryRow>("theories as t").select("t.*").orderBy("t.name");
  if (f.family) q.where("t.family", f.family);
  if (f.b !== undefined || f.pn_order !== undefined || f.kind) {
    q.whereExists((sub) => {
      sub.select(db.raw("1")).from("mappings as m").whereRaw("m.theory_id = t.id");
      if (f.b !== undefined) sub.where("m.b", f.b);
      if (f.pn_order !== undefined) sub.where("m.pn_order", f.pn_order);
      if (f.kind) sub.where("m.kind", f.kind);
    });
  }
  if (f.text) {
    // The entry's words, and its couplings' symbols, TeX and descriptions (alpha, lambda_g, Gdot, α).
    const likes = searchTerms(f.text).map((term) => `%${escapeLike(term)}%`);
    q.where((w) => {
      for (const like of likes) {
        w.orWhereILike("t.name", like).orWhereILike("t.summary", like).orWhereILike("t.slug", like);
        w.orWhereExists((sub) =>
          sub
            .select(db.raw("1"))
            .from("couplings as c")
            .whereRaw("c.theory_id = t.id")
            .where((cw) => cw.whereILike("c.symbol", like).orWhereILike("c.latex", like).orWhereILike("c.quoted_symbol", like).orWhereILike("c.description", like)),
        );
      }
    });
  }
  const theories = await q;
  if (!theories.length) return [];
  const ids = theories.map((t) => t.id);
  type MappingBrief = Pick<MappingRow, "theory_id" | "kind" | "b" | "a" | "pn_order" | "retired_at" | "source_status">;
  type CouplingBrief = Pick<CouplingRow, "theory_id" | "symbol" | "latex" | "unit">;
  const [mappings, couplings, refs] = await reads<[MappingBrief[], CouplingBrief[], Map<number, StoredReference[]>]>(db, [
    () => db("mappings").whereIn("theory_id", ids).orderBy(["theory_id", "position"]).select<MappingBrief[]>("theory_id", "kind", "b", "a", "pn_order", "retired_at", "source_status"),
    () => db("couplings").whereIn("theory_id", ids).orderBy(["theory_id", "position"]).select<CouplingBrief[]>("theory_id", "symbol", "latex", "unit"),
    () => listReferencesOfTheories(db, ids),
  ]);
  return theories.map((t) => {
    const own = mappings.filter((m) => m.theory_id === t.id);
    return {
      slug: t.slug,
      name: t.name,
      kind: t.kind,
      family: t.family,
      summary: t.summary,
      revision: t.current_revision,
      updated_at: t.updated_at.toISOString(),
      // As on the detail: the entry's own flag, or any formula recalled from memory.
      source_to_be_confirmed: t.needs_source_confirmation || own.some((m) => m.source_status === "memory"),
      couplings: couplings.filter((c) => c.theory_id === t.id).map(({ symbol, latex, unit }) => ({ symbol, latex, latex_html: texToHtml(latex), unit })),
      mappings: own.map(({ kind, b, a, pn_order, retired_at, source_status }) => ({ kind, b, a, pn_order, retired: retired_at !== null, source_status })),
      references: refs.get(t.id) ?? [],
      retired: retirementOf(t),
    };
  });
}

export async function findTheoryId(db: Knex, slug: string): Promise<number | undefined> {
  const row = await db("theories").where({ slug }).first<{ id: number } | undefined>("id");
  return row?.id;
}

/** The accepted entry in full, or undefined for an unknown slug. */
export async function getTheoryDetail(db: Knex, slug: string): Promise<TheoryDetail | undefined> {
  const t = await db<TheoryRow>("theories").where({ slug }).first();
  if (!t) return undefined;
  const [revision, references, couplings, conventions, definitions, mappings, mappingRefs, validity, bounds] = await reads<
    [{ published_at: Date } | undefined, StoredReference[], CouplingRow[], ConventionRow[], DefinitionRow[], MappingRow[], MappingRefRow[], ValidityRow[], BoundRow[]]
  >(db, [
    () => db("theory_revisions").where({ theory_id: t.id, number: t.current_revision }).first<{ published_at: Date }>("published_at"),
    () => listTheoryReferences(db, t.id),
    () => db("couplings").where({ theory_id: t.id }).orderBy("position").select("*"),
    () => db("coupling_conventions as cc").join("couplings as c", "c.id", "cc.coupling_id").where("c.theory_id", t.id).orderBy(["cc.coupling_id", "cc.position"]).select("cc.*"),
    () => db("definitions").where({ theory_id: t.id }).orderBy("position").select("*"),
    () => db("mappings").where({ theory_id: t.id }).orderBy("position").select("*"),
    () => db("mapping_references as mr").join("mappings as m", "m.id", "mr.mapping_id").where("m.theory_id", t.id).orderBy(["mr.mapping_id", "mr.position"]).select("mr.*"),
    () => db("mapping_validity as v").join("mappings as m", "m.id", "v.mapping_id").where("m.theory_id", t.id).orderBy(["v.mapping_id", "v.position"]).select("v.*"),
    () => db("reference_bounds").where({ theory_id: t.id }).orderBy("position").select("*"),
  ]);
  const refById = new Map<number, StoredReference>(references.map((r) => [r.id, r]));
  const refByKey = new Map<string, StoredReference>(references.flatMap((r) => (r.key ? [[r.key, r] as const] : [])));
  const ref = (id: number | null): StoredReference | null => (id === null ? null : (refById.get(id) ?? null));

  const mappingViews: TheoryMapping[] = mappings.map((m) => {
    const ownValidity = validity.filter((v) => v.mapping_id === m.id);
    const checks = m.checks;
    return {
      id: m.id,
      kind: m.kind,
      pn_order: m.pn_order,
      b: m.b,
      a: m.a,
      mode: m.mode,
      expression: m.expression,
      latex: m.latex,
      coupling: m.coupling_symbol,
      held_fixed: m.held_fixed,
      alpha_md: m.alpha_md,
      frame_note: m.frame_note,
      derivation: m.derivation,
      gimr_equivalent: m.gimr_equivalent,
      body_rules: m.body_rules.map((r) => ({
        kind: r.kind,
        description: r.description,
        bodies: r.bodies ?? null,
        reference: r.reference ? (refByKey.get(r.reference) ?? null) : null,
      })),
      validity: ownValidity.map((v) => {
        const cited = ref(v.literature_id);
        return {
          expression: v.expression,
          latex: v.latex,
          max: v.max,
          label: v.label,
          kind: v.kind,
          body: v.body,
          applies_to: v.applies_to,
          source_status: v.source_status,
          reference: cited,
          reference_note: cited ? null : v.reference_text,
          checks: v.checks,
        };
      }),
      source_status: m.source_status,
      source_to_be_confirmed: m.source_status === "memory",
      references: mappingRefs.filter((r) => r.mapping_id === m.id).flatMap((r) => ref(r.literature_id) ?? []),
      locator: m.locator,
      notes: m.notes,
      caution: m.caution ?? null,
      checks,
      checks_ok: m.checks_ok,
      retired: retirementOf(m),
    };
  });

  return {
    slug: t.slug,
    name: t.name,
    kind: t.kind,
    family: t.family,
    summary: t.summary,
    action_latex: t.action_latex,
    metric_latex: t.metric_latex,
    assumptions: t.assumptions,
    revision: { number: t.current_revision, published_at: (revision?.published_at ?? t.updated_at).toISOString() },
    couplings: couplings.map((c) => ({
      symbol: c.symbol,
      latex: c.latex,
      dimension: c.dimension,
      unit: c.unit,
      quoted: c.quoted_form
        ? { form: c.quoted_form, symbol: c.quoted_symbol, latex: c.quoted_latex, unit: c.quoted_unit, ...(c.quoted_alpha_md === null ? {} : { alpha_md: c.quoted_alpha_md }) }
        : null,
      description: c.description,
      convention: c.convention,
      range: c.range,
      gr_value: c.gr_value,
      conventions: conventions
        .filter((cv) => cv.coupling_id === c.id)
        .map((cv) => ({
          name: cv.name,
          action_latex: cv.action_latex,
          factor: cv.factor,
          factor_expression: cv.factor_expression,
          reference: ref(cv.literature_id),
          source_status: cv.source_status,
          note: cv.note,
        })),
      retired: retirementOf(c),
    })),
    definitions: definitions.map((d) => ({ symbol: d.symbol, expression: d.expression, latex: d.latex, description: d.description })),
    mappings: mappingViews,
    references,
    reference_bounds: bounds.map((b) => ({
      coupling: b.coupling_symbol,
      quoted_symbol: b.quoted_symbol,
      value: b.value,
      unit: b.unit,
      side: b.side,
      credibility: b.credibility,
      data: b.data,
      reference: ref(b.literature_id) as StoredReference,
      source_status: b.source_status,
      convention: b.convention,
      note: b.note,
    })),
    source_to_be_confirmed: t.needs_source_confirmation || mappingViews.some((m) => m.source_to_be_confirmed),
    retired: retirementOf(t),
  };
}
