import { queryOptions, skipToken, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import {
  curveInfoSchema,
  curveListSchema,
  forecastGridResultSchema,
  forecastResponseSchema,
  type CurveConventionDto,
  type ForecastResponse,
} from "../../../../common/forecasts.ts";
import type { PageForecastInput } from "../lib/forecast-url.ts";
import { jobCreatedSchema, jobViewSchema } from "../../../../common/jobs.ts";
import { ApiError, apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

export const forecastKeys = {
  all: ["forecasts"] as const,
  curves: (user: string | null) => [...forecastKeys.all, "curves", user] as const,
};

/** The curves a forecast may use: built-in ones, and the caller's uploads when signed in. */
export const curvesQuery = (user: string | null) =>
  queryOptions({
    queryKey: forecastKeys.curves(user),
    queryFn: ({ signal }) => apiRequest(apiPaths.forecastCurves(), curveListSchema, { signal }),
    staleTime: 5 * 60_000,
  });

export function useCurves(user: string | null) {
  return useQuery(curvesQuery(user));
}

export interface JobProgress {
  status: "queued" | "running";
  progress: number;
}

const sleep = (ms: number, signal: AbortSignal) =>
  new Promise<void>((resolve, reject) => {
    const t = setTimeout(resolve, ms);
    signal.addEventListener("abort", () => {
      clearTimeout(t);
      reject(signal.reason instanceof Error ? signal.reason : new DOMException("cancelled", "AbortError"));
    });
  });

/**
 * More values of b than one request takes go to the job queue: start the job, follow it until it is
 * done, and answer its forecast. Leaving (or cancelling) aborts the signal, which cancels the job.
 * The page keeps the job's id in the address beside the request, so a reload or a later visit reads
 * the finished job back instead of computing it again; a job that is gone, not the caller's, failed
 * or cancelled is replaced by a new one.
 */
async function runForecastJob(input: PageForecastInput, signal: AbortSignal, onProgress: (p: JobProgress) => void, known: JobLink): Promise<ForecastRun> {
  if (known.id) {
    const view = await apiRequest(apiPaths.job(known.id), jobViewSchema, { signal }).catch((err: unknown) => {
      if (err instanceof ApiError && (err.status === 404 || err.status === 403 || err.status === 401 || err.status === 400)) return null;
      throw err;
    });
    if (view && view.kind === "forecast" && (view.status === "done" || view.status === "queued" || view.status === "running")) return followForecastJob(view.id, signal, onProgress);
  }
  const { source, more_sources: more, ...settings } = input;
  const created = await apiRequest(apiPaths.forecastJob(), jobCreatedSchema, { method: "POST", body: { ...settings, sources: [source, ...(more ?? [])] }, signal });
  known.onCreated(created.job.id);
  return followForecastJob(created.job.id, signal, onProgress);
}

async function followForecastJob(id: string, signal: AbortSignal, onProgress: (p: JobProgress) => void): Promise<ForecastRun> {
  try {
    for (;;) {
      const view = await apiRequest(apiPaths.job(id), jobViewSchema, { signal });
      if (view.status === "done") {
        const grid = forecastGridResultSchema.parse(view.result);
        return { main: grid.forecasts[0]!, grid: grid.forecasts.length > 1 ? grid.forecasts : null };
      }
      if (view.status === "failed") throw new Error(view.error?.message ?? "the forecast job failed");
      if (view.status === "cancelled") throw new Error("the forecast job was cancelled");
      onProgress({ status: view.status, progress: view.progress });
      await sleep(500, signal);
    }
  } catch (err) {
    if (signal.aborted) void apiRequest(apiPaths.job(id), z.unknown(), { method: "DELETE" }).catch(() => undefined);
    throw err;
  }
}

/** The job a link names (if any), and what to do when a new one is started (put its id in the address). */
export interface JobLink {
  id: string | null;
  onCreated: (id: string) => void;
}

/**
 * The forecast of the request in the address. It is a query keyed on that request (a link, back and
 * forward show their own result), never retried and never refetched on its own, since each run spends
 * the translator's budget.
 */
/** The first binary's forecast, and every binary's when the request was a grid. */
export interface ForecastRun {
  main: ForecastResponse;
  grid: ForecastResponse[] | null;
}

export function useForecast(url: { input: PageForecastInput; text: string; job: boolean } | undefined, onProgress: (p: JobProgress | null) => void, jobLink: JobLink) {
  // The request's text identifies it (input and job follow from it); progress is a side channel.
  // eslint-disable-next-line @tanstack/query/exhaustive-deps
  return useQuery({
    queryKey: [...forecastKeys.all, "run", url?.text ?? null] as const,
    queryFn: url
      ? async ({ signal }) => {
          try {
            if (url.job) return await runForecastJob(url.input, signal, onProgress, jobLink);
            const { more_sources: _none, ...single } = url.input;
            return { main: await apiRequest(apiPaths.forecasts(), forecastResponseSchema, { method: "POST", body: single, signal }), grid: null };
          } finally {
            onProgress(null);
          }
        }
      : skipToken,
    retry: false,
    staleTime: Infinity,
    gcTime: 10 * 60_000,
    refetchOnWindowFocus: false,
    refetchOnReconnect: false,
  });
}

export interface CurveFileUpload {
  file: File;
  name: string;
  kind: "asd" | "psd";
  convention: CurveConventionDto;
  space: boolean;
}

/** The table goes up as the file itself (multipart); the server parses it and names a bad line and column. */
export function uploadCurveFile(upload: CurveFileUpload) {
  const form = new FormData();
  form.append("name", upload.name);
  form.append("kind", upload.kind);
  form.append("convention", upload.convention);
  form.append("space", String(upload.space));
  form.append("file", upload.file);
  return apiRequest(apiPaths.forecastCurves(), curveInfoSchema, { method: "POST", form });
}

export function useUploadCurve() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: uploadCurveFile,
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: [...forecastKeys.all, "curves"] });
    },
  });
}

export function useDeleteCurve() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiRequest(apiPaths.forecastCurve(id), z.unknown(), { method: "DELETE" }),
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: [...forecastKeys.all, "curves"] });
    },
  });
}
