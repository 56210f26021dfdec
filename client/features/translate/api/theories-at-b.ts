import { queryOptions, skipToken, useQuery } from "@tanstack/react-query";
import { theoryListResponseSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/**
 * The accepted theories with an inspiral-phase mapping at b: the ones a posterior or a set of events
 * at that b can constrain. Same key shape as the catalogue list (['theories', 'list', filters]), so a
 * publication that invalidates the catalogue list refreshes this too.
 */
export const theoriesAtBQuery = (b: number | null) => {
  const filters = { b: b ?? undefined, kind: "inspiral_phase" };
  return queryOptions({
    queryKey: ["theories", "list", filters] as const,
    queryFn: b === null ? skipToken : ({ signal }) => apiRequest(apiPaths.theories(filters), theoryListResponseSchema, { signal }),
    staleTime: 60_000,
  });
};

export function useTheoriesAtB(b: number | null) {
  return useQuery(theoriesAtBQuery(b));
}
