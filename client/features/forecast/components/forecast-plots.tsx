import { useCallback, useMemo } from "react";
import type { ForecastResponse } from "../../../../common/forecasts.ts";
import { shortTheoryName } from "../../../../common/theory-name.ts";
import { conditionText, texText } from "../../../../common/symbol-text.ts";
import { NARROW_PX, PlotFigure, type LegendEntry } from "../../../components/ui/figure.tsx";
import { unitLabel } from "../../../components/ui/text-format.ts";
import { labelsMarginTop, MARK_ORDER, MARK_STYLE, theoryLabels, theoryRules, widthForLabels, type MarkState, type TheoryMark } from "../../../components/ui/theory-labels.ts";
import type { PlotModule } from "../../../lib/plot.ts";
import { decadeLabel, formatPlain } from "../../translate/components/sci-number.tsx";

/** One colour per network, from the house palette (sea, amber, brick) and three quieter companions. */
export const NETWORK_COLOURS = ["#24484a", "#9a6412", "#8f3a2c", "#4a5d8a", "#6b7f3a", "#5a3d6b", "#2f6f8f", "#7a6a55"];
const INK = "#1d2528";
const CAUTION = "#7f520f";
const FONT = { fontFamily: '"Source Serif 4", Georgia, serif', fontSize: "12px", background: "transparent", color: INK };
/** Full width of both plots on a wide page, and of their downloaded files. */
const WIDTH = 780;

/** One legend line per network, in its colour (the page shows it under the plot; the files carry it). */
function networkLegend(r: ForecastResponse): LegendEntry[] {
  return r.networks.map((_, i) => ({ mark: "●", color: NETWORK_COLOURS[i % NETWORK_COLOURS.length]!, label: networkName(r, i) }));
}

/** The forecast's cautions and each network's, as a downloaded figure writes them under the plot. */
export function forecastCautions(r: ForecastResponse): string[] {
  return [...r.cautions, ...r.networks.flatMap((n, i) => n.cautions.map((c) => `${networkName(r, i)}: ${c}`))].map(conditionText);
}

export function networkName(r: ForecastResponse, i: number): string {
  return r.networks[i]!.labels.join(" + ");
}

interface BoundPoint {
  network: string;
  b: number;
  bound: number;
  lowSnr: boolean;
}

/**
 * Every theory at the b it enters at, marked with the verdict on its limit from the network with the
 * tightest bound at that b (the one a reader quotes); a theory the forecast cannot constrain there is
 * marked so.
 */
export function theoryMarks(r: ForecastResponse): TheoryMark[] {
  const tightest = new Map<number, ForecastResponse["translations"][number]>();
  for (const t of r.translations) {
    const seen = tightest.get(t.b);
    if (!seen || t.beta_max < seen.beta_max) tightest.set(t.b, t);
  }
  const marks: TheoryMark[] = [];
  for (const t of tightest.values()) {
    for (const x of t.results) if (x.channel === "phase") marks.push({ b: x.b, theory: x.theory, name: shortTheoryName(x.theory_name, x.theory), state: x.verdict });
    for (const x of t.not_applicable) marks.push({ b: t.b, theory: x.theory, name: shortTheoryName(x.theory_name, x.theory), state: "not_constrained" });
  }
  return marks;
}

const LOW_SNR: LegendEntry = { mark: "○", color: CAUTION, label: "hollow point: network SNR below 10, where a Fisher estimate is not trustworthy" };

