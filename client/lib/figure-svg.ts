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
}

const INK = "#1d2528";
const SOFT = "#4a5458";
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

  const titleHeight = PAD + titleLines.length * 20;
  const legendTop = titleHeight + height + 6;
  const legendHeight = legend.length * 17;
  const captionTop = legendTop + legendHeight + (legend.length ? 6 : 0);
  const total = captionTop + captionLines.length * 15 + PAD;

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

  legend.forEach((entry, i) => {
    const y = legendTop + 12 + i * 17;
    const row = el("text", { x: PAD, y, "font-size": 12, fill: INK, "data-role": "figure-legend" });
    row.append(el("tspan", { fill: entry.color, "font-weight": 700 }, entry.mark));
    row.append(el("tspan", { dx: 6 }, entry.label));
    root.append(row);
  });
  captionLines.forEach((line, i) => root.append(el("text", { x: PAD, y: captionTop + 11 + i * 15, "font-size": 11, fill: SOFT, "data-role": "figure-caption" }, line)));
  return root;
}
