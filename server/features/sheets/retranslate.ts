import type { ConvertResponse, ConvertResult } from "../../../common/convert.ts";
import type { EntryChange, LimitChange, LimitSnapshot } from "../../../common/sheets.ts";
import type { CompiledCatalogue } from "../convert/compiled-catalogue.ts";

/**
 * What changed between a stored translation and a fresh one: per entry (its revision), and per limit
 * (value, verdict, symbol), so the owner sees it before accepting the new version.
 */

/**
 * Entries whose revision differs between `was` and the current catalogue (added and retired ones
 * included). A retired entry is no longer in the catalogue: its name comes from the saved translation.
 */
export function entryChanges(was: Record<string, number>, catalogue: CompiledCatalogue, now: Record<string, number>, saved?: ConvertResponse): EntryChange[] {
  const names = new Map<string, string>();
  for (const r of saved?.results ?? []) names.set(r.theory, r.theory_name);
  for (const r of saved?.not_applicable ?? []) names.set(r.theory, r.theory_name);
  const gave = new Set(saved?.results.map((r) => r.theory) ?? []);
  const b = saved?.bound.b ?? null;
  // An entry matters to this translation if it gave a limit then, or maps at the bound's b now (a log
  // term has no single b: every entry matters). A new entry at another b, or a revision of one that
  // never entered at this b and still does not, changes nothing here.
  const matters = (slug: string) => !saved || b === null || gave.has(slug) || (catalogue.bySlug.get(slug)?.bs.includes(b) ?? false);
  const slugs = [...new Set([...Object.keys(was), ...Object.keys(now)])].sort();
  return slugs
    .filter((s) => was[s] !== now[s] && matters(s))
    .map((s) => ({ theory: s, name: catalogue.bySlug.get(s)?.theory.name ?? names.get(s) ?? s, was: was[s] ?? null, now: now[s] ?? null }));
}

export function snapshot(r: ConvertResult): LimitSnapshot {
  return {
    symbol: r.coupling.symbol,
    latex: r.coupling.latex,
    unit: r.coupling.unit,
    side: r.coupling.side,
    value: r.coupling.value,
    verdict: r.verdict,
    signed_interval: r.signed_interval ? { lower: r.signed_interval.lower, upper: r.signed_interval.upper } : null,
  };
}

const keyOf = (r: ConvertResult) => `${r.theory}\u0000${r.coupling_symbol || r.coupling.symbol}`;

/** Equal to 12 significant figures: a recomputation on the same catalogue reads as "same". */
function close(a: number | null, b: number | null): boolean {
  if (a === null || b === null) return a === b;
  return a === b || Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b));
}

function sameLimit(a: LimitSnapshot, b: LimitSnapshot): boolean {
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

export function limitChanges(old: ConvertResponse, next: ConvertResponse): LimitChange[] {
  const before = new Map(old.results.map((r) => [keyOf(r), r]));
  const after = new Map(next.results.map((r) => [keyOf(r), r]));
  const out: LimitChange[] = [];
  for (const [key, o] of before) {
    const n = after.get(key);
    const os = snapshot(o);
    if (!n) {
      const why = next.not_applicable.find((x) => x.theory === o.theory);
      out.push({
        theory: o.theory,
        theory_name: o.theory_name,
        coupling_symbol: o.coupling_symbol || o.coupling.symbol,
        status: "removed",
        old: os,
        new: null,
        verdict_changed: false,
        ratio: null,
        reason: why?.reason ?? "the entry no longer gives this limit (retired, or its mapping changed)",
      });
      continue;
    }
    const ns = snapshot(n);
    const comparable = os.symbol === ns.symbol && os.unit === ns.unit && os.value !== 0;
    out.push({
      theory: n.theory,
      theory_name: n.theory_name,
      coupling_symbol: n.coupling_symbol || n.coupling.symbol,
      status: sameLimit(os, ns) ? "same" : "changed",
      old: os,
      new: ns,
      verdict_changed: os.verdict !== ns.verdict,
      ratio: comparable ? ns.value / os.value : null,
      reason: null,
    });
  }
  for (const [key, n] of after) {
    if (before.has(key)) continue;
    out.push({ theory: n.theory, theory_name: n.theory_name, coupling_symbol: n.coupling_symbol || n.coupling.symbol, status: "added", old: null, new: snapshot(n), verdict_changed: false, ratio: null, reason: null });
  }
  return out;
}
