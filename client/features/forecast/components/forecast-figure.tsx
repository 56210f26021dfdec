import { Button } from "../../../components/ui/button.tsx";
import { downloadSvg, svgOf, type PlotModule } from "../../../lib/plot.ts";
import { usePlot } from "../../../lib/use-plot.ts";
import { downloadPng } from "../../../lib/png.ts";

interface Props {
  build: (Plot: PlotModule) => Element;
  title: string;
  filename: string;
  testId: string;
  caption?: string;
}

/** A plot with its title, caption and SVG / PNG downloads of exactly what is shown. */
export function ForecastFigure({ build, title, filename, testId, caption }: Props) {
  const { host, loaded, drawn, problem, setFailure } = usePlot(build);
  const svg = () => (host.current ? svgOf(host.current) : null);
  return (
    <figure className="flex flex-col gap-2 rounded border border-paper-edge bg-white/60 p-3" data-testid={testId}>
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <figcaption className="font-semibold">{title}</figcaption>
        <div className="flex gap-2">
          <Button kind="quiet" disabled={!drawn} onClick={() => { const s = svg(); if (s) downloadSvg(s, filename); }} data-testid={`${testId}-svg`}>
            SVG
          </Button>
          <Button
            kind="quiet"
            disabled={!drawn}
            onClick={() => {
              const s = svg();
              if (s) downloadPng(s, filename).catch((e: unknown) => setFailure(e instanceof Error ? e.message : String(e)));
            }}
            data-testid={`${testId}-png`}
          >
            PNG
          </Button>
        </div>
      </div>
      {!loaded && !problem && <p className="text-sm text-ink-faint">Loading the plotting library…</p>}
      {problem && <p className="text-sm text-brick">The plot could not be drawn: {problem}</p>}
      <div ref={host} className="overflow-x-auto" />
      {caption && <p className="text-xs text-ink-faint">{caption}</p>}
    </figure>
  );
}
