/**
 * Submission query keys. The review feature builds the same hierarchy (features never import each
 * other), so invalidating ['submissions'] refreshes both the author's and the editor's views.
 */
export const submissionKeys = {
  all: ["submissions"] as const,
  lists: () => [...submissionKeys.all, "list"] as const,
  list: (filters: { mine?: boolean; status?: string }) => [...submissionKeys.lists(), filters] as const,
  details: () => [...submissionKeys.all, "detail"] as const,
  detail: (id: number) => [...submissionKeys.details(), id] as const,
};
