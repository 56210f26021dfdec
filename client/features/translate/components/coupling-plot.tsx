import { useCallback } from "react";
import type { PlotModule } from "../../../lib/plot.ts";
import type { ConvertResult, QuotedValueDto } from "../../../../common/convert.ts";
import { symbolText } from "../../../../common/symbol-text.ts";
import { NARROW_PX, PlotFigure, type LegendEntry } from "../../../components/ui/figure.tsx";
import { decadeLabel, formatPlain, unitText } from "./sci-number.tsx";

interface Row {
  label: string;
  value: number;
  ours: boolean;
}

const SEA = "#24484a";
const AMBER = "#9a6412";

/**
 * The quantity this translation can be compared in (the coupling itself, or a form quoted beside it
 * such as m_g beside lambda_g), with the published bounds on that same quantity.
 */
export function comparableQuantity(result: ConvertResult): { quantity: QuotedValueDto; rows: Row[] } | undefined {
  const forms = [result.coupling, ...result.also];
  for (const quantity of forms) {
    const refs = result.reference_bounds.filter((c) => c.ratio !== null && c.value > 0 && c.symbol === quantity.symbol && c.unit === quantity.unit && c.side === quantity.side);
    if (refs.length === 0) continue;
    return { quantity, rows: [{ label: ourLabel(result), value: quantity.value, ours: true }, ...refs.map((c) => ({ label: `◆ ${c.reference.citation}`, value: c.value, ours: false }))] };
  }
  return undefined;
}

/** Published bounds are compared only with a valid limit; a stretched rule of thumb is said beside it. */
function stretched(result: ConvertResult): boolean {
  return result.validity.some((v) => v.status === "stretched");
}

function ourLabel(result: ConvertResult): string {
  return stretched(result) ? "✓ this translation (stretched)" : "✓ this translation";
}

function legendFor(result: ConvertResult): LegendEntry[] {
  return [
    stretched(result)
      ? { mark: "✓", color: SEA, label: "this translation: valid, but a rule-of-thumb condition is exceeded (by at most 10 times) at the limit" }
      : { mark: "✓", color: SEA, label: "this translation: every validity condition holds at the limit" },
    { mark: "◆", color: AMBER, label: "published bound on the same quantity, from the catalogue" },
    { mark: "▬", color: "#5a6467", label: "shaded bar: the side each limit allows" },
  ];
}

export function CouplingPlot({ result }: { result: ConvertResult }) {
  const build = useCallback(
    (Plot: PlotModule, width: number) => {
      const found = comparableQuantity(result);
      if (!found) throw new Error("no published bound in the same quantity");
      const { quantity, rows } = found;
      const values = rows.map((r) => r.value);
      const lo = Math.min(...values) / 10;
      const hi = Math.max(...values) * 10;
      const upper = quantity.side === "upper";
      const unit = unitText(quantity.unit);
      const symbol = symbolText(quantity.symbol, quantity.latex);
      return Plot.plot({
        width,
        height: 50 + 34 * rows.length,
        // On a phone the row names get less room and are cut at the end (the full name is in the tooltip and the table).
        marginLeft: width < NARROW_PX ? 128 : 200,
        style: { fontFamily: '"Source Serif 4", Georgia, serif', fontSize: "12px", background: "transparent" },
        x: { type: "log", domain: [lo, hi], label: `${symbol}${unit ? ` (${unit})` : ""} →`, grid: true, tickFormat: decadeLabel, ...(width < NARROW_PX ? { ticks: 3 } : {}) },
        y: { label: null, domain: rows.map((r) => r.label), tickFormat: (label: string) => (width < NARROW_PX && label.length > 19 ? `${label.slice(0, 18).trimEnd()}…` : label) },
        marks: [
          Plot.ruleY(rows, {
            y: "label",
            x1: upper ? lo : "value",
            x2: upper ? "value" : hi,
            stroke: (r: Row) => (r.ours ? SEA : AMBER),
            strokeWidth: 6,
            strokeOpacity: 0.25,
          }),
          // Ours a circle, published bounds diamonds: told apart by shape, not colour alone.
          Plot.dot(rows.filter((r) => r.ours), { y: "label", x: "value", r: 5, fill: SEA, title: (r: Row) => `${r.label}: ${formatPlain(r.value)} ${unit}` }),
          Plot.dot(rows.filter((r) => !r.ours), { y: "label", x: "value", r: 6, symbol: "diamond", fill: AMBER, title: (r: Row) => `${r.label}: ${formatPlain(r.value)} ${unit}` }),
          Plot.text(rows, { y: "label", x: "value", text: (r: Row) => formatPlain(r.value), dy: -11, fontSize: 11 }),
        ],
      });
    },
    [result],
  );
  const quantity = comparableQuantity(result)?.quantity ?? result.coupling;
  return (
    <PlotFigure
      build={build}
      width={560}
      title={`${result.theory_name}: ${quantity.side === "upper" ? "upper" : "lower"} limits on ${symbolText(quantity.symbol, quantity.latex)}${result.convention !== "canonical" ? ` (convention ${result.convention})` : ""}`}
      filename={`${result.theory}-${quantity.symbol}-limits`}
      testId={`coupling-plot-${result.theory}`}
      legend={legendFor(result)}
      caption="Only limits valid at this bound are plotted against published bounds."
    />
  );
}
