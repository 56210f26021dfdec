import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { ROLE_NAMES, type RoleName } from "../../../../common/accounts.ts";
import { apiRequest, setCsrfToken } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

export type Role = RoleName;

const userSchema = z.object({ login: z.string(), name: z.string(), roles: z.array(z.enum(ROLE_NAMES)) });
const sessionSchema = z.object({ user: userSchema.nullable(), csrf_token: z.string().nullable() });

export type Me = z.output<typeof userSchema>;

export const meKeys = { all: ["me"] as const };

/**
 * Who is signed in, or null for a visitor (GET /api/v1/session answers 200 either way, so a visitor's
 * console stays clean). The CSRF token arrives in the same answer and is set before the query
 * settles, so no write can leave the browser without it; it is bound to the session, so a fresh one
 * follows every sign-in.
 */
export async function fetchMe(signal?: AbortSignal): Promise<Me | null> {
  const { user, csrf_token } = await apiRequest(apiPaths.session(), sessionSchema, { signal });
  setCsrfToken(csrf_token ?? undefined);
  return user;
}

export const meQuery = () =>
  queryOptions({
    queryKey: meKeys.all,
    queryFn: ({ signal }) => fetchMe(signal),
    staleTime: 5 * 60_000,
  });

export function useMe() {
  return useQuery(meQuery());
}
