import { queryOptions, useQuery } from "@tanstack/react-query";
import { sheetSchema } from "../../../../common/sheets.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { sheetKeys } from "./keys.ts";

export const sheetQuery = (id: number) =>
  queryOptions({
    queryKey: sheetKeys.detail(id),
    queryFn: ({ signal }) => apiRequest(apiPaths.sheet(id), sheetSchema, { signal }),
  });

export function useSheet(id: number) {
  return useQuery(sheetQuery(id));
}
