/** Hierarchical keys: invalidating ["sheets"] refreshes lists, details and shared views together. */
export const sheetKeys = {
  all: ["sheets"] as const,
  list: () => [...sheetKeys.all, "list"] as const,
  detail: (id: number) => [...sheetKeys.all, "detail", id] as const,
  shared: (token: string) => [...sheetKeys.all, "shared", token] as const,
};
