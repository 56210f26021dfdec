import { z } from "zod";

/** The server's one error shape: { error: { code, message, fields? } }. */
export const errorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
    details: z.record(z.string(), z.unknown()).optional(),
  }),
});

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string>;
  readonly details: Record<string, unknown>;
  constructor(status: number, code: string, message: string, fields: Record<string, string> = {}, details: Record<string, unknown> = {}) {
    super(message);
    this.name = "ApiError";
    this.status = status;
    this.code = code;
    this.fields = fields;
    this.details = details;
  }
}

let csrfToken: string | undefined;

export function setCsrfToken(token: string | undefined): void {
  csrfToken = token;
}

interface RequestOptions {
  method?: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  body?: unknown;
  /** A multipart body (file uploads); sent as it is, instead of `body`. */
  form?: FormData;
  signal?: AbortSignal;
}

/** Fetches JSON and parses it with the given schema: no unchecked casts of server answers. */
export async function apiRequest<S extends z.ZodType>(url: string, schema: S, opts: RequestOptions = {}): Promise<z.output<S>> {
  const method = opts.method ?? "GET";
  const headers: Record<string, string> = { Accept: "application/json" };
  if (opts.body !== undefined) headers["Content-Type"] = "application/json";
  if (method !== "GET" && csrfToken) headers["X-CSRF-Token"] = csrfToken;
  const res = await fetch(url, {
    method,
    headers,
    credentials: "same-origin",
    body: opts.form ?? (opts.body === undefined ? null : JSON.stringify(opts.body)),
    signal: opts.signal ?? null,
  });
  const text = await res.text();
  let json: unknown = undefined;
  if (text) {
    try {
      json = JSON.parse(text);
    } catch {
      throw new ApiError(res.status, "bad_response", `The server answered ${res.status} with something that is not JSON.`);
    }
  }
  if (!res.ok) {
    const parsed = errorBodySchema.safeParse(json);
    if (parsed.success) {
      const e = parsed.data.error;
      throw new ApiError(res.status, e.code, e.message, e.fields, e.details);
    }
    throw new ApiError(res.status, "http_error", `The server answered ${res.status}.`);
  }
  const parsed = schema.safeParse(json);
  if (!parsed.success) throw new ApiError(res.status, "bad_response", `Unexpected answer from ${url}: ${parsed.error.issues[0]?.message ?? "shape mismatch"}`);
  return parsed.data;
}
