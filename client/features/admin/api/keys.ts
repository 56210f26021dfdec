/** Hierarchical keys: invalidating adminKeys.all refreshes the user list and the audit log together. */
export const adminKeys = {
  all: ["admin"] as const,
  users: () => [...adminKeys.all, "users"] as const,
  audit: (opts: { limit?: number; subject?: string }) => [...adminKeys.all, "audit", opts] as const,
};
