import { queryOptions, useQuery } from "@tanstack/react-query";
import { outboxResponseSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

export function outboxQuery() {
  return queryOptions({
    queryKey: ["outbox"] as const,
    queryFn: ({ signal }) => apiRequest(apiPaths.outbox(), outboxResponseSchema, { signal }),
    // Mail arrives after the request that caused it; look again every few seconds while the page is open.
    refetchInterval: 5_000,
    staleTime: 0,
  });
}

export function useOutbox() {
  return useQuery(outboxQuery());
}
