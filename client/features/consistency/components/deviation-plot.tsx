import { useMemo, useRef } from "react";
import { Button } from "../../../components/ui/button.tsx";
import { downloadSvg, serializeSvg } from "../../../lib/plot.ts";

type Point = readonly [number, number];

export interface DeviationPlotProps {
  contours: readonly { level: number; paths: readonly (readonly Point[])[] }[];
  mean: Point;
  /** Expected deviation against the coupling, with the coupling value at each point. */
  track?: readonly { x: number; mean: Point }[];
  /** Coupling values to mark on the track (the bounds). */
  marks?: readonly { x: number; label: string }[];
  title: string;
  filename: string;
}

const W = 560;
const H = 420;
const PAD = { left: 64, right: 20, top: 16, bottom: 52 };
/** Fill shades from the outermost (lightest) region inwards: our own palette on the site's sea colour. */
const SHADES = ["#d9ece9", "#a9d3cc", "#6fb3a8", "#3f8f84", "#276b62", "#174a44"];

function niceTicks(lo: number, hi: number, count = 5): number[] {
  const span = hi - lo;
  if (!(span > 0)) return [lo];
  const raw = span / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((k) => k * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + 1e-12 * span; t += step) out.push(Math.abs(t) < 1e-12 * span ? 0 : t);
  return out;
}

const fmt = (v: number) => (Math.abs(v) >= 1e-3 || v === 0 ? Number(v.toPrecision(3)).toString() : v.toExponential(1));

