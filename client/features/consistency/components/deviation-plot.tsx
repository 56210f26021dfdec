import { useCallback, useMemo } from "react";
import { Figure, NARROW_PX, type LegendEntry } from "../../../components/ui/figure.tsx";
import { MARK_STYLE, type MarkState } from "../../../components/ui/theory-labels.ts";

type Point = readonly [number, number];

export interface DeviationMark {
  x: number;
  /** What the mark says, in symbols ("√α = 4.1"). */
  label: string;
  /** The verdict on that coupling value; its mark and colour go with the label. */
  verdict: Exclude<MarkState, "not_constrained">;
}

export interface DeviationPlotProps {
  contours: readonly { level: number; paths: readonly (readonly Point[])[] }[];
  mean: Point;
  /** Expected deviation against the coupling, with the coupling value at each point. */
  track?: readonly { x: number; mean: Point }[];
  /** Coupling values to mark on the track (the bounds). */
  marks?: readonly DeviationMark[];
  /** The theory whose track is drawn, named in the legend. */
  trackName?: string;
  /** Written into the downloaded files; the page shows them in the caution box under the plot. */
  cautions?: readonly string[];
  title: string;
  filename: string;
}

const WIDTH = 560;
const INK = "#1b1b1b";
const BRICK = "#9a3b2e";
const DEEP = "#174a44";
/** Fill shades from the outermost (lightest) region inwards: our own palette on the site's sea colour. */
const SHADES = ["#d9ece9", "#a9d3cc", "#6fb3a8", "#3f8f84", "#276b62", "#174a44"];

export function niceTicks(lo: number, hi: number, count = 5): number[] {
  const span = hi - lo;
  if (!(span > 0)) return [lo];
  const raw = span / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((k) => k * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + 1e-12 * span; t += step) out.push(Math.abs(t) < 1e-12 * span ? 0 : t);
  return out;
}

const fmt = (v: number) => (Math.abs(v) >= 1e-3 || v === 0 ? Number(v.toPrecision(3)).toString().replace("-", "−") : v.toExponential(1).replace("-", "−"));

const SVG_NS = "http://www.w3.org/2000/svg";

function el(name: string, attrs: Record<string, string | number>, ...children: (Node | string)[]): SVGElement {
  const node = document.createElementNS(SVG_NS, name) as SVGElement;
  for (const [k, v] of Object.entries(attrs)) node.setAttribute(k, String(v));
  node.append(...children);
  return node;
}

/** "ΔM_f / M̄_f" as a reader writes it: the f set as a subscript (tspans, so the file keeps it). */
function ratioLabel(delta: string, bar: string, attrs: Record<string, string | number>): SVGElement {
  const sub = () => el("tspan", { "baseline-shift": "sub", "font-size": "75%" }, "f");
  return el("text", attrs, `Δ${delta}`, sub(), ` / ${bar}`, sub());
}

