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

/**
 * A multipart upload with upload progress (fetch cannot report it): XMLHttpRequest, the same CSRF
 * header and error shape as apiRequest, the answer parsed with the schema.
 */
export function uploadRequest<S extends z.ZodType>(url: string, schema: S, form: FormData, onProgress: (fraction: number) => void): Promise<z.output<S>> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", url);
    xhr.withCredentials = true;
    xhr.setRequestHeader("Accept", "application/json");
    if (csrfToken) xhr.setRequestHeader("X-CSRF-Token", csrfToken);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onerror = () => reject(new ApiError(0, "network", "The upload did not reach the server."));
    xhr.onload = () => {
      let json: unknown;
      try {
        json = xhr.responseText ? JSON.parse(xhr.responseText) : undefined;
      } catch {
        reject(new ApiError(xhr.status, "bad_response", `The server answered ${xhr.status} with something that is not JSON.`));
        return;
      }
      if (xhr.status < 200 || xhr.status >= 300) {
        const parsed = errorBodySchema.safeParse(json);
        reject(parsed.success ? new ApiError(xhr.status, parsed.data.error.code, parsed.data.error.message, parsed.data.error.fields, parsed.data.error.details) : new ApiError(xhr.status, "http_error", `The server answered ${xhr.status}.`));
        return;
      }
      const parsed = schema.safeParse(json);
      if (parsed.success) resolve(parsed.data);
      else reject(new ApiError(xhr.status, "bad_response", `Unexpected answer from ${url}.`));
    };
    xhr.send(form);
  });
}
