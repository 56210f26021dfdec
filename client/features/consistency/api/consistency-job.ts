import { useMutation } from "@tanstack/react-query";
import type { ConsistencyJobRequest } from "../../../../common/consistency.ts";
import { jobCreatedSchema } from "../../../../common/jobs.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/** Starts the sample-based consistency job: two files and the settings as multipart form fields (followed with useJobView). */
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
