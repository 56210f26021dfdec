import { useMutation, useQueryClient } from "@tanstack/react-query";
import { statusResponseSchema, type DecisionInput } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { reviewKeys } from "./keys.ts";

export function useStartReview(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => apiRequest(apiPaths.submissionAction(id, "start-review"), statusResponseSchema, { method: "POST", body: {} }),
    onSuccess: async () => {
      await Promise.all([qc.invalidateQueries({ queryKey: reviewKeys.detail(id) }), qc.invalidateQueries({ queryKey: reviewKeys.lists() })]);
    },
  });
}

export function useDecide(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: DecisionInput) => apiRequest(apiPaths.submissionAction(id, "decision"), statusResponseSchema, { method: "POST", body: input }),
    onSuccess: async () => {
      await Promise.all([
        qc.invalidateQueries({ queryKey: reviewKeys.detail(id) }),
        qc.invalidateQueries({ queryKey: reviewKeys.lists() }),
        // An acceptance publishes a revision: every catalogue list and detail may have changed.
        qc.invalidateQueries({ queryKey: reviewKeys.theories }),
      ]);
    },
  });
}
