import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { curveInfoSchema, curveListSchema, forecastResponseSchema, type CurveConventionDto, type ForecastRequestInput } from "../../../../common/forecasts.ts";
import { apiRequest } from "../../../lib/api-client.ts";
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

/** A forecast is run on demand (it spends the translator's budget), so it is a mutation. */
export function useRunForecast() {
  return useMutation({
    mutationFn: (request: ForecastRequestInput) => apiRequest(apiPaths.forecasts(), forecastResponseSchema, { method: "POST", body: request }),
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