export function BoundPlot({ result }: { result: ForecastResponse }) {
  const labels = useMemo(() => theoryLabels(theoryMarks(result)), [result]);
  const build = useCallback(
    (Plot: PlotModule, room: number) => {
      const points: BoundPoint[] = result.networks.flatMap((n, i) =>
        n.rows.filter((row) => row.bound !== null && row.bound > 0).map((row) => ({ network: networkName(result, i), b: row.b, bound: row.bound!, lowSnr: n.snr.total < 10 })),
      );
      const bs = [...points.map((p) => p.b), ...labels.map((l) => l.b)];
      const ys = points.map((p) => p.bound);
      const names = result.networks.map((_, i) => networkName(result, i));
      const marginLeft = room < NARROW_PX ? 52 : 64;
      const marginRight = 16;
      const width = Math.max(room, widthForLabels(labels.length, marginLeft, marginRight));
      const marginTop = labelsMarginTop(labels);
      return Plot.plot({
        width,
        height: marginTop + (room < NARROW_PX ? 200 : 240),
        marginTop,
        marginLeft,
        marginRight,
        style: FONT,
        x: { domain: bs.length ? [Math.min(...bs) - 0.5, Math.max(...bs) + 0.5] : [-14, 7], label: "ppE exponent b", labelAnchor: "center", grid: true, ticks: Math.max(3, Math.floor((width - marginLeft - marginRight) / 60)) },
        y: {
          type: "log",
          domain: ys.length ? [Math.min(...ys) / 10, Math.max(...ys) * 10] : [1e-10, 1],
          label: room < NARROW_PX ? `bound on |β| (${Math.round(result.credibility * 100)} %)` : `forecast bound on |β| (${Math.round(result.credibility * 100)} %, ${result.sides}-sided)`,
          labelAnchor: "center",
          grid: true,
          tickFormat: decadeLabel,
        },
        color: { domain: names, range: NETWORK_COLOURS.slice(0, names.length) },
        marks: [
          ...theoryRules(Plot, labels, INK),
          Plot.line(points, { x: "b", y: "bound", stroke: "network", strokeWidth: 1.6 }),
          // Filled where the network's SNR allows a Fisher estimate, hollow where it does not (two marks: a fill channel cannot mix a colour with the scale).
          ...[false, true].map((low) =>
            Plot.dot(
              points.filter((p) => p.lowSnr === low),
              {
                x: "b",
                y: "bound",
                stroke: "network",
                ...(low ? { fill: "white", strokeWidth: 1.6 } : { fill: "network" }),
                r: 3.5,
                title: (p: BoundPoint) => `${p.network}: |β| < ${formatPlain(p.bound)} at b = ${p.b}${p.lowSnr ? " (SNR below 10: Fisher estimate not trustworthy)" : ""}`,
              },
            ),
          ),
        ],
      });
    },
    [result, labels],
  );
  const lowSnr = result.networks.some((n) => n.snr.total < 10 && n.rows.some((row) => row.bound !== null));
  const present = MARK_ORDER.filter((s) => labels.some((l) => l.state === s));
  return (
    <PlotFigure
      build={build}
      width={WIDTH}
      title="Forecast bound on |β| against b"
      filename="forecast-beta-against-b"
      testId="forecast-bound-plot"
      legend={[...networkLegend(result), ...(lowSnr ? [LOW_SNR] : []), ...present.map((s) => MARK_STYLE[s])]}
      cautions={forecastCautions(result)}
      caption="One line per network. Vertical lines: the b at which catalogued theories enter, each theory marked with the verdict on its limit from the network with the tightest bound there; a slanted line joins a name to its b where neighbouring names needed the room. b = 0 and 3 have no bound (degenerate with the coalescence phase and time)."
    />
  );
}

interface CouplingPoint {
  theory: string;
  network: string;
  ratio: number;
  verdict: MarkState;
  text: string;
}

/**
 * Each theory's forecast coupling limit per network, as a multiple of its tightest published bound
 * (> 1: the forecast is that many times tighter). Only theories with a comparable published bound
 * can be drawn on one axis; the table lists every theory. Rows are named by the theory's short name,
 * its coupling's symbol and b.
 */
export function couplingPoints(result: ForecastResponse): CouplingPoint[] {
  const out: CouplingPoint[] = [];
  for (const t of result.translations) {
    for (const x of t.results) {
      const ratios = x.reference_bounds.map((r) => r.ratio).filter((v): v is number => v !== null && Number.isFinite(v) && v > 0);
      if (ratios.length === 0) continue;
      // The published bound to beat is the tightest one: the smallest ratio.
      const ratio = Math.min(...ratios);
      const symbol = texText(x.coupling.latex);
      out.push({
        theory: `${shortTheoryName(x.theory_name, x.theory)}, ${symbol} (b = ${t.b})`,
        network: networkName(result, t.network),
        ratio,
        verdict: x.verdict,
        text: `${symbol} ${x.coupling.side === "upper" ? "<" : ">"} ${formatPlain(x.coupling.value)} ${unitLabel(x.coupling.unit)}`,
      });
    }
  }
  return out;
}

