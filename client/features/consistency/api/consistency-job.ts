import { queryOptions, skipToken, useMutation, useQuery } from "@tanstack/react-query";
import type { ConsistencyJobRequest } from "../../../../common/consistency.ts";
import { jobCreatedSchema, jobViewSchema } from "../../../../common/jobs.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/** Starts the sample-based consistency job: two files and the settings as multipart form fields. */
export function submitConsistencyJob(input: { inspiral: File; merger_ringdown: File; request: ConsistencyJobRequest }) {
  const form = new FormData();
  form.append("request", JSON.stringify(input.request));
  form.append("inspiral", input.inspiral);
  form.append("merger_ringdown", input.merger_ringdown);
  return apiRequest(apiPaths.consistencyJob(), jobCreatedSchema, { method: "POST", form });
}

export function useSubmitConsistencyJob() {
  return useMutation({ mutationFn: submitConsistencyJob });
}

/** A job's view, polled every second until it is finished. */
export const jobQuery = (id: string | undefined) =>
  queryOptions({
    queryKey: ["jobs", id ?? null] as const,
    queryFn: id ? ({ signal }) => apiRequest(apiPaths.job(id), jobViewSchema, { signal }) : skipToken,
    refetchInterval: (q) => (q.state.data && ["done", "failed", "cancelled"].includes(q.state.data.status) ? false : 1000),
    retry: false,
  });

export const useJob = (id: string | undefined) => useQuery(jobQuery(id));
