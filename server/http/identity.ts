export const ROLES = ["contributor", "analyst", "editor", "admin"] as const;
export type Role = (typeof ROLES)[number];

/** Who is calling: set by the auth middleware from the session or an API token. */
export interface Identity {
  id: number;
  login: string;
  name: string;
  roles: Role[];
  via: "session" | "token";
}

declare module "express-serve-static-core" {
  interface Request {
    identity?: Identity;
  }
}
