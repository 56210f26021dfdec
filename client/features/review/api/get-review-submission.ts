import { queryOptions, useQuery } from "@tanstack/react-query";
import { submissionDetailSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { reviewKeys } from "./keys.ts";

export function reviewSubmissionQuery(id: number) {
  return queryOptions({
    queryKey: reviewKeys.detail(id),
    queryFn: ({ signal }) => apiRequest(apiPaths.submission(id), submissionDetailSchema, { signal }),
  });
}

export function useReviewSubmission(id: number) {
  return useQuery(reviewSubmissionQuery(id));
}
