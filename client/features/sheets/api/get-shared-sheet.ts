import { queryOptions, useQuery } from "@tanstack/react-query";
import { sheetSchema } from "../../../../common/sheets.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { sheetKeys } from "./keys.ts";

/** A sheet opened through its share link: no sign-in, read-only. */
export const sharedSheetQuery = (token: string) =>
  queryOptions({
    queryKey: sheetKeys.shared(token),
    queryFn: ({ signal }) => apiRequest(apiPaths.sharedSheet(token), sheetSchema, { signal }),
  });

export function useSharedSheet(token: string) {
  return useQuery(sharedSheetQuery(token));
}
