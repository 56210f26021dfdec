import { z } from "zod";
import type { Knex } from "../../db/knex.ts";
import { UnauthorizedError } from "../../errors.ts";
import { ROLES } from "../../http/identity.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import type { User } from "../accounts/users-repository.ts";
import { adminService } from "./service.ts";

const userView = z.object({
  login: z.string(),
  name: z.string(),
  roles: z.array(z.enum(ROLES)),
  created_at: z.string(),
  last_sign_in_at: z.string().nullable(),
});
export const listUsersResponse = z.object({ users: z.array(userView) });
export const setRolesBody = z.strictObject({
  roles: z.array(z.enum(ROLES, { error: `must be one of ${ROLES.join(", ")}` })).max(ROLES.length * 2),
});
export const setRolesResponse = z.object({ user: userView });
const loginParams = z.object({ login: z.string().min(1).max(39) });
export const auditQuery = z.strictObject({
  limit: z.coerce.number().int().min(1).max(500).default(100),
  subject: z.string().min(1).max(39).optional(),
});
export const auditResponse = z.object({
  entries: z.array(
    z.object({
      id: z.number(),
      at: z.string(),
      actor: z.string().nullable(),
      action: z.string(),
      subject: z.string(),
      before: z.unknown(),
      after: z.unknown(),
    }),
  ),
});

const view = (u: User) => ({
  login: u.login,
  name: u.name,
  roles: u.roles,
  created_at: u.createdAt.toISOString(),
  last_sign_in_at: u.lastSignInAt ? u.lastSignInAt.toISOString() : null,
});

export function adminRoutes(db: Knex): RouteSpec[] {
  const admin = adminService(db);
  return [
    {
      method: "get",
      path: "/v1/admin/users",
      access: access.roles("admin"),
      summary: "Everyone who has an account, with their roles",
      tags: ["admin"],
      response: listUsersResponse,
      errors: [401, 403],
      handler: async (_req, res) => {
        res.json({ users: (await admin.listUsers()).map(view) });
      },
    },
    {
      method: "put",
      path: "/v1/admin/users/:login/roles",
      access: access.roles("admin"),
      summary: "Set a person's roles (audited; the last admin cannot be demoted)",
      tags: ["admin"],
      body: setRolesBody,
      response: setRolesResponse,
      errors: [400, 401, 403, 404, 409],
      handler: async (req, res) => {
        const { login } = parseWith(loginParams, req.params, "path");
        const { roles } = parseWith(setRolesBody, req.body);
        if (!req.identity) throw new UnauthorizedError();
        const user = await admin.setRoles(req.identity, login, roles);
        res.json({ user: view(user) });
      },
    },
    {
      method: "get",
      path: "/v1/admin/audit",
      access: access.roles("admin"),
      summary: "The audit log of account changes, newest first (limit, subject)",
      tags: ["admin"],
      query: auditQuery,
      response: auditResponse,
      errors: [400, 401, 403],
      handler: async (req, res) => {
        const q = parseWith(auditQuery, req.query, "query");
        const entries = await admin.listAudit({ limit: q.limit, subject: q.subject });
        res.json({
          entries: entries.map((e) => ({ id: e.id, at: e.at.toISOString(), actor: e.actorLogin, action: e.action, subject: e.subject, before: e.before, after: e.after })),
        });
      },
    },
  ];
}
