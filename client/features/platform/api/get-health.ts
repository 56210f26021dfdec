import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

export const healthSchema = z.object({
  status: z.enum(["ok", "degraded"]),
  db: z.enum(["up", "down"]),
  version: z.string(),
});

export const healthQuery = () =>
  queryOptions({
    queryKey: ["platform", "health"] as const,
    queryFn: ({ signal }) => apiRequest(apiPaths.health(), healthSchema, { signal }),
    staleTime: 60_000,
    retry: false,
  });

export function useHealth() {
  return useQuery(healthQuery());
}