/** "Einstein-dilaton-Gauss-Bonnet gravity, √α (b = -7)" → "Einstein-dilaton-Gauss-Bonnet gr…, √α (b = -7)": the symbol and b kept. */
export function shortTheory(label: string, room = 34): string {
  const m = /^(.*?)((?:, [^,]*)? \(b = [^)]*\))$/.exec(label);
  const [name, tail] = m ? [m[1]!, m[2]!] : [label, ""];
  return name.length <= room ? label : `${name.slice(0, room - 1).trimEnd()}…${tail}`;
}

/** On a phone: the (cut) name on one line, the symbol and b under it, so both fit a narrow margin. */
export function twoLineTheory(label: string, room = 20): string {
  const m = /^(.*?), ([^,]*? \(b = [^)]*\))$/.exec(label);
  if (!m) return shortTheory(label, room);
  const name = m[1]!;
  return `${name.length <= room ? name : `${name.slice(0, room - 1).trimEnd()}…`}\n${m[2]!}`;
}

const VERDICT_STATES: readonly MarkState[] = ["valid", "outside_validity", "not_assessed"];

export function CouplingPlot({ result }: { result: ForecastResponse }) {
  const points = useMemo(() => couplingPoints(result), [result]);
  const build = useCallback(
    (Plot: PlotModule, width: number) => {
      const names = result.networks.map((_, i) => networkName(result, i));
      const xs = points.map((p) => p.ratio);
      const narrow = width < NARROW_PX;
      return Plot.plot({
        width,
        height: Math.max(160, 60 + (narrow ? 44 : 36) * new Set(points.map((p) => p.theory)).size),
        marginLeft: narrow ? 140 : 250,
        marginRight: 16,
        style: FONT,
        x: {
          type: "log",
          domain: xs.length ? [Math.min(1, ...xs) / 10, Math.max(1, ...xs) * 10] : [1e-3, 1e3],
          label: narrow ? "limit ÷ published bound →" : "forecast limit relative to the tightest published bound (> 1: tighter)",
          labelAnchor: "center",
          grid: true,
          tickFormat: decadeLabel,
          ticks: narrow ? 3 : undefined,
        },
        // Long theory names would run past the left edge: shortened at the end, the symbol and b kept.
        y: { label: null, tickFormat: (label: string) => (narrow ? twoLineTheory(label, 17) : shortTheory(label)) },
        color: { domain: names, range: NETWORK_COLOURS.slice(0, names.length) },
        marks: [
          Plot.ruleX([1], { stroke: INK, strokeWidth: 1.2 }),
          ...[true, false].map((valid) =>
            Plot.dot(
              points.filter((p) => (p.verdict === "valid") === valid),
              {
                x: "ratio",
                y: "theory",
                stroke: "network",
                ...(valid ? { fill: "network" } : { fill: "white", strokeWidth: 1.6 }),
                r: 5,
                title: (p: CouplingPoint) => `${p.network}: ${p.text}, ${formatPlain(p.ratio)} × the published bound; ${MARK_STYLE[p.verdict].label}`,
              },
            ),
          ),
          // The verdict by its mark as well as by the fill, so it survives print in grey.
          Plot.text(points, { x: "ratio", y: "theory", text: (p: CouplingPoint) => MARK_STYLE[p.verdict].mark, fill: (p: CouplingPoint) => MARK_STYLE[p.verdict].color, dy: -11, fontSize: 12, fontWeight: 700 }),
        ],
      });
    },
    [result, points],
  );
  const present = VERDICT_STATES.filter((s) => points.some((p) => p.verdict === s));
  return (
    <PlotFigure
      build={build}
      width={WIDTH}
      title="Theories: forecast coupling limit beside published bounds"
      filename="forecast-couplings"
      testId="forecast-coupling-plot"
      legend={[...networkLegend(result), ...present.map((s) => ({ ...MARK_STYLE[s], label: `${MARK_STYLE[s].label}${s === "valid" ? " (filled dot)" : " (hollow dot)"}` }))]}
      cautions={forecastCautions(result)}
      caption="Each dot: one network's forecast limit on a theory's coupling, divided by the tightest published bound shown with the theory (the vertical line at 1); above it, the verdict on that limit. Theories without a comparable published bound are only in the table."
    />
  );
}
