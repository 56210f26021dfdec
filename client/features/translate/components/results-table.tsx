import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";
import { useMemo, useState } from "react";
import type { ConvertResult, ReferenceComparison } from "../../../../common/convert.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { DataTable } from "../../../components/ui/data-table.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { thresholdText } from "../../../components/ui/text-format.ts";
import { CautionList } from "./caution-list.tsx";
import { SciNumber, unitText } from "./sci-number.tsx";

const column = createColumnHelper<ConvertResult>();

/** The published bound to put beside a translation: the tightest one it can be compared with. */
export function bestReference(list: readonly ReferenceComparison[]): ReferenceComparison | undefined {
  const comparable = list.filter((c) => c.ratio !== null);
  if (comparable.length === 0) return list[0];
  return comparable.reduce((best, c) => ((c.ratio ?? Infinity) < (best.ratio ?? Infinity) ? c : best));
}

/** A stable test id per row: the theory, plus the coupling when the theory gives several rows. */
function rowKey(r: ConvertResult, multi: ReadonlySet<string>): string {
  return multi.has(r.theory) ? `${r.theory}-${r.coupling_symbol}` : r.theory;
}

function SignedInterval({ r, id }: { r: ConvertResult; id: string }) {
  const s = r.signed_interval;
  if (!s) return null;
  return (
    <span className="whitespace-nowrap text-sm" data-testid={`signed-${id}`}>
      signed: <MathTex tex={s.latex} label={symbolText(s.symbol, s.latex)} /> ∈ [{s.lower === null ? "−∞" : <SciNumber value={s.lower} />}, {s.upper === null ? "+∞" : <SciNumber value={s.upper} />}]{" "}
      {unitText(s.unit)}
    </span>
  );
}

function Limit({ r, id }: { r: ConvertResult; id: string }) {
  const rel = (side: "upper" | "lower") => (side === "upper" ? "≤" : "≥");
  return (
    <div className="flex min-w-[17rem] max-w-[22rem] flex-col gap-1">
      {r.signed_interval && <SignedInterval r={r} id={id} />}
      <span className="whitespace-nowrap" data-testid={`limit-${id}`}>
        <MathTex tex={r.coupling.latex} label={symbolText(r.coupling.symbol, r.coupling.latex)} /> {rel(r.coupling.side)} <SciNumber value={r.coupling.value} className="font-semibold" />{" "}
        {unitText(r.coupling.unit)}
      </span>
      {r.also.map((a) => (
        <span key={a.symbol} className="whitespace-nowrap text-sm text-ink-soft" data-testid={`also-${id}-${a.symbol}`}>
          <MathTex tex={a.latex} label={symbolText(a.symbol, a.latex)} /> {rel(a.side)} <SciNumber value={a.value} /> {unitText(a.unit)}
        </span>
      ))}
      <Comparison r={r} id={id} />
      <span className="mt-1 text-xs text-ink-faint">{r.method === "closed_form" ? "closed form" : "numerical root"}:</span>
      <MathTex tex={r.closed_form_latex} className="text-[0.8rem] text-ink-soft" />
    </div>
  );
}

const fmtFactor = (f: number | null) => (f === null ? "?" : Number(f.toPrecision(3)).toString());

/** The verdict as one of three badges of our own, then the condition that fails and by what factor. */
export function VerdictBadge({ verdict }: { verdict: ConvertResult["verdict"] }) {
  if (verdict === "valid") return <Badge tone="ok" title="every validity condition holds at the limit">✓ valid</Badge>;
  if (verdict === "outside_validity") return <Badge tone="fail" title="a validity condition fails at the limit: this is not a limit">✗ outside validity</Badge>;
  return <Badge tone="info" title="the entry states no validity condition for this binary">? not assessed</Badge>;
}

