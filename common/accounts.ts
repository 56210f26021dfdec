import { z } from "zod";

/** The roles, in their display order. Mirrors ROLES in server/http/identity.ts (a test keeps them equal). */
export const ROLE_NAMES = ["contributor", "analyst", "editor", "admin"] as const;
export type RoleName = (typeof ROLE_NAMES)[number];

/** POST /api/v1/tokens: the server validates with it, and so does the form that creates tokens. */
export const createTokenSchema = z.strictObject({
  name: z.string().trim().min(1, "give the token a name").max(100, "at most 100 characters"),
});
export type CreateTokenInput = z.input<typeof createTokenSchema>;
