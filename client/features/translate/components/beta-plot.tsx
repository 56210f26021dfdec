import { useCallback } from "react";
import type { PlotModule } from "../../../lib/plot.ts";
import { PlotFigure, type LegendEntry } from "./plot-figure.tsx";
import { decadeLabel, formatPlain } from "./sci-number.tsx";

export interface BetaPoint {
  b: number;
  beta_max: number;
  label: string;
}

/**
 * How a theory fares against the bound at its b: its limit is valid, outside the validity of its
 * mapping, or not assessed; or this bound does not constrain it (it enters at another b, or does not apply to this binary).
 */
export type MarkState = "valid" | "outside_validity" | "not_assessed" | "not_constrained";

export interface TheoryMark {
  b: number;
  /** Identifier, for keys only. */
  theory: string;
  /** Short name as people say it (EdGB, dCS, Brans-Dicke theory). */
  name: string;
  state: MarkState;
}

const INK = "#1d2528";
const SEA = "#24484a";

/** Each state has its own mark and words, never colour alone; the colours are the site's verdict colours. */
export const MARK_STYLE: Record<MarkState, LegendEntry> = {
  valid: { mark: "✓", color: "#24484a", label: "limit valid at this bound" },
  outside_validity: { mark: "✕", color: "#8f3a2c", label: "outside validity: a validity condition of the mapping fails at this limit" },
  not_assessed: { mark: "?", color: "#7f520f", label: "validity not assessed: the entry states no condition for this binary" },
  not_constrained: { mark: "–", color: "#5a6467", label: "not constrained by this bound: enters at another b, or does not apply to this binary" },
};

const ORDER: MarkState[] = ["valid", "outside_validity", "not_assessed", "not_constrained"];

/** A name short enough to stand above the plot (about 32 characters), cut at a word with "…". */
export function plotName(name: string, max = 32): string {
  if (name.length <= max) return name;
  // "Modified dispersion relation, α = 3.5": the part after the comma tells entries apart, so words go from before it.
  const comma = name.indexOf(", ");
  if (comma > 0) {
    const tail = name.slice(comma + 2);
    const head = name.slice(0, comma).split(" ");
    while (head.length > 1 && head.join(" ").length + 2 + tail.length > max) head.pop();
    const joined = `${head.join(" ")}, ${tail}`;
    if (joined.length <= max) return joined;
  }
  const space = name.lastIndexOf(" ", max - 1);
  return `${(space > max / 2 ? name.slice(0, space) : name.slice(0, max - 1)).replace(/[\s,;:-]+$/, "")}…`;
}

export interface TheoryLabel {
  b: number;
  name: string;
  state: MarkState;
  /** What stands above the plot: the verdict mark, then the (shortened) name. */
  text: string;
  /** Tooltip: the full name and the verdict in words. */
  title: string;
}

/**
 * One label per theory and b (a theory met at a b by a constraining bound keeps that state),
 * ordered by b, then constrained before unconstrained, then by name.
 */
export function theoryLabels(marks: readonly TheoryMark[]): TheoryLabel[] {
  const byKey = new Map<string, TheoryMark>();
  for (const m of marks) {
    if (!Number.isFinite(m.b)) continue;
    const key = `${m.b}|${m.theory}`;
    const seen = byKey.get(key);
    if (!seen || (seen.state === "not_constrained" && m.state !== "not_constrained")) byKey.set(key, m);
  }
  return [...byKey.values()]
    .sort((x, y) => x.b - y.b || ORDER.indexOf(x.state) - ORDER.indexOf(y.state) || x.name.localeCompare(y.name))
    .map((m) => ({ b: m.b, name: m.name, state: m.state, text: `${MARK_STYLE[m.state].mark} ${plotName(m.name)}`, title: `${m.name}: ${MARK_STYLE[m.state].label}` }));
}

/**
 * Spreads label positions (pixels, in order) so neighbours stand at least `gap` apart, each as close
 * to its own place as the others allow, inside [lo, hi].
 */
export function spreadLabels(desired: readonly number[], gap: number, lo: number, hi: number): number[] {
  const placed = desired.map((x) => Math.min(hi, Math.max(lo, x)));
  for (let i = 1; i < placed.length; i++) placed[i] = Math.max(placed[i]!, placed[i - 1]! + gap);
  // Pushed past the right edge: walk back from the right, keeping the gaps.
  if (placed.length > 0 && placed[placed.length - 1]! > hi) {
    placed[placed.length - 1] = hi;
    for (let i = placed.length - 2; i >= 0; i--) placed[i] = Math.min(placed[i]!, placed[i + 1]! - gap);
  }
  // Centre each crowded run on its members' own places, where the edges allow.
  let start = 0;
  for (let i = 1; i <= placed.length; i++) {
    if (i === placed.length || placed[i]! - placed[i - 1]! > gap + 0.01) {
      const n = i - start;
      if (n > 1) {
        const wanted = desired.slice(start, i).reduce((a, b) => a + b, 0) / n;
        const current = placed.slice(start, i).reduce((a, b) => a + b, 0) / n;
        const room = { left: (start === 0 ? placed[start]! - lo : placed[start]! - placed[start - 1]! - gap), right: (i === placed.length ? hi - placed[i - 1]! : placed[i]! - placed[i - 1]! - gap) };
        const shift = Math.max(-room.left, Math.min(room.right, wanted - current));
        for (let j = start; j < i; j++) placed[j]! += shift;
      }
      start = i;
    }
  }
  return placed;
}

