import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { apiRequest, setCsrfToken } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { meKeys } from "./get-me.ts";

/** Ends the session; then every cached answer is refetched, since what a visitor may see differs. */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiRequest(apiPaths.signOut(), z.unknown(), { method: "POST" }),
    onSuccess: async () => {
      setCsrfToken(undefined);
      queryClient.setQueryData(meKeys.all, null);
      await queryClient.invalidateQueries({ predicate: (q) => q.queryKey[0] !== meKeys.all[0] });
    },
  });
}