/** The deviation plane, drawn at a width: credible regions, the estimate, the GR point (0, 0) and, optionally, a theory's track. */
export function deviationSvg(p: Omit<DeviationPlotProps, "title" | "filename" | "cautions" | "trackName">, width: number): SVGSVGElement {
  const { contours, mean, track, marks } = p;
  const narrow = width < NARROW_PX;
  const W = width;
  const H = Math.round(Math.min(420, Math.max(300, W * 0.75)));
  const PAD = { left: narrow ? 56 : 64, right: 16, top: 16, bottom: 52 };
  const pts: Point[] = [[0, 0], mean];
  for (const c of contours) for (const ring of c.paths) pts.push(...ring);
  for (const t of track ?? []) pts.push(t.mean);
  let [x0, x1, y0, y1] = [Infinity, -Infinity, Infinity, -Infinity];
  for (const [x, y] of pts) {
    x0 = Math.min(x0, x);
    x1 = Math.max(x1, x);
    y0 = Math.min(y0, y);
    y1 = Math.max(y1, y);
  }
  const px = (x1 - x0 || 1) * 0.08;
  const py = (y1 - y0 || 1) * 0.08;
  [x0, x1, y0, y1] = [x0 - px, x1 + px, y0 - py, y1 + py];
  const sx = (x: number) => PAD.left + ((x - x0) / (x1 - x0)) * (W - PAD.left - PAD.right);
  const sy = (y: number) => H - PAD.bottom - ((y - y0) / (y1 - y0)) * (H - PAD.top - PAD.bottom);
  const ringPath = (ring: readonly Point[]) => ring.map(([x, y], i) => `${i === 0 ? "M" : "L"}${sx(x).toFixed(2)},${sy(y).toFixed(2)}`).join("") + "Z";
  const ticks = narrow ? 4 : 5;

  const svg = el("svg", { xmlns: SVG_NS, width: W, height: H, viewBox: `0 0 ${W} ${H}`, "font-family": '"Source Serif 4", Georgia, serif', style: "max-width: 100%; height: auto" }) as SVGSVGElement;
  svg.append(el("rect", { x: 0, y: 0, width: W, height: H, fill: "#ffffff" }));
  for (const t of niceTicks(x0, x1, ticks)) {
    svg.append(el("line", { x1: sx(t), x2: sx(t), y1: PAD.top, y2: H - PAD.bottom, stroke: "#e6e1d6" }));
    svg.append(el("text", { x: sx(t), y: H - PAD.bottom + 17, "font-size": 12, "text-anchor": "middle", fill: "#444" }, fmt(t)));
  }
  for (const t of niceTicks(y0, y1, ticks)) {
    svg.append(el("line", { x1: PAD.left, x2: W - PAD.right, y1: sy(t), y2: sy(t), stroke: "#e6e1d6" }));
    svg.append(el("text", { x: PAD.left - 6, y: sy(t) + 4, "font-size": 12, "text-anchor": "end", fill: "#444" }, fmt(t)));
  }
  const outerFirst = [...contours].sort((a, b) => b.level - a.level);
  outerFirst.forEach((c, i) => {
    svg.append(
      el(
        "path",
        { d: c.paths.map(ringPath).join(""), fill: SHADES[(contours.length - 1 - i) % SHADES.length]!, "fill-opacity": 0.55, "fill-rule": "evenodd", stroke: DEEP, "stroke-width": 1, "data-level": c.level },
        el("title", {}, `${Math.round(c.level * 100)} % credible region`),
      ),
    );
  });
  if (track && track.length > 1) {
    svg.append(
      el("polyline", {
        points: track.map((t) => `${sx(t.mean[0]).toFixed(2)},${sy(t.mean[1]).toFixed(2)}`).join(" "),
        fill: "none",
        stroke: BRICK,
        "stroke-width": 2,
        "stroke-dasharray": "5 3",
        "data-testid": "deviation-track",
      }),
    );
  }
  const markPoint = (x: number): Point | undefined => {
    if (!track || track.length === 0) return undefined;
    let best = track[0]!;
    for (const t of track) if (Math.abs(t.x - x) < Math.abs(best.x - x)) best = t;
    return best.mean;
  };
  // Each mark's label reads away from the others (the leftmost leftwards, the rest rightwards), turned
  // back inwards where it would leave the plot, so two bounds close together never overprint.
  const placedMarks = (marks ?? []).flatMap((m) => {
    const at = markPoint(m.x);
    return at ? [{ m, cx: sx(at[0]), cy: sy(at[1]) }] : [];
  });
  const order = [...placedMarks].sort((a, b) => a.cx - b.cx);
  for (const { m, cx, cy } of placedMarks) {
    const style = MARK_STYLE[m.verdict];
    const text = `${style.mark} ${m.label}`;
    const wide = [...text].length * 7;
    const leftwards = order.length > 1 && order[0]!.m === m;
    const fitsLeft = cx - 7 - wide >= 4;
    const fitsRight = cx + 7 + wide <= W - 4;
    const left = leftwards ? fitsLeft || !fitsRight : !fitsRight && fitsLeft;
    svg.append(
      el(
        "g",
        { "data-role": "deviation-mark", "data-verdict": m.verdict },
        el("circle", { cx, cy, r: 4, fill: BRICK }),
        el("text", { x: left ? cx - 7 : cx + 7, y: cy - 7, "font-size": 12, "text-anchor": left ? "end" : "start", fill: style.color, "font-weight": 600, "paint-order": "stroke", stroke: "#ffffff", "stroke-width": 3, "stroke-opacity": 0.8 }, text, el("title", {}, `${m.label}: ${style.label}`)),
      ),
    );
  }
  svg.append(el("circle", { cx: sx(mean[0]), cy: sy(mean[1]), r: 3.5, fill: DEEP }));
  svg.append(
    el(
      "g",
      { "data-testid": "gr-point" },
      el("line", { x1: sx(0) - 7, x2: sx(0) + 7, y1: sy(0), y2: sy(0), stroke: INK, "stroke-width": 2 }),
      el("line", { x1: sx(0), x2: sx(0), y1: sy(0) - 7, y2: sy(0) + 7, stroke: INK, "stroke-width": 2 }),
      el("text", { x: sx(0) + 9, y: sy(0) + 15, "font-size": 12, fill: INK }, "GR"),
    ),
  );
  svg.append(ratioLabel("M", "M̄", { x: (PAD.left + W - PAD.right) / 2, y: H - 12, "font-size": 13, "text-anchor": "middle", fill: INK }));
  const yMid = (PAD.top + H - PAD.bottom) / 2;
  svg.append(ratioLabel("χ", "χ̄", { x: 16, y: yMid, "font-size": 13, "text-anchor": "middle", fill: INK, transform: `rotate(-90 16 ${yMid})` }));
  return svg;
}

/** The deviation plane in the shared figure: title, legend, SVG and PNG downloads that keep both and the cautions. */
export function DeviationPlot({ contours, mean, track, marks, trackName, cautions, title, filename }: DeviationPlotProps) {
  const data = useMemo(() => ({ contours, mean, ...(track ? { track } : {}), ...(marks ? { marks } : {}) }), [contours, mean, track, marks]);
  const draw = useCallback((width: number) => deviationSvg(data, width), [data]);
  const levels = contours.map((c) => `${Math.round(c.level * 100)} %`).join(", ");
  const verdicts = (["valid", "outside_validity", "not_assessed"] as const).filter((v) => (marks ?? []).some((m) => m.verdict === v));
  const legend: LegendEntry[] = [
    { mark: "▇", color: SHADES[2]!, label: `shaded: credible regions at ${levels}` },
    { mark: "+", color: INK, label: "general relativity, (0, 0)" },
    { mark: "●", color: DEEP, label: "the estimate" },
    ...(track ? [{ mark: "╌", color: BRICK, label: `dashed: the deviation ${trackName ?? "the theory"} would produce as its coupling grows` }] : []),
    ...verdicts.map((v) => ({ ...MARK_STYLE[v], label: `smallest excluded coupling, ${MARK_STYLE[v].label}` })),
  ];
  return (
    <Figure
      draw={draw}
      width={WIDTH}
      title={title}
      filename={filename}
      testId="deviation-plot"
      legend={legend}
      cautions={cautions}
      caption="Deviations of the final mass and spin, each normalised by the mean of the inspiral and merger-ringdown estimates."
    />
  );
}
