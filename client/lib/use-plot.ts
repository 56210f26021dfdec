import { useEffect, useMemo, useRef, useState } from "react";
import { loadPlot, type PlotModule } from "./plot.ts";

/**
 * Loads Observable Plot on demand, builds the plot when it has loaded (building is pure: a detached
 * element) and attaches it to `host`. Shared by every figure with a download button.
 */
export function usePlot(build: (Plot: PlotModule) => Element) {
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

  const rendered = useMemo((): { node?: Element; error?: string } => {
    if (!plot) return {};
    try {
      return { node: build(plot) };
    } catch (e) {
      return { error: e instanceof Error ? e.message : String(e) };
    }
  }, [plot, build]);

  // Only attaching the built element to the page is an effect.
  useEffect(() => {
    const el = host.current;
    if (!el || !rendered.node) return;
    el.replaceChildren(rendered.node);
    return () => el.replaceChildren();
  }, [rendered]);

  return { host, loaded: plot !== undefined, drawn: rendered.node !== undefined, problem: failure ?? rendered.error, setFailure };
}
