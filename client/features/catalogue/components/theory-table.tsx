import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { conditionText } from "../../../../common/symbol-text.ts";
import { useMemo, useState } from "react";
import { Link } from "react-router-dom";
import { FAMILY_LABELS, type TheorySummary } from "../../../../common/catalogue.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { RetiredBadge } from "./retirement.tsx";
import { DataTable } from "../../../components/ui/data-table.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { paths } from "../../../lib/paths.ts";
import { pnLabel, shortDate, signed, unitLabel } from "./format.ts";
import { SourceStatusTag, SourceStatusTally } from "./source-status.tsx";

const col = createColumnHelper<TheorySummary>();

/** Sorting by "b" uses the most negative exponent (the lowest PN order the theory enters at). */
function lowestB(t: TheorySummary): number {
  const bs = t.mappings.map((m) => m.b).filter((b): b is number => b !== null);
  return bs.length ? Math.min(...bs) : Number.POSITIVE_INFINITY;
}

const columns = [
  col.accessor("name", {
    header: "Theory",
    cell: (info) => {
      const t = info.row.original;
      return (
        <div className="min-w-56">
          <Link to={paths.theory(t.slug)} className="font-semibold">
            {t.name}
          </Link>
          <p className="text-sm text-ink-soft line-clamp-2 max-w-prose">{conditionText(t.summary)}</p>
          <SourceStatusTally statuses={t.mappings.filter((m) => !m.retired).map((m) => m.source_status)} className="mt-1" />
          {t.retired && <RetiredBadge retired={t.retired} className="mt-1 mr-1" />}
          {t.source_to_be_confirmed && (
            <Badge tone="caution" className="mt-1" title="Something in this entry (a formula, a value or a reference detail) was recalled rather than read in its paper; an editor still has to confirm it.">
              source to be confirmed
            </Badge>
          )}
        </div>
      );
    },
  }),
  // Family names wrap ("Parameterized / black hole") so the table fits a laptop screen without scrolling.
  col.accessor((t) => FAMILY_LABELS[t.family], { id: "family", header: "Family", cell: (info) => <span className="block min-w-24">{info.getValue()}</span> }),
  col.display({
    id: "couplings",
    header: "Couplings",
    cell: (info) => (
      <ul className="flex flex-col gap-0.5">
        {info.row.original.couplings.map((c) => (
          <li key={c.symbol} className="whitespace-nowrap">
            <MathTex tex={c.latex} html={c.latex_html} /> <span className="text-xs text-ink-faint">{unitLabel(c.unit)}</span>
          </li>
        ))}
      </ul>
    ),
  }),
  col.accessor(lowestB, {
    id: "b",
    header: "ppE b / PN order",
    // Lowest PN order first on the first click, as the literature lists corrections.
    sortDescFirst: false,
    cell: (info) => (
      <ul className="flex flex-col gap-0.5 tabular-nums">
        {info.row.original.mappings.map((m, i) => (
          <li key={i} className="whitespace-nowrap">
            {m.b !== null ? <Exponent name="b" value={m.b} /> : m.a !== null ? <Exponent name="a" value={m.a} /> : <span>{m.kind.replace(/_/g, " ")}</span>}
            <span className="ml-2 text-sm text-ink-soft">{pnLabel(m.pn_order)}</span>
            <span className="ml-2">
              <SourceStatusTag status={m.source_status} />
            </span>
            {m.retired && <span className="ml-2 text-xs text-ink-faint">(retired)</span>}
          </li>
        ))}
      </ul>
    ),
  }),
  // The revision number sits under its date: one column instead of two keeps the table within 1366 px.
  col.accessor("updated_at", {
    header: "Updated",
    cell: (info) => (
      <span className="tabular-nums whitespace-nowrap">
        {shortDate(info.getValue())}
        <span className="block text-sm text-ink-soft">revision {info.row.original.revision}</span>
      </span>
    ),
  }),
];

/** "b = −7" typeset as math (italic symbol, true minus) without loading KaTeX on the list. */
function Exponent({ name, value }: { name: string; value: number }) {
  return (
    <span className="whitespace-nowrap">
      <i className="font-serif">{name}</i> = {signed(value)}
    </span>
  );
}

export function TheoryTable({ theories }: { theories: TheorySummary[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "name", desc: false }]);
  const data = useMemo(() => theories, [theories]);
  // TanStack Table returns fresh functions each render by design; the React Compiler must not memoise them.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: (t) => t.slug,
  });
  return <DataTable table={table} caption="Catalogued theories" empty="No theory matches these filters." rowTestId={(t) => `theory-row-${t.slug}`} />;
}
