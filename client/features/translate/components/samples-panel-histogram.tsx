import { useCallback } from "react";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";
import type { SamplesResponse } from "../../../../common/convert-samples.ts";
import type { PlotModule } from "../../../lib/plot.ts";
import { PlotFigure } from "../../../components/ui/figure.tsx";
import { decadeLabel, formatPlain, unitText } from "./sci-number.tsx";

const SEA = "#24484a";
const BRICK = "#8f3a2c";

interface Bin {
  x1: number;
  x2: number;
  count: number;
}

export function histogramBins(h: SamplesResponse["histogram"]): Bin[] {
  return h.counts.map((count, i) => ({ x1: h.edges[i]!, x2: h.edges[i + 1]!, count }));
}

/** The translated samples on log-spaced bins, with the credible bound drawn across them. */
export function SamplesHistogram({ data }: { data: SamplesResponse }) {
  const build = useCallback(
    (Plot: PlotModule, width: number) => {
      const bins = histogramBins(data.histogram);
      if (bins.length === 0) throw new Error("no positive sample to plot");
      const unit = unitText(data.coupling.unit);
      const { value } = data.coupling;
      const wide = bins[bins.length - 1]!.x2 / bins[0]!.x1 >= 100;
      return Plot.plot({
        width,
        height: 240,
        marginLeft: 50,
        style: { fontFamily: '"Source Serif 4", Georgia, serif', fontSize: "12px", background: "transparent" },
        // Within less than two decades powers of ten give too few labels: plain numbers instead.
        x: { type: "log", label: `${symbolText(data.coupling.symbol, data.coupling.latex)}${unit ? ` (${unit})` : ""} →`, ...(wide ? { tickFormat: decadeLabel } : { ticks: 4, tickFormat: (d: number) => formatPlain(d, 2) }) },
        y: { label: "↑ samples", grid: true },
        marks: [
          Plot.rectY(bins, { x1: "x1", x2: "x2", y: "count", fill: SEA, fillOpacity: 0.55, inset: 0.5 }),
          Plot.ruleY([0]),
          Plot.ruleX([value], { stroke: BRICK, strokeWidth: 2 }),
          Plot.text([value], { x: (d: number) => d, frameAnchor: "top", dy: 4, dx: data.coupling.side === "upper" ? -4 : 4, textAnchor: data.coupling.side === "upper" ? "end" : "start", text: () => `${data.coupling.side === "upper" ? "≤" : "≥"} ${formatPlain(value)}`, fill: BRICK }),
        ],
      });
    },
    [data],
  );
  return (
    <PlotFigure
      build={build}
      width={560}
      title={`${data.theory_name}: ${symbolText(data.coupling.symbol, data.coupling.latex)} per sample`}
      filename={`${data.theory}-${data.coupling.symbol}-samples`}
      testId="samples-histogram"
      legend={[{ mark: "│", color: BRICK, label: `the ${Math.round(data.credibility * 1000) / 10}% ${data.coupling.side} bound` }]}
      cautions={[
        ...data.validity.filter((v) => v.fraction_ok < 1).map((v) => `${conditionText(v.label)}: fails for ${formatPlain((1 - v.fraction_ok) * 100, 2)}% of the ${v.evaluated} samples checked (${conditionText(v.condition)})`),
        ...data.cautions.map((c) => conditionText(c.message)),
      ]}
      caption={`Each sample's ${symbolText(data.coupling.symbol, data.coupling.latex)} at its own binary; brick: the ${Math.round(data.credibility * 1000) / 10}% ${data.coupling.side} bound. Not reweighted for the prior.`}
    />
  );
}
