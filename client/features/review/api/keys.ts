/**
 * The same key hierarchy the submissions feature uses (features never import each other), so a
 * decision here refreshes the author's lists too.
 */
export const reviewKeys = {
  submissions: ["submissions"] as const,
  lists: () => [...reviewKeys.submissions, "list"] as const,
  queue: (status: string) => [...reviewKeys.lists(), { status }] as const,
  detail: (id: number) => [...reviewKeys.submissions, "detail", id] as const,
  comments: (id: number) => [...reviewKeys.detail(id), "comments"] as const,
  /** The catalogue's root key: accepting publishes a revision, so lists and details must refetch. */
  theories: ["theories"] as const,
};
