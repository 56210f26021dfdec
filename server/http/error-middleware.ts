import type { ErrorRequestHandler, RequestHandler } from "express";
import { AppError, NotFoundError, ServiceUnavailableError, TooManyRequestsError } from "../errors.ts";
import type { Logger } from "../logger.ts";
import { DB_RETRY_AFTER_SECONDS, isDatabaseUnavailable } from "./db-unavailable.ts";
import { redactUrl } from "./redact-url.ts";

interface ErrorBody {
  error: { code: string; message: string; fields?: Record<string, string>; details?: Record<string, unknown>; stack?: string };
}

/** Unknown /api routes answer 404 in the standard shape. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new NotFoundError(`No API route ${req.method} ${req.originalUrl.split("?")[0]}`));
};

function fromLibraryError(err: unknown): AppError | undefined {
  if (typeof err !== "object" || err === null) return undefined;
  const e = err as { type?: string; status?: number; code?: string; message?: string; field?: string };
  // body-parser
  if (e.type === "entity.parse.failed") return new AppError(400, "malformed_json", "The request body is not valid JSON.", { body: "not valid JSON" });
  if (e.type === "entity.too.large") return new AppError(413, "payload_too_large", "The request body is too large.", { body: "too large" });
  // multer
  if (e.code === "LIMIT_FILE_SIZE") return new AppError(400, "file_too_large", "The uploaded file is too large.", { [e.field ?? "file"]: "too large" });
  if (typeof e.code === "string" && e.code.startsWith("LIMIT_")) return new AppError(400, "bad_upload", e.message ?? "Bad upload.", { [e.field ?? "file"]: e.message ?? "bad upload" });
  // busboy (under multer): a multipart body cut short or without its boundary
  if (typeof e.message === "string" && /^(Multipart: |Unexpected end of form|Malformed part header)/.test(e.message)) {
    return new AppError(400, "bad_upload", `The multipart upload is malformed: ${e.message}.`, { file: e.message });
  }
  // PostgreSQL refused a value (a backstop: request schemas should have caught it first)
  if (e.code === "22003") return new AppError(400, "out_of_range", "A number in the request is out of range for storage.");
  if (e.code === "22P05" || e.code === "22021") return new AppError(400, "bad_text", "Text in the request contains characters that cannot be stored.");
  // csrf-csrf
  if (e.code === "EBADCSRFTOKEN") return new AppError(403, "csrf_failed", "Missing or wrong X-CSRF-Token header; fetch one from GET /api/v1/csrf.");
  if (typeof e.status === "number" && e.status >= 400 && e.status < 500) return new AppError(e.status, "bad_request", e.message ?? "Bad request.");
  return undefined;
}

export function errorMiddleware(logger: Logger, exposeStack: boolean): ErrorRequestHandler {
  return (err, req, res, _next) => {
    if (!(err instanceof AppError) && isDatabaseUnavailable(err)) {
      // Not our bug and not the caller's: the database is down or restarting. One warning line, no stack.
      logger.warn({ method: req.method, url: redactUrl(req.originalUrl), reason: err instanceof Error ? err.message : String(err) }, "database unavailable");
      if (res.headersSent) return;
      res
        .status(503)
        .set("Retry-After", String(DB_RETRY_AFTER_SECONDS))
        .json({ error: { code: "database_unavailable", message: `The database cannot be reached right now; try again in ${DB_RETRY_AFTER_SECONDS} seconds.` } });
      return;
    }
    const known = err instanceof AppError ? err : fromLibraryError(err);
    const status = known?.status ?? 500;
    const body: ErrorBody = {
      error: {
        code: known?.code ?? "internal",
        message: known?.message ?? "Something went wrong on our side; it has been logged.",
      },
    };
    if (known?.fields) body.error.fields = known.fields;
    if (known?.details) body.error.details = known.details;
    if (status >= 500) {
      logger.error({ err, method: req.method, url: redactUrl(req.originalUrl) }, "request failed");
      if (exposeStack && err instanceof Error && err.stack) body.error.stack = err.stack;
    }
    if (res.headersSent) return;
    if ((known instanceof TooManyRequestsError || known instanceof ServiceUnavailableError) && known.retryAfterSeconds !== undefined) {
      res.setHeader("Retry-After", String(known.retryAfterSeconds));
    }
    res.status(status).json(body);
  };
}
