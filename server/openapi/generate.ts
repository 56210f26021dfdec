import { z } from "zod";
import { describeAccess, type Access, type MountedRoute } from "../http/route.ts";

/**
 * The OpenAPI 3.1 document, generated from the route table: every mounted RouteSpec becomes an
 * operation, its zod schemas become component schemas (z.toJSONSchema; JSON Schema 2020-12 is
 * OpenAPI 3.1's dialect), and its access rule becomes both `security` and an `x-access` extension.
 * Nothing is written by hand, so the document cannot drift from the routes.
 */

type JsonObject = Record<string, unknown>;

export interface OpenApiInfo {
  title: string;
  version: string;
  description?: string;
}

const STATUS_TEXT: Record<number, string> = {
  200: "OK",
  201: "Created",
  204: "No content",
  400: "Bad input: `error.fields` names each field at fault",
  401: "Not signed in (no session and no valid API token)",
  403: "Signed in, but not allowed (role, ownership, or a development-only route)",
  404: "Not found",
  409: "Conflict: an illegal state change or a stale version; `error.details` says which",
  413: "Payload too large",
  429: "Too many requests",
  503: "Unavailable",
};

/** Express "/v1/theories/:slug" -> OpenAPI "/v1/theories/{slug}". */
export function openApiPath(expressPath: string): string {
  return expressPath.replace(/:([A-Za-z_][A-Za-z0-9_]*)/g, "{$1}");
}

function pathParams(expressPath: string): string[] {
  return [...expressPath.matchAll(/:([A-Za-z_][A-Za-z0-9_]*)/g)].map((m) => m[1] as string);
}

export function operationId(route: Pick<MountedRoute, "method" | "fullPath">): string {
  const words = route.fullPath
    .replace(/^\/api\//, "")
    .split(/[/\-_.]/)
    .filter(Boolean)
    .map((w) => (w.startsWith(":") ? `By${cap(w.slice(1))}` : cap(w)));
  return route.method + words.join("");
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** JSON Schema for one side of a zod schema; extension keys (x-...) are lifted out for the caller. */
function jsonSchema(schema: z.ZodType, io: "input" | "output"): { schema: JsonObject; extensions: JsonObject } {
  const raw = z.toJSONSchema(schema, { io, unrepresentable: "any", target: "draft-2020-12" }) as JsonObject;
  delete raw.$schema;
  const extensions: JsonObject = {};
  for (const key of Object.keys(raw)) {
    if (key.startsWith("x-")) {
      extensions[key] = raw[key];
      delete raw[key];
    }
  }
  return { schema: raw, extensions };
}

function security(a: Access): JsonObject[] {
  // Public and development-only routes need no credentials; the others take either the session cookie or a token.
  if (a.kind === "public" || a.kind === "dev_only") return [];
  return [{ sessionCookie: [] }, { bearerToken: [] }];
}

function accessExtension(a: Access): JsonObject {
  return { kind: a.kind, ...(a.kind === "roles" ? { roles: [...a.roles] } : {}), description: describeAccess(a) };
}

/** 201 when the route says so (response meta "x-status"), or its handler plainly answers 201. */
function successStatus(route: MountedRoute, extensions: JsonObject): number {
  const declared = extensions["x-status"];
  if (typeof declared === "number") return declared;
  return route.method === "post" && /status\(\s*201\s*\)/.test(route.handler.toString()) ? 201 : 200;
}

export function buildOpenApiDocument(routes: readonly MountedRoute[], info: OpenApiInfo): JsonObject {
  const paths: Record<string, Record<string, JsonObject>> = {};
  const schemas: Record<string, JsonObject> = {
    ErrorBody: {
      type: "object",
      required: ["error"],
      properties: {
        error: {
          type: "object",
          required: ["code", "message"],
          properties: {
            code: { type: "string" },
            message: { type: "string" },
            fields: { type: "object", additionalProperties: { type: "string" }, description: "field path -> what is wrong with it" },
            details: { type: "object", additionalProperties: true },
          },
        },
      },
    },
  };

  for (const route of routes) {
    const id = operationId(route);
    const op: JsonObject = {
      operationId: id,
      summary: route.summary,
      tags: route.tags ?? [],
      "x-access": accessExtension(route.access),
      security: security(route.access),
    };
    if (route.access.kind === "dev_only") op.description = "Answers 403 unless the server runs with DEV_OUTBOX=true (never in production).";

    const parameters: JsonObject[] = pathParams(route.fullPath).map((name) => ({ name, in: "path", required: true, schema: { type: "string" } }));
    if (route.query) {
      const { schema } = jsonSchema(route.query, "input");
      const props = (schema.properties ?? {}) as Record<string, JsonObject>;
      const required = new Set((schema.required as string[] | undefined) ?? []);
      for (const [name, s] of Object.entries(props)) {
        const { description, ...rest } = s;
        parameters.push({ name, in: "query", required: required.has(name), schema: rest, ...(description ? { description } : {}) });
      }
    }
    if (parameters.length) op.parameters = parameters;

    if (route.body) {
      schemas[`${cap(id)}Body`] = jsonSchema(route.body, "input").schema;
      op.requestBody = { required: true, content: { "application/json": { schema: { $ref: `#/components/schemas/${cap(id)}Body` } } } };
    }

    const responses: Record<string, JsonObject> = {};
    if (route.response) {
      const { schema, extensions } = jsonSchema(route.response, "output");
      const status = successStatus(route, extensions);
      const contentType = typeof extensions["x-content-type"] === "string" ? extensions["x-content-type"] : "application/json";
      schemas[`${cap(id)}Response`] = schema;
      responses[String(status)] = {
        description: STATUS_TEXT[status] ?? "Success",
        content: { [contentType]: { schema: { $ref: `#/components/schemas/${cap(id)}Response` } } },
      };
    } else {
      responses["200"] = { description: "Success" };
    }
    const errors = new Set(route.errors ?? []);
    if (route.body || route.query) errors.add(400);
    if (route.access.kind === "signed_in" || route.access.kind === "roles") errors.add(401);
    if (route.access.kind !== "public" && route.access.kind !== "signed_in") errors.add(403);
    for (const status of [...errors].sort()) {
      responses[String(status)] = { description: STATUS_TEXT[status] ?? "Error", content: { "application/json": { schema: { $ref: "#/components/schemas/ErrorBody" } } } };
    }
    op.responses = responses;

    const path = openApiPath(route.fullPath);
    paths[path] ??= {};
    paths[path][route.method] = op;
  }

  return {
    openapi: "3.1.0",
    info,
    jsonSchemaDialect: "https://json-schema.org/draft/2020-12/schema",
    paths,
    components: {
      schemas,
      securitySchemes: {
        sessionCookie: { type: "apiKey", in: "cookie", name: "dragoman.sid", description: "Browser session after GitHub sign-in; writes also need the X-CSRF-Token header" },
        bearerToken: { type: "http", scheme: "bearer", description: "Personal API token (POST /api/v1/tokens)" },
      },
    },
  };
}
