import { QueryClient } from "@tanstack/react-query";
import { ApiError } from "./api-client.ts";

export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        gcTime: 5 * 60_000,
        refetchOnWindowFocus: false,
        // Client errors (4xx) will not fix themselves; retry only network and 5xx failures, twice.
        retry: (count, err) => count < 2 && !(err instanceof ApiError && err.status < 500),
      },
      mutations: { retry: false },
    },
  });
}
