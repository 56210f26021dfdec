import { useMutation, useQueryClient } from "@tanstack/react-query";
import { retirementResponseSchema, type RestoreRequest, type RetirementRequest } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { theoryKeys } from "./get-theories.ts";

/** Editors: retire (with a reason) or restore an entry, one coupling or one mapping; each publishes a revision. */
export function useRetirement(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { action: "retire"; body: RetirementRequest } | { action: "restore"; body: RestoreRequest }) =>
      apiRequest(apiPaths.theoryRetirement(slug, input.action), retirementResponseSchema, { method: "POST", body: input.body }),
    // A new revision: every list, the entry, its history (and the translator's catalogue) changed.
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: theoryKeys.all });
    },
  });
}
