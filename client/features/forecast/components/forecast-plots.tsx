import { useCallback } from "react";
import type { ForecastResponse } from "../../../../common/forecasts.ts";
import { texText } from "../../../../common/symbol-text.ts";
import { unitLabel } from "../../../components/ui/text-format.ts";
import type { PlotModule } from "../../../lib/plot.ts";
import { decadeLabel, formatPlain } from "../../translate/components/sci-number.tsx";
import { ForecastFigure } from "./forecast-figure.tsx";

/** One colour per network, from the house palette (sea, amber, brick) and three quieter companions. */
export const NETWORK_COLOURS = ["#24484a", "#9a6412", "#8f3a2c", "#4a5d8a", "#6b7f3a", "#5a3d6b", "#2f6f8f", "#7a6a55"];
const INK = "#1d2528";
const FONT = { fontFamily: '"Source Serif 4", Georgia, serif', fontSize: "12px", background: "transparent", color: INK };

/**
 * The legend drawn inside the SVG (below the frame), so a downloaded file carries it and the page
 * shows one SVG per plot.
 */
function legendMarks(Plot: PlotModule, names: readonly string[]) {
  return names.map((name, i) =>
    Plot.text([name], { frameAnchor: "bottom-left", dy: 46 + 15 * i, text: (d: string) => `● ${d}`, fill: NETWORK_COLOURS[i % NETWORK_COLOURS.length], textAnchor: "start", fontSize: 11.5 }),
  );
}

const legendMargin = (n: number) => 56 + 15 * n;

export function networkName(r: ForecastResponse, i: number): string {
  return r.networks[i]!.labels.join(" + ");
}

interface BoundPoint {
  network: string;
  b: number;
  bound: number;
  lowSnr: boolean;
}

/** Theories that enter at each b, from the translations (results and not-applicable alike). */
export function theoryMarks(r: ForecastResponse): { b: number; label: string }[] {
  const byB = new Map<number, Set<string>>();
  for (const t of r.translations) {
    const set = byB.get(t.b) ?? new Set<string>();
    for (const x of t.results) set.add(x.theory_name);
    for (const x of t.not_applicable) set.add(x.theory_name);
    byB.set(t.b, set);
  }
  return [...byB.entries()].filter(([, s]) => s.size > 0).sort((a, b) => a[0] - b[0]).map(([b, s]) => ({ b, label: [...s].sort().join(" · ") }));
}

export function BoundPlot({ result }: { result: ForecastResponse }) {
  const build = useCallback(
    (Plot: PlotModule) => {
      const points: BoundPoint[] = result.networks.flatMap((n, i) =>
        n.rows.filter((row) => row.bound !== null && row.bound > 0).map((row) => ({ network: networkName(result, i), b: row.b, bound: row.bound!, lowSnr: n.snr.total < 10 })),
      );
      const marks = theoryMarks(result);
      const bs = [...points.map((p) => p.b), ...marks.map((m) => m.b)];
      const ys = points.map((p) => p.bound);
      const names = result.networks.map((_, i) => networkName(result, i));
      return Plot.plot({
        width: 780,
        height: 380 + legendMargin(names.length),
        marginTop: 170,
        marginLeft: 64,
        marginBottom: legendMargin(names.length),
        style: FONT,
        x: { domain: bs.length ? [Math.min(...bs) - 0.5, Math.max(...bs) + 0.5] : [-14, 7], label: "ppE exponent b", labelAnchor: "center", grid: true },
        y: { type: "log", domain: ys.length ? [Math.min(...ys) / 10, Math.max(...ys) * 10] : [1e-10, 1], label: `forecast bound on |β| (${Math.round(result.credibility * 100)} %, ${result.sides}-sided)`, labelAnchor: "center", grid: true, tickFormat: decadeLabel },
        color: { domain: names, range: NETWORK_COLOURS.slice(0, names.length) },
        marks: [
          ...legendMarks(Plot, names),
          Plot.ruleX(marks, { x: "b", stroke: "#7f520f", strokeOpacity: 0.5, strokeDasharray: "3,3" }),
          Plot.text(marks, { x: "b", text: "label", frameAnchor: "top", dy: -6, rotate: -90, textAnchor: "start", lineAnchor: "middle", fill: "#7f520f", fontSize: 10 }),
          Plot.line(points, { x: "b", y: "bound", stroke: "network", strokeWidth: 1.6 }),
          Plot.dot(points, {
            x: "b",
            y: "bound",
            stroke: "network",
            fill: (p: BoundPoint) => (p.lowSnr ? "white" : p.network),
            r: 3.5,
            title: (p: BoundPoint) => `${p.network}: |β| < ${formatPlain(p.bound)} at b = ${p.b}${p.lowSnr ? " (SNR below 10: Fisher estimate not trustworthy)" : ""}`,
          }),
        ],
      });
    },
    [result],
  );
  return (
    <ForecastFigure
      build={build}
      title="Forecast bound on |β| against b"
      filename="forecast-beta-against-b"
      testId="forecast-bound-plot"
      caption="One line per network. Hollow points: network SNR below 10, where a Fisher estimate is not trustworthy. Dashed lines: the b at which catalogued theories enter. b = 0 and 3 have no bound (degenerate with the coalescence phase and time)."
    />
  );
}

