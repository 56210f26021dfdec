import { Button } from "../../../components/ui/button.tsx";
import { figureSvg, type LegendEntry } from "../../../lib/figure-svg.ts";
import { downloadSvg, svgOf, type PlotModule } from "../../../lib/plot.ts";
import { downloadPng } from "../../../lib/png.ts";
import { usePlot } from "../../../lib/use-plot.ts";

export type { LegendEntry } from "../../../lib/figure-svg.ts";

interface Props {
  /** Builds the plot once Observable Plot has loaded; called again when `deps` change. */
  build: (Plot: PlotModule) => Element;
  title: string;
  filename: string;
  testId: string;
  caption?: string;
  /** What each mark means; shown under the plot and written into the downloaded files. */
  legend?: readonly LegendEntry[];
}

/**
 * An SVG plot with its title, legend and caption, and SVG / PNG downloads that carry all three, so the
 * saved file says what it shows (the plot itself is saved exactly as drawn).
 */
export function PlotFigure({ build, title, filename, testId, caption, legend }: Props) {
  const { host, loaded, drawn, problem, setFailure } = usePlot(build);
  const figure = () => {
    const svg = host.current ? svgOf(host.current) : null;
    return svg ? figureSvg(svg, { title, legend, caption }) : null;
  };

  return (
    <figure className="flex flex-col gap-2 rounded border border-paper-edge bg-white/50 p-3" data-testid={testId}>
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <figcaption className="font-semibold">{title}</figcaption>
        <div className="flex gap-2">
          <Button
            kind="secondary"
            onClick={() => {
              const f = figure();
              if (f) downloadSvg(f, filename);
            }}
            disabled={!drawn}
            data-testid={`${testId}-download`}
          >
            Download SVG
          </Button>
          <Button
            kind="secondary"
            onClick={() => {
              const f = figure();
              if (f) downloadPng(f, filename).catch((e: unknown) => setFailure(e instanceof Error ? e.message : String(e)));
            }}
            disabled={!drawn}
            data-testid={`${testId}-png`}
          >
            Download PNG
          </Button>
        </div>
      </div>
      {!loaded && !problem && <p className="text-sm text-ink-faint">Loading the plotting library…</p>}
      {problem && <p className="text-sm text-brick">The plot could not be drawn: {problem}</p>}
      <div ref={host} className="overflow-x-auto" />
      {legend && legend.length > 0 && (
        <ul className="flex flex-col gap-0.5 text-xs text-ink-soft" aria-label="Legend" data-testid={`${testId}-legend`}>
          {legend.map((entry) => (
            <li key={entry.label}>
              <span aria-hidden="true" className="mr-1.5 inline-block w-3 text-center font-bold" style={{ color: entry.color }}>
                {entry.mark}
              </span>
              {entry.label}
            </li>
          ))}
        </ul>
      )}
      {caption && <p className="text-xs text-ink-faint">{caption}</p>}
    </figure>
  );
}
