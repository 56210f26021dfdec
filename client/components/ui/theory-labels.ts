/**
 * Catalogued theories drawn at the ppE exponent b they enter at: a vertical rule per b and, above the
 * frame, one upright label per theory with its verdict mark. Labels are spread so none overprints a
 * neighbour; one moved off its rule is joined back to it by a leader line. Shared by the translate
 * page's bound plot and the forecast's.
 */
import type { RenderFunction } from "@observablehq/plot";
import type { LegendEntry } from "../../lib/figure-svg.ts";
import { placeLabels, roomNeeded } from "../../lib/label-placement.ts";
import type { PlotModule } from "../../lib/plot.ts";

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

/** Each state has its own mark and words, never colour alone; the colours are the site's verdict colours. */
export const MARK_STYLE: Record<MarkState, LegendEntry> = {
  valid: { mark: "✓", color: "#24484a", label: "limit valid at this bound" },
  outside_validity: { mark: "✕", color: "#8f3a2c", label: "outside validity: a validity condition of the mapping fails at this limit" },
  not_assessed: { mark: "?", color: "#7f520f", label: "validity not assessed: the entry states no condition for this binary" },
  not_constrained: { mark: "–", color: "#5a6467", label: "not constrained by this bound: enters at another b, or does not apply to this binary" },
};

export const MARK_ORDER: readonly MarkState[] = ["valid", "outside_validity", "not_assessed", "not_constrained"];

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
    .sort((x, y) => x.b - y.b || MARK_ORDER.indexOf(x.state) - MARK_ORDER.indexOf(y.state) || x.name.localeCompare(y.name))
    .map((m) => ({ b: m.b, name: m.name, state: m.state, text: `${MARK_STYLE[m.state].mark} ${plotName(m.name)}`, title: `${m.name}: ${MARK_STYLE[m.state].label}` }));
}

/** Label font size and the distance between neighbouring (upright) labels, in pixels: a line height apart, so even their em boxes do not touch. */
export const LABEL_FONT_PX = 11;
export const LABEL_GAP_PX = 15;
/** Height of the stem between a label's foot and the frame: long enough for a slanted leader to read. */
const STEM_PX = 14;
/** About how wide one character of an 11 px bold serif label is (measured on the page's face). */
const CHAR_PX = 6.7;

/** Room above the frame for the longest label and its stem (a long name is cut at 32 characters by plotName). */
export function labelsMarginTop(labels: readonly TheoryLabel[]): number {
  const longest = Math.max(4, ...labels.map((l) => [...l.text].length));
  return Math.ceil(STEM_PX + 3 + 10 + longest * CHAR_PX);
}

/** The plot width that lets `n` labels stand side by side within the frame's horizontal margins. */
export function widthForLabels(n: number, marginLeft: number, marginRight: number): number {
  return Math.ceil(marginLeft + marginRight + roomNeeded(n, LABEL_GAP_PX) + LABEL_GAP_PX);
}

const SVG_NS = "http://www.w3.org/2000/svg";

function svgEl(name: string, attrs: Record<string, string | number>, text?: string): SVGElement {
  const node = document.createElementNS(SVG_NS, name) as SVGElement;
  for (const [k, v] of Object.entries(attrs)) node.setAttribute(k, String(v));
  if (text !== undefined) node.textContent = text;
  return node;
}

/**
 * A render mark (Observable Plot calls it with the plot's scales) drawing the labels above the frame:
 * placed by placeLabels, each on a stem down to the frame's top edge, slanted into a leader where the
 * label had to leave its rule.
 */
export function theoryLabelMark(labels: readonly TheoryLabel[]): RenderFunction {
  return (_index, scales, _values, dims) => {
    const g = svgEl("g", { "data-role": "theory-labels", "font-size": LABEL_FONT_PX });
    const x = scales.x;
    if (!x) return g;
    const lo = dims.marginLeft + LABEL_GAP_PX / 2;
    const hi = dims.width - dims.marginRight - LABEL_GAP_PX / 2;
    const placed = placeLabels(
      labels.map((l) => Number(x(l.b))),
      LABEL_GAP_PX,
      lo,
      hi,
    ).labels;
    const top = dims.marginTop;
    labels.forEach((l, i) => {
      const p = placed[i]!;
      const style = MARK_STYLE[l.state];
      const foot = top - STEM_PX;
      g.append(
        svgEl("line", { x1: p.at, y1: foot, x2: p.own, y2: top, stroke: style.color, "stroke-opacity": p.leader ? 0.75 : 0.45, "stroke-width": 1, "data-role": p.leader ? "leader" : "stem" }),
      );
      const text = svgEl("text", {
        transform: `translate(${p.at.toFixed(1)},${foot - 3}) rotate(-90)`,
        "text-anchor": "start",
        "dominant-baseline": "middle",
        fill: style.color,
        "font-weight": l.state === "not_constrained" ? 400 : 600,
        "data-role": "theory-label",
      });
      text.append(document.createTextNode(l.text), svgEl("title", {}, l.title));
      g.append(text);
    });
    return g;
  };
}

/** The rules at each b: solid where a constrained theory enters, dashed where only unconstrained ones do. */
export function theoryRules(Plot: PlotModule, labels: readonly TheoryLabel[], ink: string) {
  const rules = [...new Set(labels.map((l) => l.b))].map((b) => ({ b, constrained: labels.some((l) => l.b === b && l.state !== "not_constrained") }));
  return [
    Plot.ruleX(
      rules.filter((r) => r.constrained),
      { x: "b", stroke: ink, strokeOpacity: 0.45 },
    ),
    Plot.ruleX(
      rules.filter((r) => !r.constrained),
      { x: "b", stroke: MARK_STYLE.not_constrained.color, strokeOpacity: 0.5, strokeDasharray: "4,3" },
    ),
    theoryLabelMark(labels),
  ];
}
