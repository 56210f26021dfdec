import { useEffect, useMemo, useRef, useState } from "react";
import { Button } from "../../../components/ui/button.tsx";
import { downloadSvg, loadPlot, svgOf, type PlotModule } from "../../../lib/plot.ts";

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
  const host = useRef<HTMLDivElement>(null);
  const [plot, setPlot] = useState<PlotModule | undefined>();
  const [failure, setFailure] = useState<string | undefined>();

  useEffect(() => {
    let live = true;
    loadPlot().then(
      (m) => live && setPlot(m),
      (e: unknown) => live && setFailure(e instanceof Error ? e.message : String(e)),
    );
    return () => {
      live = false;
    };
  }, []);

  // Building is pure (a detached element); only attaching it to the page is an effect.
  const rendered = useMemo((): { node?: Element; error?: string } => {
    if (!plot) return {};
    try {
      return { node: build(plot) };
    } catch (e) {
      return { error: e instanceof Error ? e.message : String(e) };
    }
  }, [plot, build]);

  useEffect(() => {
    const el = host.current;
    if (!el || !rendered.node) return;
    el.replaceChildren(rendered.node);
    return () => el.replaceChildren();
  }, [rendered]);

  const problem = failure ?? rendered.error;
  const download = () => {
    const svg = host.current ? svgOf(host.current) : null;
    if (svg) downloadSvg(svg, filename);
  };

  return (
    <figure className="flex flex-col gap-2 rounded border border-paper-edge bg-white/50 p-3" data-testid={testId}>
      <div className="flex items-baseline justify-between gap-4">
        <figcaption className="font-semibold">{title}</figcaption>
        <Button kind="secondary" onClick={download} disabled={!rendered.node} data-testid={`${testId}-download`}>
          Download SVG
        </Button>
      </div>
      {!plot && !problem && <p className="text-sm text-ink-faint">Loading the plotting library…</p>}
      {problem && <p className="text-sm text-brick">The plot could not be drawn: {problem}</p>}
      <div ref={host} className="overflow-x-auto" />
      {caption && <p className="text-xs text-ink-faint">{caption}</p>}
    </figure>
  );
}