interface CouplingPoint {
  theory: string;
  network: string;
  ratio: number;
  valid: boolean;
  text: string;
}

/**
 * Each theory's forecast coupling limit per network, as a multiple of its tightest published bound
 * (> 1: the forecast is that many times tighter). Only theories with a comparable published bound
 * can be drawn on one axis; the table lists every theory.
 */
export function couplingPoints(result: ForecastResponse): CouplingPoint[] {
  const out: CouplingPoint[] = [];
  for (const t of result.translations) {
    for (const x of t.results) {
      const ratios = x.reference_bounds.map((r) => r.ratio).filter((v): v is number => v !== null && Number.isFinite(v) && v > 0);
      if (ratios.length === 0) continue;
      // The published bound to beat is the tightest one: the smallest ratio.
      const ratio = Math.min(...ratios);
      out.push({
        theory: `${x.theory_name} (b = ${t.b})`,
        network: networkName(result, t.network),
        ratio,
        valid: x.verdict === "valid",
        text: `${texText(x.coupling.latex)} ${x.coupling.side === "upper" ? "<" : ">"} ${formatPlain(x.coupling.value)} ${unitLabel(x.coupling.unit)}`,
      });
    }
  }
  return out;
}

/** "Einstein-dilaton-Gauss-Bonnet gravity (linear, shift-symmetric coupling) (b = -7)" → "Einstein-dilaton-Gauss-Bonnet gr… (b = -7)". */
export function shortTheory(label: string): string {
  const m = /^(.*?)( \(b = [^)]*\))$/.exec(label);
  const [name, b] = m ? [m[1]!, m[2]!] : [label, ""];
  const room = 34;
  return name.length <= room ? label : `${name.slice(0, room - 1).trimEnd()}…${b}`;
}

export function CouplingPlot({ result }: { result: ForecastResponse }) {
  const build = useCallback(
    (Plot: PlotModule) => {
      const points = couplingPoints(result);
      const names = result.networks.map((_, i) => networkName(result, i));
      const xs = points.map((p) => p.ratio);
      return Plot.plot({
        width: 780,
        height: Math.max(160, 60 + 36 * new Set(points.map((p) => p.theory)).size) + legendMargin(names.length),
        marginLeft: 230,
        marginBottom: legendMargin(names.length),
        style: FONT,
        x: { type: "log", domain: xs.length ? [Math.min(1, ...xs) / 10, Math.max(1, ...xs) * 10] : [1e-3, 1e3], label: "forecast limit relative to the tightest published bound (> 1: tighter)", labelAnchor: "center", grid: true, tickFormat: decadeLabel },
        // Long theory names would run past the left edge: shortened at the end, the b kept.
        y: { label: null, tickFormat: shortTheory },
        color: { domain: names, range: NETWORK_COLOURS.slice(0, names.length) },
        marks: [
          ...legendMarks(Plot, names),
          Plot.ruleX([1], { stroke: INK, strokeWidth: 1.2 }),
          Plot.dot(points, {
            x: "ratio",
            y: "theory",
            stroke: "network",
            fill: (p: CouplingPoint) => (p.valid ? p.network : "white"),
            r: 5,
            title: (p: CouplingPoint) => `${p.network}: ${p.text}, ${formatPlain(p.ratio)} × the published bound${p.valid ? "" : " (not shown valid: outside validity or not assessed)"}`,
          }),
        ],
      });
    },
    [result],
  );
  return (
    <ForecastFigure
      build={build}
      title="Theories: forecast coupling limit beside published bounds"
      filename="forecast-couplings"
      testId="forecast-coupling-plot"
      caption="Each dot: one network's forecast limit on a theory's coupling, divided by the tightest published bound shown with the theory (the vertical line). Hollow dots: the limit is not shown valid (outside the mapping's validity, or not assessed). Theories without a comparable published bound are only in the table."
    />
  );
}
