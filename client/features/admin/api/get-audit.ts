import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { adminKeys } from "./keys.ts";

const auditSchema = z.object({
  entries: z.array(
    z.object({
      id: z.number(),
      at: z.string(),
      actor: z.string().nullable(),
      action: z.string(),
      subject: z.string(),
      before: z.unknown(),
      after: z.unknown(),
    }),
  ),
});
export type AuditEntry = z.output<typeof auditSchema>["entries"][number];

export const auditQuery = (opts: { limit?: number; subject?: string } = {}) =>
  queryOptions({
    queryKey: adminKeys.audit(opts),
    queryFn: async ({ signal }) => (await apiRequest(apiPaths.adminAudit(opts), auditSchema, { signal })).entries,
  });

export function useAudit(opts: { limit?: number; subject?: string } = {}) {
  return useQuery(auditQuery(opts));
}
