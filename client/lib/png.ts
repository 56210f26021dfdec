import { serializeSvg } from "./plot.ts";

/**
 * PNG of an SVG plot, drawn at twice its size so it stays sharp in slides. The SVG is serialised
 * self-contained (serializeSvg), painted on a white canvas and saved; nothing goes to the server.
 */
export async function downloadPng(svg: SVGSVGElement, filename: string, scale = 2): Promise<void> {
  const box = svg.getBoundingClientRect();
  const width = Math.max(1, Math.round(Number(svg.getAttribute("width")) || box.width));
  const height = Math.max(1, Math.round(Number(svg.getAttribute("height")) || box.height));
  // A data: URL, not a blob: one: the page's content security policy allows images from data: only.
  const url = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(serializeSvg(svg))}`;
  {
    const image = new Image();
    await new Promise<void>((resolve, reject) => {
      image.onload = () => resolve();
      image.onerror = () => reject(new Error("the plot could not be rendered to an image"));
      image.src = url;
    });
    const canvas = document.createElement("canvas");
    canvas.width = width * scale;
    canvas.height = height * scale;
    const ctx = canvas.getContext("2d");
    if (!ctx) throw new Error("this browser cannot draw on a canvas");
    ctx.fillStyle = "#ffffff";
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    ctx.scale(scale, scale);
    ctx.drawImage(image, 0, 0, width, height);
    const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, "image/png"));
    if (!blob) throw new Error("the image could not be encoded");
    const a = document.createElement("a");
    const pngUrl = URL.createObjectURL(blob);
    a.href = pngUrl;
    a.download = filename.endsWith(".png") ? filename : `${filename}.png`;
    a.rel = "noopener";
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(pngUrl), 1000);
  }
}
