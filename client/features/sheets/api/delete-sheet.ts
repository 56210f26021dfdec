import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { sheetKeys } from "./keys.ts";

/**
 * The sheet writes await their invalidations before they settle, so the list and the detail a
 * component shows next are the server's, and a stale version cannot linger into the next edit.
 */

export function useDeleteSheet() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: number; version: number }) => apiRequest(`${apiPaths.sheet(id)}?version=${version}`, z.unknown(), { method: "DELETE" }),
    onSuccess: async (_data, { id }) => {
      qc.removeQueries({ queryKey: sheetKeys.detail(id) });
      await qc.invalidateQueries({ queryKey: sheetKeys.list() });
    },
  });
}
