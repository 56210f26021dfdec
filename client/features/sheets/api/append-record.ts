import { useMutation, useQueryClient } from "@tanstack/react-query";
import { sheetSchema, type SheetRecordInput } from "../../../../common/sheets.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { sheetQuery } from "./get-sheet.ts";
import { sheetKeys } from "./keys.ts";

/**
 * Adds one record to an existing sheet (POST /sheets/:id/records): the server computes only the new
 * record; the others stay exactly as stored. It names the version it just read, so a concurrent edit
 * in between answers 409 rather than being lost.
 */
export function useAppendRecord() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ sheetId, record }: { sheetId: number; record: SheetRecordInput }) => {
      const sheet = await qc.fetchQuery({ ...sheetQuery(sheetId), staleTime: 0 });
      return apiRequest(apiPaths.sheetRecords(sheetId), sheetSchema, { method: "POST", body: { version: sheet.version, record } });
    },
    onSuccess: async (sheet) => {
      qc.setQueryData(sheetKeys.detail(sheet.id), sheet);
      await qc.invalidateQueries({ queryKey: sheetKeys.list() });
    },
  });
}
