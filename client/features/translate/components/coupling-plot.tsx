import { useCallback } from "react";
import type { PlotModule } from "../../../lib/plot.ts";
import type { ConvertResult, QuotedValueDto } from "../../../../common/convert.ts";
import { PlotFigure } from "./plot-figure.tsx";
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
    return { quantity, rows: [{ label: "this bound", value: quantity.value, ours: true }, ...refs.map((c) => ({ label: c.reference.citation, value: c.value, ours: false }))] };
  }
  return undefined;
}

export function CouplingPlot({ result }: { result: ConvertResult }) {
  const build = useCallback(
    (Plot: PlotModule) => {
      const found = comparableQuantity(result);
      if (!found) throw new Error("no published bound in the same quantity");
      const { quantity, rows } = found;
      const values = rows.map((r) => r.value);
      const lo = Math.min(...values) / 10;
      const hi = Math.max(...values) * 10;
      const upper = quantity.side === "upper";
      const unit = unitText(quantity.unit);
      return Plot.plot({
        width: 560,
        height: 50 + 34 * rows.length,
        marginLeft: 170,
        style: { fontFamily: '"Source Serif 4", Georgia, serif', fontSize: "12px", background: "transparent" },
        x: { type: "log", domain: [lo, hi], label: `${quantity.symbol}${unit ? ` (${unit})` : ""} →`, grid: true, tickFormat: decadeLabel },
        y: { label: null, domain: rows.map((r) => r.label) },
        marks: [
          Plot.ruleY(rows, {
            y: "label",
            x1: upper ? lo : "value",
            x2: upper ? "value" : hi,
            stroke: (r: Row) => (r.ours ? SEA : AMBER),
            strokeWidth: 6,
            strokeOpacity: 0.25,
          }),
          Plot.dot(rows, { y: "label", x: "value", r: 5, fill: (r: Row) => (r.ours ? SEA : AMBER), title: (r: Row) => `${r.label}: ${formatPlain(r.value)} ${unit}` }),
          Plot.text(rows, { y: "label", x: "value", text: (r: Row) => formatPlain(r.value), dy: -10, fontSize: 10 }),
        ],
      });
    },
    [result],
  );
  const quantity = comparableQuantity(result)?.quantity ?? result.coupling;
  return (
    <PlotFigure
      build={build}
      title={`${result.theory_name}: ${quantity.side === "upper" ? "upper" : "lower"} limits on ${quantity.symbol}`}
      filename={`${result.theory}-${quantity.symbol}-limits`}
      testId={`coupling-plot-${result.theory}`}
      caption="Shaded: the side each limit allows. Sea: this translation; amber: published bounds in the catalogue."
    />
  );
}
