import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { adminUserSchema, type AdminRole } from "./get-users.ts";
import { adminKeys } from "./keys.ts";

const responseSchema = z.object({ user: adminUserSchema });

/** Sets one person's roles; refreshes the list and the audit log (both under adminKeys.all) before settling. */
export function useSetRoles(opts: { afterChange?: (login: string) => Promise<unknown> } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ login, roles }: { login: string; roles: AdminRole[] }) =>
      apiRequest(apiPaths.adminUserRoles(login), responseSchema, { method: "PUT", body: { roles } }),
    onSettled: async (_data, _err, vars) => {
      await queryClient.invalidateQueries({ queryKey: adminKeys.all });
      if (opts.afterChange) await opts.afterChange(vars.login);
    },
  });
}
