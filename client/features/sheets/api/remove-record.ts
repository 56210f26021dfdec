import { useMutation, useQueryClient } from "@tanstack/react-query";
import { sheetSchema } from "../../../../common/sheets.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { sheetKeys } from "./keys.ts";

/** Removes one record (DELETE /sheets/:id/records/:record?version=); the others are not touched. */
export function useRemoveRecord(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ record, version }: { record: number; version: number }) => apiRequest(apiPaths.sheetRecord(id, record, version), sheetSchema, { method: "DELETE" }),
    onSuccess: async (sheet) => {
      qc.setQueryData(sheetKeys.detail(id), sheet);
      await qc.invalidateQueries({ queryKey: sheetKeys.list() });
    },
    onError: async () => {
      await qc.invalidateQueries({ queryKey: sheetKeys.detail(id) });
    },
  });
}
