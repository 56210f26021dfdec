/** Typed errors: services throw these; the one error middleware maps them to statuses and JSON. */
export type FieldErrors = Record<string, string>;

export class AppError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields?: FieldErrors;
  readonly details?: Record<string, unknown>;
  constructor(status: number, code: string, message: string, fields?: FieldErrors, details?: Record<string, unknown>) {
    super(message);
    this.name = new.target.name;
    this.status = status;
    this.code = code;
    if (fields) this.fields = fields;
    if (details) this.details = details;
  }
}

export class ValidationError extends AppError {
  constructor(message: string, fields?: FieldErrors) {
    super(400, "validation_failed", message, fields);
  }
}

export class UnauthorizedError extends AppError {
  constructor(message = "Sign in to do this.") {
    super(401, "unauthorized", message);
  }
}

export class ForbiddenError extends AppError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(403, "forbidden", message, undefined, details);
  }
}

export class NotFoundError extends AppError {
  constructor(message: string) {
    super(404, "not_found", message);
  }
}

export class ConflictError extends AppError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(409, "conflict", message, undefined, details);
  }
}

export class PayloadTooLargeError extends AppError {
  constructor(message: string, fields?: FieldErrors) {
    super(413, "payload_too_large", message, fields);
  }
}

export class TooManyRequestsError extends AppError {
  /** Sent as the Retry-After header when set. */
  readonly retryAfterSeconds: number | undefined;
  constructor(message = "Too many requests; wait a minute and try again.", retryAfterSeconds?: number) {
    super(429, "rate_limited", message);
    this.retryAfterSeconds = retryAfterSeconds;
  }
}

export class ServiceUnavailableError extends AppError {
  /** Sent as the Retry-After header when set. */
  readonly retryAfterSeconds: number | undefined;
  constructor(message: string, retryAfterSeconds?: number) {
    super(503, "unavailable", message);
    this.retryAfterSeconds = retryAfterSeconds;
  }
}
