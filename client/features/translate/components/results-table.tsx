import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
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

function Limit({ r }: { r: ConvertResult }) {
  const rel = (side: "upper" | "lower") => (side === "upper" ? "≤" : "≥");
  return (
    <div className="flex min-w-[17rem] max-w-[22rem] flex-col gap-1">
      <span className="whitespace-nowrap" data-testid={`limit-${r.theory}`}>
        <MathTex tex={r.coupling.latex} label={r.coupling.symbol} /> {rel(r.coupling.side)} <SciNumber value={r.coupling.value} className="font-semibold" />{" "}
        {unitText(r.coupling.unit)}
      </span>
      {r.also.map((a) => (
        <span key={a.symbol} className="whitespace-nowrap text-sm text-ink-soft" data-testid={`also-${r.theory}-${a.symbol}`}>
          <MathTex tex={a.latex} label={a.symbol} /> {rel(a.side)} <SciNumber value={a.value} /> {unitText(a.unit)}
        </span>
      ))}
      <Comparison r={r} />
      <span className="mt-1 text-xs text-ink-faint">{r.method === "closed_form" ? "closed form" : "numerical root"}:</span>
      <MathTex tex={r.closed_form_latex} className="text-[0.8rem] text-ink-soft" />
    </div>
  );
}

function Validity({ r }: { r: ConvertResult }) {
  const failed = r.validity.filter((v) => !v.ok);
  return (
    <div className="flex min-w-[9rem] max-w-[12rem] flex-col gap-1 text-sm" data-testid={`validity-${r.theory}`}>
      {!r.valid ? <Badge tone="fail">not valid</Badge> : failed.length > 0 ? <Badge tone="caution">valid, with caution</Badge> : <Badge tone="ok">valid</Badge>}
      {failed.map((v) => (
        <span key={v.label} className={v.kind === "hard" ? "text-brick" : "text-amber"}>
          {v.label}: <SciNumber value={v.value ?? NaN} /> &gt; {thresholdText(v.max)}
        </span>
      ))}
      {r.validity.length === 0 && <span className="text-ink-faint">no condition stated</span>}
    </div>
  );
}

function Comparison({ r }: { r: ConvertResult }) {
  const best = bestReference(r.reference_bounds);
  if (!best) return <span className="text-sm text-ink-faint">no published bound on it in the catalogue</span>;
  const tone = best.verdict === "tighter" ? "text-moss" : best.verdict === "weaker" ? "text-ink-soft" : "text-ink";
  const others = r.reference_bounds.filter((c) => c !== best).map((c) => c.sentence);
  return (
    <span className={`block text-sm ${tone}`} title={others.join("\n") || undefined} data-testid={`comparison-${r.theory}`}>
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
  const columns = useMemo(
    () => [
      column.accessor("theory_name", {
        header: "Theory",
        cell: (c) => {
          const r = c.row.original;
          return (
            <div className="flex min-w-[8rem] max-w-[11rem] flex-col gap-1">
              <span className="font-semibold">{r.theory_name}</span>
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
      column.accessor((r) => r.coupling.value, { id: "limit", header: "Limit, against published bounds, and how it follows", enableSorting: false, cell: (c) => <Limit r={c.row.original} /> }),
      column.accessor("valid", { header: "Validity", cell: (c) => <Validity r={c.row.original} /> }),
      column.display({
        id: "cautions",
        header: "Cautions",
        cell: (c) => <CautionList cautions={c.row.original.cautions} compact testId={`cautions-${c.row.original.theory}`} />,
      }),
    ],
    [onConvention],
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
      rowTestId={(r) => `result-${r.theory}`}
      pinnedOnSmall={(r) => <VerdictBadge r={r} />}
    />
  );
}

/** The verdict alone, kept beside the theory's name on phones, where the validity column scrolls out of view. */
function VerdictBadge({ r }: { r: ConvertResult }) {
  const failed = r.validity.some((v) => !v.ok);
  return (
    <span data-testid={`verdict-small-${r.theory}`}>
      {!r.valid ? <Badge tone="fail">not valid</Badge> : failed ? <Badge tone="caution">valid, with caution</Badge> : <Badge tone="ok">valid</Badge>}
    </span>
  );
}