/** Saves an SVG element as a PNG at twice its size, through a canvas (the SVG loads as a data: image). */
async function downloadPng(svg: SVGSVGElement, filename: string): Promise<void> {
  const text = serializeSvg(svg);
  const img = new Image();
  img.src = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(text)}`;
  await img.decode();
  const canvas = document.createElement("canvas");
  canvas.width = W * 2;
  canvas.height = H * 2;
  const ctx = canvas.getContext("2d");
  if (!ctx) return;
  ctx.fillStyle = "#ffffff";
  ctx.fillRect(0, 0, canvas.width, canvas.height);
  ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
  const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, "image/png"));
  if (!blob) return;
  const url = URL.createObjectURL(blob);
  const a = document.createElement("a");
  a.href = url;
  a.download = filename.endsWith(".png") ? filename : `${filename}.png`;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** The deviation plane: credible regions, the estimate, the GR point (0, 0) and, optionally, a theory's track. */
export function DeviationPlot({ contours, mean, track, marks, title, filename }: DeviationPlotProps) {
  const svgRef = useRef<SVGSVGElement>(null);
  const frame = useMemo(() => {
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
    return { x0, x1, y0, y1, sx, sy };
  }, [contours, mean, track]);
  const { sx, sy } = frame;
  const ringPath = (ring: readonly Point[]) => ring.map(([x, y], i) => `${i === 0 ? "M" : "L"}${sx(x).toFixed(2)},${sy(y).toFixed(2)}`).join("") + "Z";
  const outerFirst = [...contours].sort((a, b) => b.level - a.level);
  const markPoint = (x: number): Point | undefined => {
    if (!track || track.length === 0) return undefined;
    let best = track[0]!;
    for (const t of track) if (Math.abs(t.x - x) < Math.abs(best.x - x)) best = t;
    return best.mean;
  };

  return (
    <figure className="flex flex-col gap-2 rounded border border-paper-edge bg-white/50 p-3" data-testid="deviation-plot">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <figcaption className="font-semibold">{title}</figcaption>
        <div className="flex gap-2">
          <Button kind="secondary" onClick={() => svgRef.current && downloadSvg(svgRef.current, filename)} data-testid="deviation-plot-svg">
            Download SVG
          </Button>
          <Button kind="secondary" onClick={() => svgRef.current && void downloadPng(svgRef.current, filename)} data-testid="deviation-plot-png">
            Download PNG
          </Button>
        </div>
      </div>
      <svg ref={svgRef} viewBox={`0 0 ${W} ${H}`} width="100%" role="img" aria-label={title} className="max-w-full h-auto" style={{ maxWidth: W }}>
        <rect x="0" y="0" width={W} height={H} fill="#ffffff" />
        {niceTicks(frame.x0, frame.x1).map((t) => (
          <g key={`x${t}`}>
            <line x1={sx(t)} x2={sx(t)} y1={PAD.top} y2={H - PAD.bottom} stroke="#e6e1d6" />
            <text x={sx(t)} y={H - PAD.bottom + 16} fontSize="11" textAnchor="middle" fill="#444">
              {fmt(t)}
            </text>
          </g>
        ))}
        {niceTicks(frame.y0, frame.y1).map((t) => (
          <g key={`y${t}`}>
            <line x1={PAD.left} x2={W - PAD.right} y1={sy(t)} y2={sy(t)} stroke="#e6e1d6" />
            <text x={PAD.left - 6} y={sy(t) + 4} fontSize="11" textAnchor="end" fill="#444">
              {fmt(t)}
            </text>
          </g>
        ))}
        {outerFirst.map((c, i) => (
          <path
            key={c.level}
            d={c.paths.map(ringPath).join("")}
            fill={SHADES[(contours.length - 1 - i) % SHADES.length]}
            fillOpacity={0.55}
            fillRule="evenodd"
            stroke="#174a44"
            strokeWidth={1}
            data-level={c.level}
          >
            <title>{`${Math.round(c.level * 100)} % credible region`}</title>
          </path>
        ))}
        {track && track.length > 1 && (
          <polyline points={track.map((t) => `${sx(t.mean[0]).toFixed(2)},${sy(t.mean[1]).toFixed(2)}`).join(" ")} fill="none" stroke="#9a3b2e" strokeWidth={2} strokeDasharray="5 3" data-testid="deviation-track" />
        )}
        {(marks ?? []).map((m) => {
          const p = markPoint(m.x);
          return p ? (
            <g key={m.label}>
              <circle cx={sx(p[0])} cy={sy(p[1])} r={4} fill="#9a3b2e" />
              <text x={sx(p[0]) + 6} y={sy(p[1]) - 6} fontSize="11" fill="#9a3b2e">
                {m.label}
              </text>
            </g>
          ) : null;
        })}
        <circle cx={sx(mean[0])} cy={sy(mean[1])} r={3.5} fill="#174a44" />
        <g data-testid="gr-point">
          <line x1={sx(0) - 7} x2={sx(0) + 7} y1={sy(0)} y2={sy(0)} stroke="#1b1b1b" strokeWidth={2} />
          <line x1={sx(0)} x2={sx(0)} y1={sy(0) - 7} y2={sy(0) + 7} stroke="#1b1b1b" strokeWidth={2} />
          <text x={sx(0) + 9} y={sy(0) + 14} fontSize="12" fill="#1b1b1b">
            GR
          </text>
        </g>
        <text x={(PAD.left + W - PAD.right) / 2} y={H - 12} fontSize="13" textAnchor="middle" fill="#1b1b1b">
          ΔM_f / M̄_f
        </text>
        <text x={16} y={(PAD.top + H - PAD.bottom) / 2} fontSize="13" textAnchor="middle" fill="#1b1b1b" transform={`rotate(-90 16 ${(PAD.top + H - PAD.bottom) / 2})`}>
          Δχ_f / χ̄_f
        </text>
      </svg>
      <p className="text-xs text-ink-faint">
        Shaded: credible regions at {contours.map((c) => `${Math.round(c.level * 100)} %`).join(", ")}. Cross: general relativity (0, 0). Dot: the estimate
        {track ? "; dashed: the deviation a theory would produce as its coupling grows" : ""}.
      </p>
    </figure>
  );
}
