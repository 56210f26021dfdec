import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { shareResponseSchema } from "../../../../common/sheets.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { sheetKeys } from "./keys.ts";

/**
 * The sheet writes await their invalidations before they settle, so the list and the detail a
 * component shows next are the server's, and a stale version cannot linger into the next edit.
 */

export function useShareSheet(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => apiRequest(apiPaths.sheetShare(id), shareResponseSchema, { method: "POST" }),
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: sheetKeys.all });
    },
  });
}

export function useUnshareSheet(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => apiRequest(apiPaths.sheetShare(id), z.unknown(), { method: "DELETE" }),
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: sheetKeys.all });
    },
  });
}
