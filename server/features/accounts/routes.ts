import { z } from "zod";
import { createTokenSchema } from "../../../common/accounts.ts";
import { dbId } from "../../../common/ids.ts";
import { UnauthorizedError } from "../../errors.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import type { Request } from "express";
import type { CsrfUtilities } from "../../auth/csrf.ts";
import type { TokensService } from "./tokens-service.ts";

export const meResponse = z.object({
  user: z.object({ login: z.string(), name: z.string(), roles: z.array(z.string()) }),
});
export const csrfResponse = z.object({ token: z.string() });
export const sessionResponse = z.object({ user: meResponse.shape.user.nullable(), csrf_token: z.string().nullable() });
export const createTokenBody = createTokenSchema;
const tokenSummary = z.object({
  id: z.number().int(),
  name: z.string(),
  token_start: z.string(),
  created_at: z.string(),
  last_used_at: z.string().nullable(),
});
export const createTokenResponse = tokenSummary.pick({ id: true, name: true, created_at: true }).extend({ token: z.string() });
export const listTokensResponse = z.object({ tokens: z.array(tokenSummary) });
const tokenParams = z.object({ id: dbId("token id") });

function who(req: Request) {
  // The access guard has run; this only narrows the type.
  if (!req.identity) throw new UnauthorizedError();
  return req.identity;
}

export function accountsRoutes(deps: { tokens: TokensService; csrf: CsrfUtilities }): RouteSpec[] {
  const { tokens, csrf } = deps;
  return [
    {
      method: "get",
      path: "/v1/me",
      access: access.signedIn,
      summary: "Who is calling: login, display name and roles",
      tags: ["accounts"],
      response: meResponse,
      errors: [401],
      handler: (req, res) => {
        const me = who(req);
        res.json({ user: { login: me.login, name: me.name, roles: me.roles } });
      },
    },
    {
      method: "get",
      path: "/v1/session",
      access: access.public,
      // The web client asks this on every page load: a visitor gets 200 with user null, not a 401
      // (which browsers log as a console error). Scripts use /v1/me.
      summary: "The signed-in person (or null) and, when signed in, a CSRF token for this session",
      tags: ["accounts"],
      response: sessionResponse,
      handler: (req, res) => {
        const me = req.identity;
        res.set("Cache-Control", "no-store").json({
          user: me ? { login: me.login, name: me.name, roles: me.roles } : null,
          csrf_token: me?.via === "session" ? csrf.generateCsrfToken(req, res) : null,
        });
      },
    },
    {
      method: "get",
      path: "/v1/csrf",
      access: access.public,
      summary: "A CSRF token to send back as X-CSRF-Token on writes made with the session cookie",
      tags: ["accounts"],
      response: csrfResponse,
      handler: (req, res) => {
        res.set("Cache-Control", "no-store").json({ token: csrf.generateCsrfToken(req, res) });
      },
    },
    {
      method: "post",
      path: "/v1/tokens",
      // Any signed-in person may script against the API; analysts are the main users.
      access: access.signedIn,
      summary: "Create a personal API token; the secret is in this answer only",
      tags: ["accounts"],
      body: createTokenBody,
      response: createTokenResponse,
      errors: [400, 401, 403, 429],
      handler: async (req, res) => {
        const { name } = parseWith(createTokenBody, req.body);
        const { summary, token } = await tokens.create(who(req).id, name);
        res.status(201).set("Cache-Control", "no-store").json({ id: summary.id, name: summary.name, created_at: summary.createdAt.toISOString(), token });
      },
    },
    {
      method: "get",
      path: "/v1/tokens",
      access: access.signedIn,
      summary: "Your API tokens (names and dates; never the secrets)",
      tags: ["accounts"],
      response: listTokensResponse,
      errors: [401, 429],
      handler: async (req, res) => {
        const list = await tokens.list(who(req).id);
        res.json({
          tokens: list.map((t) => ({
            id: t.id,
            name: t.name,
            token_start: t.tokenStart,
            created_at: t.createdAt.toISOString(),
            last_used_at: t.lastUsedAt ? t.lastUsedAt.toISOString() : null,
          })),
        });
      },
    },
    {
      method: "delete",
      path: "/v1/tokens/:id",
      access: access.signedIn,
      summary: "Revoke one of your API tokens; effective from the next request",
      tags: ["accounts"],
      errors: [400, 401, 403, 404, 429],
      handler: async (req, res) => {
        const { id } = parseWith(tokenParams, req.params, "path");
        await tokens.revoke(who(req).id, id);
        res.status(204).end();
      },
    },
  ];
}
