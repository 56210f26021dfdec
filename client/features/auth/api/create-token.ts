import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import type { CreateTokenInput } from "../../../../common/accounts.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { tokenKeys } from "./get-tokens.ts";

const createdSchema = z.object({ id: z.number(), name: z.string(), created_at: z.string(), token: z.string() });

/** Creates a token; the answer holds the secret, which the server never shows again. */
export function useCreateToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateTokenInput) => apiRequest(apiPaths.tokens(), createdSchema, { method: "POST", body: input }),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: tokenKeys.all });
    },
  });
}
