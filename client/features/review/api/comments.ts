import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { commentListResponseSchema, commentSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { reviewKeys } from "./keys.ts";

export function commentsQuery(id: number) {
  return queryOptions({
    queryKey: reviewKeys.comments(id),
    queryFn: ({ signal }) => apiRequest(apiPaths.submissionAction(id, "comments"), commentListResponseSchema, { signal }),
  });
}

export function useComments(id: number) {
  return useQuery(commentsQuery(id));
}

export function useAddComment(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: string) => apiRequest(apiPaths.submissionAction(id, "comments"), commentSchema, { method: "POST", body: { body } }),
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: reviewKeys.comments(id) });
    },
  });
}
