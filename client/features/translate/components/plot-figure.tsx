import { Button } from "../../../components/ui/button.tsx";
import { downloadSvg, svgOf, type PlotModule } from "../../../lib/plot.ts";
import { usePlot } from "../../../lib/use-plot.ts";

interface Props {
  /** Builds the plot once Observable Plot has loaded; called again when `deps` change. */
  build: (Plot: PlotModule) => Element;
  title: string;
  filename: string;
  testId: string;
  caption?: string;
}

/** An SVG plot with its title, caption and a "Download SVG" button that saves exactly what is shown. */
export function PlotFigure({ build, title, filename, testId, caption }: Props) {
  const { host, loaded, drawn, problem } = usePlot(build);
  const download = () => {
    const svg = host.current ? svgOf(host.current) : null;
    if (svg) downloadSvg(svg, filename);
  };

  return (
    <figure className="flex flex-col gap-2 rounded border border-paper-edge bg-white/50 p-3" data-testid={testId}>
      <div className="flex items-baseline justify-between gap-4">
        <figcaption className="font-semibold">{title}</figcaption>
        <Button kind="secondary" onClick={download} disabled={!drawn} data-testid={`${testId}-download`}>
          Download SVG
        </Button>
      </div>
      {!loaded && !problem && <p className="text-sm text-ink-faint">Loading the plotting library…</p>}
      {problem && <p className="text-sm text-brick">The plot could not be drawn: {problem}</p>}
      <div ref={host} className="overflow-x-auto" />
      {caption && <p className="text-xs text-ink-faint">{caption}</p>}
    </figure>
  );
}
