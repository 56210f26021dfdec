import { queryOptions, useQuery } from "@tanstack/react-query";
import { sheetListSchema } from "../../../../common/sheets.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { sheetKeys } from "./keys.ts";

export const sheetsQuery = () =>
  queryOptions({
    queryKey: sheetKeys.list(),
    queryFn: ({ signal }) => apiRequest(apiPaths.sheets(), sheetListSchema, { signal }),
  });

export function useSheets(enabled = true) {
  return useQuery({ ...sheetsQuery(), enabled });
}
