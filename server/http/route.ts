import type { NextFunction, Request, RequestHandler, Response, Router } from "express";
import type { z } from "zod";
import { ForbiddenError, UnauthorizedError } from "../errors.ts";
import { jsonBody, rawJsonBody } from "./body.ts";
import type { Role } from "./identity.ts";

// parseWith lives in its own module (no Express), so worker threads can read bodies with it too.
export { parseWith } from "./parse-with.ts";

/**
 * Every API route is declared here, with who may call it. mountRoutes is the only way routes reach
 * Express, and tests/api/route-rules.test.ts fails when a route exists without a declared rule.
 */
export type Access =
  | { kind: "public" }
  | { kind: "signed_in" }
  | { kind: "roles"; roles: readonly Role[] }
  | { kind: "dev_only" };

export const access = {
  public: { kind: "public" } as Access,
  signedIn: { kind: "signed_in" } as Access,
  roles: (...roles: Role[]): Access => ({ kind: "roles", roles }),
  devOnly: { kind: "dev_only" } as Access,
};

export type Method = "get" | "post" | "put" | "patch" | "delete";

export interface RouteSpec {
  method: Method;
  /** Express path relative to the mount point, e.g. "/theories/:slug". */
  path: string;
  access: Access;
  summary: string;
  tags?: string[];
  body?: z.ZodType;
  query?: z.ZodType;
  response?: z.ZodType;
  /** Extra statuses the route can answer with, for the API document. */
  errors?: number[];
  /** Middleware that runs after the access check (rate limits, uploads) and before the JSON body is read. */
  before?: RequestHandler[];
  /** Largest JSON body this route reads, in bytes (default: the table's defaultBodyLimit). */
  bodyLimit?: number;
  /** The body is a multipart upload read (within its own limits) by a `before` handler: no JSON body is read. */
  multipart?: boolean;
  /**
   * The JSON body is read as bytes (same limits) and left in req.body as a Buffer: the handler parses
   * and validates it with readJsonBody (server/http/json-body.ts), in a worker thread when it is large.
   */
  rawJsonBody?: boolean;
  handler: (req: Request, res: Response, next: NextFunction) => unknown;
}

export interface MountedRoute extends RouteSpec {
  fullPath: string;
}

export class RouteTable {
  readonly routes: MountedRoute[] = [];
  devRoutesEnabled = false;
  /** JSON body limit of routes that declare none (bytes); createApp sets it from JSON_BODY_MAX_BYTES. */
  defaultBodyLimit = 2_097_152;

  mount(router: Router, prefix: string, specs: RouteSpec[]): void {
    for (const spec of specs) {
      if (!spec.access) throw new Error(`Route ${spec.method.toUpperCase()} ${prefix}${spec.path} declares no access rule`);
      this.routes.push({ ...spec, fullPath: prefix + spec.path });
      const guard = accessGuard(spec.access, () => this.devRoutesEnabled);
      // Access, then rate limits and uploads, then the body: nothing is read for a request that is refused.
      const limit = spec.bodyLimit ?? this.defaultBodyLimit;
      const body = spec.method === "get" || spec.method === "delete" || spec.multipart ? [] : spec.rawJsonBody ? rawJsonBody(limit) : jsonBody(limit);
      router[spec.method](spec.path, guard, ...(spec.before ?? []), ...body, async (req, res, next) => {
        await spec.handler(req, res, next);
      });
    }
  }

  find(method: string, fullPath: string): MountedRoute | undefined {
    return this.routes.find((r) => r.method === method.toLowerCase() && r.fullPath === fullPath);
  }
}

export function describeAccess(a: Access): string {
  switch (a.kind) {
    case "public":
      return "anyone";
    case "signed_in":
      return "any signed-in user";
    case "roles":
      return `role ${a.roles.join(" or ")}`;
    case "dev_only":
      return "local development only";
  }
}

export function accessGuard(a: Access, devEnabled: () => boolean): RequestHandler {
  return (req, _res, next) => {
    if (a.kind === "public") return next();
    if (a.kind === "dev_only") {
      if (devEnabled()) return next();
      return next(new ForbiddenError("This route exists only while the local mail sink is in use."));
    }
    const who = req.identity;
    if (!who) return next(new UnauthorizedError());
    if (a.kind === "signed_in") return next();
    if (a.roles.some((r) => who.roles.includes(r))) return next();
    return next(
      new ForbiddenError(`This needs the ${a.roles.join(" or ")} role; you have ${who.roles.length ? who.roles.join(", ") : "no role beyond reader"}.`, {
        required_roles: [...a.roles],
      }),
    );
  };
}
