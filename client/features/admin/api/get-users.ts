import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { ROLE_NAMES, type RoleName } from "../../../../common/accounts.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { adminKeys } from "./keys.ts";

export const ADMIN_ROLE_NAMES = ROLE_NAMES;
export type AdminRole = RoleName;

export const adminUserSchema = z.object({
  login: z.string(),
  name: z.string(),
  roles: z.array(z.enum(ADMIN_ROLE_NAMES)),
  created_at: z.string(),
  last_sign_in_at: z.string().nullable(),
});
export type AdminUser = z.output<typeof adminUserSchema>;

const usersSchema = z.object({ users: z.array(adminUserSchema) });

export const adminUsersQuery = () =>
  queryOptions({
    queryKey: adminKeys.users(),
    queryFn: async ({ signal }) => (await apiRequest(apiPaths.adminUsers(), usersSchema, { signal })).users,
  });

export function useAdminUsers() {
  return useQuery(adminUsersQuery());
}
