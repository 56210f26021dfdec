import { useEffect, useState } from "react";
import { loadPlot, type PlotModule } from "./plot.ts";

/** Loads Observable Plot on demand (once per page); `Plot` is undefined until it has loaded. */
export function usePlotModule(): { Plot: PlotModule | undefined; failure: string | undefined } {
  const [Plot, setPlot] = useState<PlotModule | undefined>();
  const [failure, setFailure] = useState<string | undefined>();
  useEffect(() => {
    let live = true;
    loadPlot().then(
      (m) => live && setPlot(() => m),
      (e: unknown) => live && setFailure(e instanceof Error ? e.message : String(e)),
    );
    return () => {
      live = false;
    };
  }, []);
  return { Plot, failure };
}
