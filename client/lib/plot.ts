/**
 * Observable Plot is ~80 kB gzip with its d3 modules: only pages that draw a plot load it, once.
 * Plots are SVG so they can be downloaded as they are shown; serializeSvg makes the file
 * self-contained (namespaces, the page's font stack written into the root element).
 */
import type * as PlotNamespace from "@observablehq/plot";

export type PlotModule = typeof PlotNamespace;

let pending: Promise<PlotModule> | undefined;

export function loadPlot(): Promise<PlotModule> {
  pending ??= import("@observablehq/plot");
  return pending;
}

/**
 * The SVG element a Plot call returned. A figure wraps it when the plot has a legend or caption, and
 * a swatch legend holds small SVGs of its own before it: the plot is the figure's own SVG child.
 */
export function svgOf(node: Element): SVGSVGElement | null {
  if (node instanceof SVGSVGElement) return node;
  return node.querySelector(":scope > svg") ?? node.querySelector("svg");
}

export function serializeSvg(svg: SVGSVGElement, fontFamily = '"Source Serif 4", Georgia, serif'): string {
  const copy = svg.cloneNode(true) as SVGSVGElement;
  copy.setAttribute("xmlns", "http://www.w3.org/2000/svg");
  copy.setAttribute("xmlns:xlink", "http://www.w3.org/1999/xlink");
  if (!copy.getAttribute("font-family")) copy.setAttribute("font-family", fontFamily);
  // Some serialisers write the namespace they know and the attribute set above: keep one, so strict XML readers take the file.
  const body = new XMLSerializer().serializeToString(copy).replace(/^<svg[^>]*>/, (tag) => {
    let seen = false;
    return tag.replace(/ xmlns="[^"]*"/g, (attr) => (seen ? "" : ((seen = true), attr)));
  });
  return `<?xml version="1.0" encoding="UTF-8"?>\n${body}\n`;
}

/** Saves text as a file through a temporary object URL (no server round trip). */
export function downloadText(text: string, filename: string, type: string): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement("a");
  a.href = url;
  a.download = filename;
  a.rel = "noopener";
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function downloadSvg(svg: SVGSVGElement, filename: string): void {
  downloadText(serializeSvg(svg), filename.endsWith(".svg") ? filename : `${filename}.svg`, "image/svg+xml");
}
