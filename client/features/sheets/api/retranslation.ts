import { useMutation, useQueryClient } from "@tanstack/react-query";
import { retranslationPreviewSchema, sheetSchema, type RetranslationAcceptRequest } from "../../../../common/sheets.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { sheetKeys } from "./keys.ts";

/** What re-translating records against today's catalogue would change (nothing is saved). */
export function useRetranslationPreview(id: number) {
  return useMutation({
    mutationFn: (records: number[] | undefined) =>
      apiRequest(apiPaths.sheetRetranslationPreview(id), retranslationPreviewSchema, { method: "POST", body: records ? { records } : {} }),
  });
}

/** Accepts a previewed re-translation: the old translations move to the records' history. */
export function useAcceptRetranslation(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: RetranslationAcceptRequest) => apiRequest(apiPaths.sheetRetranslation(id), sheetSchema, { method: "POST", body: input }),
    onSuccess: async (sheet) => {
      qc.setQueryData(sheetKeys.detail(id), sheet);
      await qc.invalidateQueries({ queryKey: sheetKeys.list() });
    },
    onError: async () => {
      await qc.invalidateQueries({ queryKey: sheetKeys.detail(id) });
    },
  });
}
