import { useMutation, useQueryClient } from "@tanstack/react-query";
import { commentSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { submissionCommentsQuery } from "./get-submission.ts";

/** The author answers the editors on their own submission's thread. */
export function useAddSubmissionComment(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: string) => apiRequest(apiPaths.submissionAction(id, "comments"), commentSchema, { method: "POST", body: { body } }),
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: submissionCommentsQuery(id).queryKey });
    },
  });
}
