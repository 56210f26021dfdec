import { queryOptions, skipToken, useQuery } from "@tanstack/react-query";
import { convertTableResponseSchema, type ConvertTableRequest } from "../../../../common/convert.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { convertKeys } from "./convert-bound.ts";

export const convertTableKeys = {
  table: (request: ConvertTableRequest | undefined) => [...convertKeys.all, "table", request ?? null] as const,
};

export const convertTableQuery = (request: ConvertTableRequest | undefined) =>
  queryOptions({
    queryKey: convertTableKeys.table(request),
    queryFn: request
      ? ({ signal }) => apiRequest(apiPaths.convertTable(), convertTableResponseSchema, { method: "POST", body: request, signal })
      : skipToken,
    staleTime: 60_000,
    retry: false,
  });

export function useConvertTable(request: ConvertTableRequest | undefined) {
  return useQuery(convertTableQuery(request));
}
