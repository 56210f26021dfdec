import { useMutation, useQueryClient } from "@tanstack/react-query";
import { sheetSchema, type UpdateSheetRequest } from "../../../../common/sheets.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { sheetKeys } from "./keys.ts";

/**
 * The sheet writes await their invalidations before they settle, so the list and the detail a
 * component shows next are the server's, and a stale version cannot linger into the next edit.
 */

export function useUpdateSheet(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateSheetRequest) => apiRequest(apiPaths.sheet(id), sheetSchema, { method: "PATCH", body: input }),
    onSuccess: async (sheet) => {
      qc.setQueryData(sheetKeys.detail(id), sheet);
      await qc.invalidateQueries({ queryKey: sheetKeys.list() });
    },
    // A 409 means someone (another tab) moved the sheet on: fetch what is there now.
    onError: async () => {
      await qc.invalidateQueries({ queryKey: sheetKeys.detail(id) });
    },
  });
}
