import { queryOptions, useQuery } from "@tanstack/react-query";
import { submissionListResponseSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { submissionKeys } from "./keys.ts";

export function mySubmissionsQuery() {
  const filters = { mine: true };
  return queryOptions({
    queryKey: submissionKeys.list(filters),
    queryFn: ({ signal }) => apiRequest(apiPaths.submissions(filters), submissionListResponseSchema, { signal }),
  });
}

export function useMySubmissions() {
  return useQuery(mySubmissionsQuery());
}
