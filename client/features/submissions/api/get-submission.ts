import { queryOptions, useQuery } from "@tanstack/react-query";
import { commentListResponseSchema, submissionDetailSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { submissionKeys } from "./keys.ts";

export function submissionQuery(id: number) {
  return queryOptions({
    queryKey: submissionKeys.detail(id),
    queryFn: ({ signal }) => apiRequest(apiPaths.submission(id), submissionDetailSchema, { signal }),
    // The form owns the values once loaded; a background refetch must not look like someone else's save.
    staleTime: Infinity,
  });
}

export function useSubmission(id: number | undefined) {
  return useQuery({ ...submissionQuery(id ?? 0), enabled: id !== undefined });
}

/** The comments thread, read by the author to see why a submission came back. */
export function submissionCommentsQuery(id: number) {
  return queryOptions({
    queryKey: [...submissionKeys.detail(id), "comments"] as const,
    queryFn: ({ signal }) => apiRequest(apiPaths.submissionAction(id, "comments"), commentListResponseSchema, { signal }),
  });
}

export function useSubmissionComments(id: number | undefined) {
  return useQuery({ ...submissionCommentsQuery(id ?? 0), enabled: id !== undefined });
}
