import { useMutation, useQueryClient } from "@tanstack/react-query";
import { sheetSchema, type CreateSheetRequest } from "../../../../common/sheets.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { sheetKeys } from "./keys.ts";

/**
 * The sheet writes await their invalidations before they settle, so the list and the detail a
 * component shows next are the server's, and a stale version cannot linger into the next edit.
 */

export function useCreateSheet() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSheetRequest) => apiRequest(apiPaths.sheets(), sheetSchema, { method: "POST", body: input }),
    onSuccess: async (sheet) => {
      qc.setQueryData(sheetKeys.detail(sheet.id), sheet);
      await qc.invalidateQueries({ queryKey: sheetKeys.list() });
    },
  });
}