function Validity({ r, id }: { r: ConvertResult; id: string }) {
  const stretched = r.validity.filter((v) => v.status === "stretched");
  const failing = r.validity.filter((v) => v.status === "fails");
  return (
    <div className="flex min-w-[9rem] max-w-[13rem] flex-col gap-1 text-sm" data-testid={`validity-${id}`} data-verdict={r.verdict}>
      <VerdictBadge verdict={r.verdict} />
      {failing.map((v) => (
        <span key={v.label} className="text-brick" data-testid={`failing-${id}`}>
          fails ×{fmtFactor(v.factor)}: {conditionText(v.label)} (<SciNumber value={v.value ?? NaN} /> &gt; {thresholdText(v.max)})
        </span>
      ))}
      {stretched.map((v) => (
        <span key={v.label} className="text-amber">
          stretched ×{fmtFactor(v.factor)}: {conditionText(v.label)}
        </span>
      ))}
      {r.validity.length === 0 && <span className="text-ink-faint">no condition stated</span>}
    </div>
  );
}

function Comparison({ r, id }: { r: ConvertResult; id: string }) {
  const best = bestReference(r.reference_bounds);
  if (!best) return <span className="text-sm text-ink-faint">no published bound on it in the catalogue</span>;
  const tone = best.verdict === "tighter" ? "text-moss" : best.verdict === "weaker" ? "text-ink-soft" : best.verdict === "not_compared" ? "text-ink-faint" : "text-ink";
  const others = r.reference_bounds.filter((c) => c !== best).map((c) => c.sentence);
  return (
    <span className={`block text-sm ${tone}`} title={others.join("\n") || undefined} data-testid={`comparison-${id}`}>
      {best.sentence}
    </span>
  );
}

interface Props {
  results: ConvertResult[];
  onConvention: (theory: string, convention: string) => void;
}

export function ResultsTable({ results, onConvention }: Props) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const multi = useMemo(() => {
    const seen = new Map<string, number>();
    for (const r of results) seen.set(r.theory, (seen.get(r.theory) ?? 0) + 1);
    return new Set([...seen].filter(([, n]) => n > 1).map(([t]) => t));
  }, [results]);
  const columns = useMemo(
    () => [
      column.accessor("theory_name", {
        header: "Theory",
        cell: (c) => {
          const r = c.row.original;
          return (
            <div className="flex min-w-[8rem] max-w-[11rem] flex-col gap-1">
              <span className="font-semibold">{r.theory_name}</span>
              {multi.has(r.theory) && <span className="text-xs text-ink-soft">coupling {symbolText(r.canonical.symbol, r.canonical.latex)} (one row per coupling)</span>}
              {r.conventions_available.length > 1 ? (
                <label className="text-xs text-ink-soft">
                  convention{" "}
                  <select
                    className="rounded border border-paper-edge bg-white/70 px-1 py-0.5 text-xs"
                    value={r.convention}
                    aria-label={`Convention for ${r.theory_name}`}
                    onChange={(e) => onConvention(r.theory, e.target.value)}
                  >
                    {r.conventions_available.map((name) => (
                      <option key={name} value={name}>
                        {name}
                      </option>
                    ))}
                  </select>
                </label>
              ) : (
                <span className="text-xs text-ink-faint">convention {r.convention}</span>
              )}
            </div>
          );
        },
      }),
      column.accessor((r) => r.coupling.value, { id: "limit", header: "Limit, against published bounds, and how it follows", enableSorting: false, cell: (c) => <Limit r={c.row.original} id={rowKey(c.row.original, multi)} /> }),
      column.accessor("verdict", { header: "Validity", cell: (c) => <Validity r={c.row.original} id={rowKey(c.row.original, multi)} /> }),
      column.display({
        id: "cautions",
        header: "Cautions",
        cell: (c) => <CautionList cautions={c.row.original.cautions} compact testId={`cautions-${rowKey(c.row.original, multi)}`} />,
      }),
    ],
    [onConvention, multi],
  );
  // TanStack Table's instance is mutable by design; the React compiler must leave this component alone.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: results,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  return (
    <DataTable
      table={table}
      caption="Limits on every applicable theory"
      empty="No catalogued theory enters at this b."
      rowTestId={(r) => `result-${rowKey(r, multi)}`}
      // On phones the validity column scrolls out of view: the verdict stays beside the theory's name.
      pinnedOnSmall={(r) => (
        <span data-testid={`verdict-small-${rowKey(r, multi)}`}>
          <VerdictBadge verdict={r.verdict} />
        </span>
      )}
    />
  );
}