/** The bound on |β| against b, on a log axis, with every catalogued theory drawn at the b it enters at, marked by its verdict. */
export function BetaPlot({ points, theories }: { points: readonly BetaPoint[]; theories: readonly TheoryMark[] }) {
  const labels = theoryLabels(theories);
  const build = useCallback(
    (Plot: PlotModule) => {
      const finite = points.filter((p) => Number.isFinite(p.beta_max) && p.beta_max > 0).sort((a, b) => a.b - b.b);
      const bs = [...finite.map((p) => p.b), ...labels.map((l) => l.b)];
      const ys = finite.map((p) => p.beta_max);
      const xDomain: [number, number] = bs.length ? [Math.min(...bs) - 1, Math.max(...bs) + 1] : [-14, 4];
      const yDomain: [number, number] = ys.length ? [Math.min(...ys) / 30, Math.max(...ys) * 30] : [1e-6, 1];
      // A b with a constrained theory gets a solid rule; one where only unconstrained theories enter, a dashed one.
      const width = 760;
      const marginLeft = 64;
      const marginRight = 20;
      const at = (b: number) => marginLeft + ((b - xDomain[0]) / (xDomain[1] - xDomain[0])) * (width - marginLeft - marginRight);
      const placed = spreadLabels(labels.map((l) => at(l.b)), 13, marginLeft, width - marginRight);
      const rules = [...new Set(labels.map((l) => l.b))].map((b) => ({ b, constrained: labels.some((l) => l.b === b && l.state !== "not_constrained") }));
      return Plot.plot({
        width,
        height: 340,
        // Theory names stand vertically above the frame, so neighbouring b values never overprint.
        marginTop: 200,
        marginLeft,
        marginRight,
        style: { fontFamily: '"Source Serif 4", Georgia, serif', fontSize: "12px", background: "transparent", color: INK },
        x: { domain: xDomain, label: "ppE exponent b", labelAnchor: "center", grid: true },
        y: { type: "log", domain: yDomain, label: "bound on |β|", labelAnchor: "center", grid: true, tickFormat: decadeLabel },
        marks: [
          Plot.ruleX(rules.filter((r) => r.constrained), { x: "b", stroke: INK, strokeOpacity: 0.45 }),
          Plot.ruleX(rules.filter((r) => !r.constrained), { x: "b", stroke: MARK_STYLE.not_constrained.color, strokeOpacity: 0.5, strokeDasharray: "4,3" }),
          // One text mark per label, shifted sideways (dx is constant per mark) so none overprints its neighbour.
          ...labels.map((l, i) =>
            Plot.text([l], {
              x: "b",
              text: "text",
              title: "title",
              frameAnchor: "top",
              dy: -6,
              dx: (placed[i] ?? 0) - (at(l.b)),
              rotate: -90,
              textAnchor: "start",
              lineAnchor: "middle",
              fill: MARK_STYLE[l.state].color,
              fontWeight: l.state === "not_constrained" ? 400 : 600,
              fontSize: 10.5,
            }),
          ),
          Plot.line(finite, { x: "b", y: "beta_max", stroke: SEA, strokeOpacity: 0.4 }),
          Plot.dot(finite, { x: "b", y: "beta_max", fill: SEA, r: 4, title: (p: BetaPoint) => `${p.label}: |β| ≤ ${formatPlain(p.beta_max)} at b = ${p.b}` }),
        ],
      });
    },
    [points, labels],
  );
  const present = ORDER.filter((s) => labels.some((l) => l.state === s));
  return (
    <PlotFigure
      build={build}
      title="Bound on |β| against the ppE exponent b, with the catalogued theories"
      filename="beta-against-b"
      testId="beta-plot"
      legend={[{ mark: "●", color: SEA, label: "the bound given, as |β| at its b" }, ...present.map((s) => MARK_STYLE[s])]}
      caption="Points: the bounds given (gIMR bounds converted to β for this binary). Vertical lines: where each catalogued theory's mapping enters; each theory is marked with the verdict on its limit."
    />
  );
}
