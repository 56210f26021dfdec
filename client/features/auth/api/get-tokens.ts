import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

export const tokenKeys = {
  all: ["tokens"] as const,
  list: () => [...tokenKeys.all, "list"] as const,
};

const tokensSchema = z.object({
  tokens: z.array(
    z.object({ id: z.number(), name: z.string(), token_start: z.string(), created_at: z.string(), last_used_at: z.string().nullable() }),
  ),
});
export type TokenSummary = z.output<typeof tokensSchema>["tokens"][number];

export const tokensQuery = () =>
  queryOptions({
    queryKey: tokenKeys.list(),
    queryFn: async ({ signal }) => (await apiRequest(apiPaths.tokens(), tokensSchema, { signal })).tokens,
  });

export function useTokens() {
  return useQuery(tokensQuery());
}
