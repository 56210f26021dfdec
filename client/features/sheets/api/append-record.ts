import { useMutation, useQueryClient } from "@tanstack/react-query";
import { sheetSchema, type SheetRecordInput } from "../../../../common/sheets.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { recordInput } from "../lib/record-input.ts";
import { sheetQuery } from "./get-sheet.ts";
import { sheetKeys } from "./keys.ts";

/**
 * Adds one record to an existing sheet: reads the sheet fresh (its version and records), then PATCHes
 * it with the record appended. A concurrent edit in between answers 409 rather than being lost.
 */
export function useAppendRecord() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ sheetId, record }: { sheetId: number; record: SheetRecordInput }) => {
      const sheet = await qc.fetchQuery({ ...sheetQuery(sheetId), staleTime: 0 });
      return apiRequest(apiPaths.sheet(sheetId), sheetSchema, {
        method: "PATCH",
        body: { version: sheet.version, records: [...sheet.records.map(recordInput), record] },
      });
    },
    onSuccess: async (sheet) => {
      qc.setQueryData(sheetKeys.detail(sheet.id), sheet);
      await qc.invalidateQueries({ queryKey: sheetKeys.list() });
    },
  });
}
