import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { filePreviewSchema, jobCreatedSchema, jobViewSchema, type JobView } from "../../../../common/jobs.ts";
import { apiRequest, uploadRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/** Background jobs: preview a file, start a samples job (both with upload progress), poll, cancel. */

export function previewFile(file: File, onProgress: (f: number) => void) {
  const form = new FormData();
  form.append("file", file);
  return uploadRequest(apiPaths.jobsPreview(), filePreviewSchema, form, onProgress);
}

export function startSamplesJob(file: File, request: object, onProgress: (f: number) => void) {
  const form = new FormData();
  // The settings first, so the server knows them before the file's bytes arrive.
  form.append("request", JSON.stringify(request));
  form.append("file", file);
  return uploadRequest(apiPaths.jobsSamples(), jobCreatedSchema, form, onProgress);
}

/** POST /jobs/stack: several events into one bound (JSON). */
export function startStackJob(request: object) {
  return apiRequest(apiPaths.jobsStack(), jobCreatedSchema, { method: "POST", body: request });
}

const finished = (v: JobView | undefined) => v !== undefined && (v.status === "done" || v.status === "failed" || v.status === "cancelled");

export const jobQuery = (id: string) =>
  queryOptions({
    queryKey: ["jobs", id],
    queryFn: ({ signal }) => apiRequest(apiPaths.job(id), jobViewSchema, { signal }),
    // Poll while the job runs; a finished job does not change.
    refetchInterval: (q) => (finished(q.state.data) ? false : 500),
    staleTime: (q) => (finished(q.state.data) ? Infinity : 0),
  });

export function useJob(id: string | null) {
  return useQuery({ ...jobQuery(id ?? ""), enabled: id !== null });
}

export function useCancelJob() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => apiRequest(apiPaths.job(id), jobViewSchema, { method: "DELETE" }),
    onSuccess: async (view) => {
      qc.setQueryData(jobQuery(view.id).queryKey, view);
      await qc.invalidateQueries({ queryKey: ["jobs", view.id] });
    },
  });
}
