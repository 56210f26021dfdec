import { queryOptions, useQuery } from "@tanstack/react-query";
import { REVIEW_QUEUE_STATUSES, submissionListResponseSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { reviewKeys } from "./keys.ts";

const QUEUE = REVIEW_QUEUE_STATUSES.join(",");

export function reviewQueueQuery() {
  return queryOptions({
    queryKey: reviewKeys.queue(QUEUE),
    queryFn: ({ signal }) => apiRequest(apiPaths.submissions({ status: QUEUE }), submissionListResponseSchema, { signal }),
  });
}

export function useReviewQueue() {
  return useQuery(reviewQueueQuery());
}
