import { queryOptions, useQuery } from "@tanstack/react-query";
import { theoryListResponseSchema, type TheoryFamily } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

export interface TheoryFilters {
  family?: TheoryFamily | undefined;
  b?: number | undefined;
  pn_order?: number | undefined;
  text?: string | undefined;
}

/** Keys: ['theories'] refreshes lists and details together after an accepted submission. */
export const theoryKeys = {
  all: ["theories"] as const,
  lists: () => [...theoryKeys.all, "list"] as const,
  list: (filters: TheoryFilters) => [...theoryKeys.lists(), filters] as const,
  details: () => [...theoryKeys.all, "detail"] as const,
  detail: (slug: string) => [...theoryKeys.details(), slug] as const,
  revisions: (slug: string) => [...theoryKeys.detail(slug), "revisions"] as const,
  revision: (slug: string, n: number) => [...theoryKeys.revisions(slug), n] as const,
};

export function theoriesQuery(filters: TheoryFilters) {
  return queryOptions({
    queryKey: theoryKeys.list(filters),
    queryFn: ({ signal }) => apiRequest(apiPaths.theories({ ...filters }), theoryListResponseSchema, { signal }),
    // Typing in the search box must not blank the table between answers.
    placeholderData: (previous) => previous,
  });
}

export function useTheories(filters: TheoryFilters) {
  return useQuery(theoriesQuery(filters));
}
