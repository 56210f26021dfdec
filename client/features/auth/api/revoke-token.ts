import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { tokenKeys } from "./get-tokens.ts";

export function useRevokeToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiRequest(apiPaths.token(id), z.unknown(), { method: "DELETE" }),
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: tokenKeys.all });
    },
  });
}
