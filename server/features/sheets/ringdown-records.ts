import type { RingdownConvertResponse, RingdownResult } from "../../../common/ringdown.ts";
import { ringdownLimitOf } from "../../../common/ringdown-limit.ts";
import type { EntryChange, LimitChange, LimitSnapshot } from "../../../common/sheets.ts";
import type { CompiledCatalogue } from "../convert/compiled-catalogue.ts";

/**
 * Ringdown records of a sheet: what a ringdown translation depends on (the entries with a ringdown
 * mapping, by revision) and what a re-translation changes, limit by limit, in the shapes the
 * translation records use, so the sheet page and the review treat both alike.
 */

const RINGDOWN_KINDS = new Set(["ringdown_frequency", "ringdown_damping"]);

/** Revision of every accepted entry that has a ringdown mapping. */
export function ringdownEntryRevisions(catalogue: CompiledCatalogue): Record<string, number> {
  return Object.fromEntries(catalogue.theories.filter((t) => t.theory.entry.mappings.some((m) => RINGDOWN_KINDS.has(m.kind))).map((t) => [t.theory.slug, t.theory.revision]));
}

/** Entries whose revision moved since the record was translated (added and retired ones included). */
export function ringdownEntryChanges(was: Record<string, number>, catalogue: CompiledCatalogue, now: Record<string, number>, saved?: RingdownConvertResponse): EntryChange[] {
  const names = new Map<string, string>((saved?.results ?? []).map((r) => [r.slug, r.name]));
  const slugs = [...new Set([...Object.keys(was), ...Object.keys(now)])].sort();
  return slugs.filter((s) => was[s] !== now[s]).map((s) => ({ theory: s, name: catalogue.bySlug.get(s)?.theory.name ?? names.get(s) ?? s, was: was[s] ?? null, now: now[s] ?? null }));
}

function snapshot(r: RingdownResult): LimitSnapshot | null {
  const l = ringdownLimitOf(r);
  if (!l) return null;
  return { symbol: l.symbol, latex: l.latex, unit: l.unit, side: l.side, value: l.value, verdict: r.verdict, signed_interval: l.signed_interval };
}

const keyOf = (r: RingdownResult) => `${r.slug}\u0000${r.coupling?.symbol ?? ""}\u0000${r.mapping?.kind ?? ""}`;

function close(a: number | null, b: number | null): boolean {
  if (a === null || b === null) return a === b;
  return a === b || Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b));
}

function same(a: LimitSnapshot, b: LimitSnapshot): boolean {
  return (
    a.symbol === b.symbol &&
    a.unit === b.unit &&
    a.side === b.side &&
    a.verdict === b.verdict &&
    close(a.value, b.value) &&
    close(a.signed_interval?.lower ?? null, b.signed_interval?.lower ?? null) &&
    close(a.signed_interval?.upper ?? null, b.signed_interval?.upper ?? null)
  );
}

/** Limit by limit, old against new (bounded results only; an entry that stops giving a limit says why). */
export function ringdownLimitChanges(old: RingdownConvertResponse, next: RingdownConvertResponse): LimitChange[] {
  const bounded = (x: RingdownConvertResponse) => new Map(x.results.flatMap((r) => (snapshot(r) ? [[keyOf(r), r] as const] : [])));
  const before = bounded(old);
  const after = bounded(next);
  const out: LimitChange[] = [];
  for (const [key, o] of before) {
    const os = snapshot(o)!;
    const n = after.get(key);
    if (!n) {
      const why = next.results.find((x) => keyOf(x) === key)?.reason;
      out.push({ theory: o.slug, theory_name: o.name, coupling_symbol: o.coupling?.symbol ?? "", status: "removed", old: os, new: null, verdict_changed: false, ratio: null, reason: why ?? "the entry no longer gives this limit (retired, or its mapping changed)" });
      continue;
    }
    const ns = snapshot(n)!;
    out.push({
      theory: n.slug,
      theory_name: n.name,
      coupling_symbol: n.coupling?.symbol ?? "",
      status: same(os, ns) ? "same" : "changed",
      old: os,
      new: ns,
      verdict_changed: os.verdict !== ns.verdict,
      ratio: os.symbol === ns.symbol && os.unit === ns.unit && os.value !== 0 ? ns.value / os.value : null,
      reason: null,
    });
  }
  for (const [key, n] of after) {
    if (!before.has(key)) out.push({ theory: n.slug, theory_name: n.name, coupling_symbol: n.coupling?.symbol ?? "", status: "added", old: null, new: snapshot(n), verdict_changed: false, ratio: null, reason: null });
  }
  return out;
}
