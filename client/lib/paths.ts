/** Every client URL in one place; components never build links by hand. */
export const paths = {
  home: () => "/",
  forbidden: (role?: string) => (role ? `/forbidden?role=${encodeURIComponent(role)}` : "/forbidden"),
} as const;

export const apiPaths = {
  health: () => "/api/health",
} as const;
