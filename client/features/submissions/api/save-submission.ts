import { useMutation, useQueryClient } from "@tanstack/react-query";
import { statusResponseSchema, submissionSavedSchema, type CreateSubmissionInput } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { submissionKeys } from "./keys.ts";

export interface SaveInput {
  /** Absent for a first save (POST); present afterwards (PATCH with the version last read). */
  id?: number | undefined;
  version?: number | undefined;
  body: CreateSubmissionInput;
}

export function saveSubmission({ id, version, body }: SaveInput) {
  if (id === undefined) return apiRequest(apiPaths.submissions(), submissionSavedSchema, { method: "POST", body });
  return apiRequest(apiPaths.submission(id), submissionSavedSchema, { method: "PATCH", body: { version, theory: body.theory } });
}

export function useSaveSubmission() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: saveSubmission,
    onSuccess: async (saved) => {
      // Lists show the version and check state; the detail is re-read so a reload shows this save.
      await Promise.all([qc.invalidateQueries({ queryKey: submissionKeys.lists() }), qc.invalidateQueries({ queryKey: submissionKeys.detail(saved.id) })]);
    },
  });
}

export function useSubmitSubmission() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiRequest(apiPaths.submissionAction(id, "submit"), statusResponseSchema, { method: "POST", body: {} }),
    onSuccess: async (res) => {
      await Promise.all([qc.invalidateQueries({ queryKey: submissionKeys.lists() }), qc.invalidateQueries({ queryKey: submissionKeys.detail(res.id) })]);
    },
  });
}

export function useWithdrawSubmission() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiRequest(apiPaths.submissionAction(id, "withdraw"), statusResponseSchema, { method: "POST", body: {} }),
    onSuccess: async (res) => {
      await Promise.all([qc.invalidateQueries({ queryKey: submissionKeys.lists() }), qc.invalidateQueries({ queryKey: submissionKeys.detail(res.id) })]);
    },
  });
}
