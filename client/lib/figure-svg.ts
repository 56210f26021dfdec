/**
 * A downloadable figure: the plot's SVG with its title above and its legend and caption below, in
 * one self-contained SVG, so a file saved for a paper or a slide still says what it shows and what
 * each mark means (the page shows these around the plot as HTML, which a bare SVG would lose).
 */

const SVG_NS = "http://www.w3.org/2000/svg";

/** One legend line: a mark drawn as text (✓, ✕, ?, ●, a dash) in a colour, and what it means. */
export interface LegendEntry {
  mark: string;
  color: string;
  label: string;
}

export interface FigureText {
  title: string;
  legend?: readonly LegendEntry[] | undefined;
  caption?: string | undefined;
  /** What the reader must know before trusting the plot; each line is written with a caution mark. */
  cautions?: readonly string[] | undefined;
}

const INK = "#1d2528";
const SOFT = "#4a5458";
const AMBER = "#7f520f";
/** The mark written before each caution in a downloaded figure. */
export const CAUTION_MARK = "⚠";
const PAD = 12;

/** Splits text into lines of at most `chars` characters, at spaces (a long word gets a line of its own). */
export function wrapText(text: string, chars: number): string[] {
  const lines: string[] = [];
  let line = "";
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line && line.length + 1 + word.length > chars) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines;
}

function el<K extends keyof SVGElementTagNameMap>(name: K, attrs: Record<string, string | number>, text?: string): SVGElementTagNameMap[K] {
  const node = document.createElementNS(SVG_NS, name);
  for (const [k, v] of Object.entries(attrs)) node.setAttribute(k, String(v));
  if (text !== undefined) node.textContent = text;
  return node;
}

function sizeOf(svg: SVGSVGElement): { width: number; height: number } {
  const box = svg.viewBox?.baseVal;
  const width = Number(svg.getAttribute("width")) || box?.width || svg.getBoundingClientRect().width || 640;
  const height = Number(svg.getAttribute("height")) || box?.height || svg.getBoundingClientRect().height || 400;
  return { width, height };
}

/** A new, detached SVG: title, the plot (copied, untouched), legend, caption. */
export function figureSvg(plot: SVGSVGElement, text: FigureText): SVGSVGElement {
  const { width, height } = sizeOf(plot);
  // About 6.3 px per character at 12 px in a serif face: a safe line length for wrapping.
  const chars = Math.max(30, Math.floor((width - 2 * PAD) / 6.3));
  const titleLines = wrapText(text.title, Math.floor(chars * 0.8));
  const legend = text.legend ?? [];
  const captionLines = text.caption ? wrapText(text.caption, chars) : [];
  const cautionLines = (text.cautions ?? []).map((c) => wrapText(c, chars - 3));

  const titleHeight = PAD + titleLines.length * 20;
  const legendTop = titleHeight + height + 6;
  // Legend lines are 12 px text (about 6.6 px a character): long ones wrap under their words, not under the mark.
  const legendLines = legend.map((entry) => wrapText(entry.label, Math.max(24, Math.floor((width - 2 * PAD - 18) / 6.6))));
  const legendHeight = legendLines.reduce((n, lines) => n + lines.length * 17, 0);
  const captionTop = legendTop + legendHeight + (legend.length ? 6 : 0);
  const cautionsTop = captionTop + captionLines.length * 15 + (cautionLines.length ? 8 : 0);
  const total = cautionsTop + cautionLines.reduce((n, lines) => n + lines.length * 15 + 3, 0) + PAD;

  const root = el("svg", { xmlns: SVG_NS, width, height: total, viewBox: `0 0 ${width} ${total}`, "font-family": '"Source Serif 4", Georgia, serif' });
  root.append(el("title", {}, text.title));
  if (text.caption) root.append(el("desc", {}, text.caption));
  root.append(el("rect", { x: 0, y: 0, width, height: total, fill: "#ffffff" }));
  titleLines.forEach((line, i) => root.append(el("text", { x: PAD, y: PAD + 14 + i * 20, "font-size": 15, "font-weight": 600, fill: INK, "data-role": "figure-title" }, line)));

  const copy = plot.cloneNode(true) as SVGSVGElement;
  copy.setAttribute("x", "0");
  copy.setAttribute("y", String(titleHeight));
  copy.setAttribute("width", String(width));
  copy.setAttribute("height", String(height));
  root.append(copy);

  let legendY = legendTop;
  legend.forEach((entry, i) => {
    const lines = legendLines[i] ?? [entry.label];
    lines.forEach((line, j) => {
      const row = el("text", { x: PAD, y: legendY + 12 + j * 17, "font-size": 12, fill: INK, "data-role": "figure-legend" });
      if (j === 0) {
        row.append(el("tspan", { fill: entry.color, "font-weight": 700 }, entry.mark));
        row.append(el("tspan", { dx: 6 }, line));
      } else row.append(el("tspan", { x: PAD + 18 }, line));
      root.append(row);
    });
    legendY += lines.length * 17;
  });
  captionLines.forEach((line, i) => root.append(el("text", { x: PAD, y: captionTop + 11 + i * 15, "font-size": 11, fill: SOFT, "data-role": "figure-caption" }, line)));
  let y = cautionsTop;
  for (const lines of cautionLines) {
    lines.forEach((line, i) => {
      const row = el("text", { x: PAD, y: y + 11 + i * 15, "font-size": 11, fill: INK, "data-role": "figure-caution" });
      if (i === 0) row.append(el("tspan", { fill: AMBER, "font-weight": 700 }, CAUTION_MARK));
      row.append(el("tspan", i === 0 ? { dx: 5 } : { x: PAD + 16 }, line));
      root.append(row);
    });
    y += lines.length * 15 + 3;
  }
  return root;
}
