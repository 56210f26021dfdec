import { keepPreviousData, queryOptions, skipToken, useQuery } from "@tanstack/react-query";
import { convertResponseSchema, type ConvertRequest } from "../../../../common/convert.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/**
 * A translation is a pure function of its request and of the catalogue, so it is a query keyed by
 * the request: switching a theory's convention back and forth is answered from the cache.
 * Until the form is submitted there is no request, and the query is skipped.
 */
export const convertKeys = {
  all: ["convert"] as const,
  bound: (request: ConvertRequest | undefined) => [...convertKeys.all, "bound", request ?? null] as const,
};

export const convertQuery = (request: ConvertRequest | undefined) =>
  queryOptions({
    queryKey: convertKeys.bound(request),
    queryFn: request
      ? ({ signal }) => apiRequest(apiPaths.convert(), convertResponseSchema, { method: "POST", body: request, signal })
      : skipToken,
    staleTime: 60_000,
    retry: false,
  });

export function useConvert(request: ConvertRequest | undefined) {
  // Keep the previous table on screen while a convention switch is being fetched.
  return useQuery({ ...convertQuery(request), placeholderData: keepPreviousData });
}
