import { z } from "zod";
import {
  forecastGridRequestSchema,
  forecastRequestSchema,
  forecastSourceSchema,
  MAX_FORECAST_B,
  MAX_GRID_SOURCES,
  type ForecastRequest,
  type ForecastRequestInput,
} from "../../../../common/forecasts.ts";

/**
 * A forecast's inputs in the page address (?q=<the request as JSON>), as the translate page keeps its
 * own: a link reproduces the forecast, back and forward walk through earlier ones. The text is read
 * back through the schema the server validates with (with the larger b list a background job takes),
 * and a link that no longer parses says which field is wrong instead of silently showing the preset.
 */
export const FORECAST_PARAM = "q";
/** The background job that computed the request of a link (grids and long b lists). */
export const JOB_PARAM = "job";

// Up to MAX_GRID_B values of b, and more binaries beside the first (the page's own field, never sent
// as such): past MAX_FORECAST_B values of b, or with more binaries, the page sends a grid job.
const linkSchema = forecastRequestSchema.extend({
  b: forecastGridRequestSchema.shape.b,
  more_sources: z.array(forecastSourceSchema).max(MAX_GRID_SOURCES - 1, `at most ${MAX_GRID_SOURCES - 1} more binaries`).optional(),
});

/** What the page keeps in the address: a forecast request, with more binaries for a grid. */
export type PageForecastInput = ForecastRequestInput & { more_sources?: ForecastRequestInput["source"][] };
export type PageForecast = ForecastRequest & { more_sources?: ForecastRequest["source"][] };

export type UrlForecast =
  | { kind: "none" }
  | { kind: "ok"; request: PageForecast; input: PageForecastInput; text: string }
  | { kind: "bad"; message: string };

export function readForecastParam(text: string | null): UrlForecast {
  if (text === null || text === "") return { kind: "none" };
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    return { kind: "bad", message: "the link's inputs are not readable (they are cut or altered)" };
  }
  const parsed = linkSchema.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { kind: "bad", message: issue ? `${issue.path.join(".") || "request"}: ${issue.message}` : "the link's inputs are not a valid forecast" };
  }
  return { kind: "ok", request: parsed.data, input: json as PageForecastInput, text };
}

/** Field errors of a request the form built, keyed like the server's (detectors.0.f_low), or null when it is valid. */
export function requestFieldErrors(input: PageForecastInput): Record<string, string> | null {
  const parsed = linkSchema.safeParse(input);
  if (parsed.success) return null;
  const fields: Record<string, string> = {};
  for (const issue of parsed.error.issues) {
    const key = issue.path.join(".") || "request";
    fields[key] ??= issue.message;
  }
  return fields;
}

/** More values of b than one request takes, or several binaries: the forecast runs as a background job. */
export const runsAsJob = (request: Pick<PageForecast, "b" | "more_sources">) => request.b.length > MAX_FORECAST_B || (request.more_sources?.length ?? 0) > 0;
