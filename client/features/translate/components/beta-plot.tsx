import { useCallback } from "react";
import type { PlotModule } from "../../../lib/plot.ts";
import { PlotFigure } from "./plot-figure.tsx";
import { decadeLabel, formatPlain } from "./sci-number.tsx";

export interface BetaPoint {
  b: number;
  beta_max: number;
  label: string;
}

export interface TheoryMark {
  b: number;
  theory: string;
}

const INK = "#1d2528";
const SEA = "#24484a";
const AMBER = "#9a6412";

/** Groups theories entering at the same b into one label, so markers never overprint. */
export function theoryLabels(marks: readonly TheoryMark[]): { b: number; label: string }[] {
  const byB = new Map<number, Set<string>>();
  for (const m of marks) {
    if (!Number.isFinite(m.b)) continue;
    const set = byB.get(m.b) ?? new Set<string>();
    set.add(m.theory);
    byB.set(m.b, set);
  }
  return [...byB.entries()].sort((a, b) => a[0] - b[0]).map(([b, set]) => ({ b, label: [...set].sort().join(" · ") }));
}

/** The bound on |β| against b, on a log axis, with every catalogued theory drawn at the b it enters at. */
export function BetaPlot({ points, theories }: { points: readonly BetaPoint[]; theories: readonly TheoryMark[] }) {
  const build = useCallback(
    (Plot: PlotModule) => {
      const labels = theoryLabels(theories);
      const finite = points.filter((p) => Number.isFinite(p.beta_max) && p.beta_max > 0).sort((a, b) => a.b - b.b);
      const bs = [...finite.map((p) => p.b), ...labels.map((l) => l.b)];
      const ys = finite.map((p) => p.beta_max);
      const xDomain: [number, number] = bs.length ? [Math.min(...bs) - 1, Math.max(...bs) + 1] : [-14, 4];
      const yDomain: [number, number] = ys.length ? [Math.min(...ys) / 30, Math.max(...ys) * 30] : [1e-6, 1];
      return Plot.plot({
        width: 760,
        height: 340,
        // Theory names stand vertically above the frame, so neighbouring b values never overprint.
        marginTop: 200,
        marginLeft: 64,
        style: { fontFamily: '"Source Serif 4", Georgia, serif', fontSize: "12px", background: "transparent", color: INK },
        x: { domain: xDomain, label: "ppE exponent b", labelAnchor: "center", grid: true },
        y: { type: "log", domain: yDomain, label: "bound on |β|", labelAnchor: "center", grid: true, tickFormat: decadeLabel },
        marks: [
          Plot.ruleX(labels, { x: "b", stroke: AMBER, strokeOpacity: 0.6, strokeDasharray: "4,3" }),
          Plot.text(labels, { x: "b", text: "label", frameAnchor: "top", dy: -6, rotate: -90, textAnchor: "start", lineAnchor: "middle", fill: AMBER, fontSize: 10.5 }),
          Plot.line(finite, { x: "b", y: "beta_max", stroke: SEA, strokeOpacity: 0.4 }),
          Plot.dot(finite, { x: "b", y: "beta_max", fill: SEA, r: 4, title: (p: BetaPoint) => `${p.label}: |β| ≤ ${formatPlain(p.beta_max)} at b = ${p.b}` }),
        ],
      });
    },
    [points, theories],
  );
  return (
    <PlotFigure
      build={build}
      title="Bound on |β| against b"
      filename="beta-against-b"
      testId="beta-plot"
      caption="Points: the bounds given (gIMR bounds converted to β for this binary). Dashed lines: where each catalogued theory's mapping enters."
    />
  );
}
