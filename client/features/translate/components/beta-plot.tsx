import { useCallback, useMemo } from "react";
import { PlotFigure } from "../../../components/ui/figure.tsx";
import { labelsMarginTop, MARK_ORDER, MARK_STYLE, theoryLabels, theoryRules, widthForLabels, type TheoryMark } from "../../../components/ui/theory-labels.ts";
import type { PlotModule } from "../../../lib/plot.ts";
import { decadeLabel, formatPlain } from "./sci-number.tsx";

export type { MarkState, TheoryMark } from "../../../components/ui/theory-labels.ts";

export interface BetaPoint {
  b: number;
  beta_max: number;
  label: string;
}

const INK = "#1d2528";
const SEA = "#24484a";
const WIDTH = 760;

/** The bound on |β| against b, on a log axis, with every catalogued theory drawn at the b it enters at, marked by its verdict. */
export function BetaPlot({ points, theories }: { points: readonly BetaPoint[]; theories: readonly TheoryMark[] }) {
  const labels = useMemo(() => theoryLabels(theories), [theories]);
  const build = useCallback(
    (Plot: PlotModule, room: number) => {
      const finite = points.filter((p) => Number.isFinite(p.beta_max) && p.beta_max > 0).sort((a, b) => a.b - b.b);
      const bs = [...finite.map((p) => p.b), ...labels.map((l) => l.b)];
      const ys = finite.map((p) => p.beta_max);
      const xDomain: [number, number] = bs.length ? [Math.min(...bs) - 1, Math.max(...bs) + 1] : [-14, 4];
      const yDomain: [number, number] = ys.length ? [Math.min(...ys) / 30, Math.max(...ys) * 30] : [1e-6, 1];
      const marginLeft = room < 480 ? 48 : 64;
      const marginRight = 16;
      // Every label keeps its size and its own column: with many theories on a phone the plot grows wider and scrolls in its box.
      const width = Math.max(room, widthForLabels(labels.length, marginLeft, marginRight));
      const marginTop = labelsMarginTop(labels);
      return Plot.plot({
        width,
        height: marginTop + (room < 480 ? 150 : 170),
        // Theory names stand upright above the frame, so neighbouring b values never overprint.
        marginTop,
        marginLeft,
        marginRight,
        style: { fontFamily: '"Source Serif 4", Georgia, serif', fontSize: "12px", background: "transparent", color: INK },
        x: { domain: xDomain, label: "ppE exponent b", labelAnchor: "center", grid: true, ticks: Math.max(3, Math.floor((width - marginLeft - marginRight) / 60)) },
        y: { type: "log", domain: yDomain, label: "bound on |β|", labelAnchor: "center", grid: true, tickFormat: decadeLabel },
        marks: [
          ...theoryRules(Plot, labels, INK),
          Plot.line(finite, { x: "b", y: "beta_max", stroke: SEA, strokeOpacity: 0.4 }),
          Plot.dot(finite, { x: "b", y: "beta_max", fill: SEA, r: 4, title: (p: BetaPoint) => `${p.label}: |β| ≤ ${formatPlain(p.beta_max)} at b = ${p.b}` }),
        ],
      });
    },
    [points, labels],
  );
  const present = MARK_ORDER.filter((s) => labels.some((l) => l.state === s));
  return (
    <PlotFigure
      build={build}
      width={WIDTH}
      title="Bound on |β| against the ppE exponent b, with the catalogued theories"
      filename="beta-against-b"
      testId="beta-plot"
      legend={[{ mark: "●", color: SEA, label: "the bound given, as |β| at its b" }, ...present.map((s) => MARK_STYLE[s])]}
      caption="Points: the bounds given (gIMR bounds converted to β for this binary). Vertical lines: where each catalogued theory's mapping enters; each theory is marked with the verdict on its limit. A slanted line joins a name to its b where neighbouring names needed the room."
    />
  );
}
