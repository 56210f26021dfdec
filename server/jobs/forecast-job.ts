import type { ForecastGridRequest, ForecastGridResult, ForecastResponse } from "../../common/forecasts.ts";
import type { CompiledCatalogue } from "../features/convert/compiled-catalogue.ts";
import { forecastWithTranslations } from "../features/forecasts/run.ts";
import type { CustomCurveData } from "../physics/forecast/forecast.ts";

/**
 * A forecast grid as a job: every source of the request through the same forecast and translation
 * as POST /forecasts (run.ts), progress after each source, so a cancel stops it between sources.
 * Custom curves were resolved (and their owner checked) when the job was submitted and travel in the
 * stored request.
 */
export interface ForecastJobInput {
  request: ForecastGridRequest & { curves: CustomCurveData[] };
  catalogue: CompiledCatalogue | null;
  onProgress: (fraction: number) => Promise<void>;
}

/** "source.m1" of one forecast is "sources.3.m1" of the grid. */
export const sourceField = (i: number) => (field: string) => (field === "source" || field.startsWith("source.") ? `sources.${i}${field.slice("source".length)}` : field);

export async function runForecastJob({ request, catalogue, onProgress }: ForecastJobInput): Promise<ForecastGridResult> {
  const started = performance.now();
  const { sources, curves, ...settings } = request;
  const forecasts: ForecastResponse[] = [];
  for (const [i, source] of sources.entries()) {
    forecasts.push(forecastWithTranslations({ ...settings, source }, curves, catalogue, sourceField(i)));
    await onProgress((i + 1) / sources.length);
  }
  return { kind: "forecast_grid", forecasts, seconds: (performance.now() - started) / 1000 };
}
