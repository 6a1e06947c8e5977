import type { z } from "zod";

/** Error codes of the API contract (shared/API.md) with their HTTP status. */
const ERROR_STATUS = {
  validation_failed: 400,
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  method_not_allowed: 405,
  conflict: 409,
  too_large: 413,
  unprocessable: 422,
  unsupported_type: 415,
  rate_limited: 429,
  internal: 500,
  unavailable: 503,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

const DEFAULT_MESSAGES: Record<ErrorCode, string> = {
  validation_failed: "Some values are not valid.",
  bad_request: "The request could not be understood.",
  unauthorized: "Please sign in.",
  forbidden: "Your role does not allow this.",
  not_found: "Not found.",
  method_not_allowed: "This method is not allowed here.",
  conflict: "This conflicts with a newer change.",
  too_large: "That is too large.",
  unprocessable: "The request is valid but cannot be carried out.",
  unsupported_type: "That file type is not supported.",
  rate_limited: "Too many attempts. Please wait a few minutes and try again.",
  internal: "Something went wrong on our side. Nothing was changed.",
  unavailable: "The server is busy. Please try again shortly.",
};

export type ErrorBody = { error: { code: ErrorCode; message: string; fields?: Record<string, string> } };

/**
 * The one error type that crosses layers. `message` is safe to show to people;
 * `cause` is logged on the server and never sent.
 */
export class AppError extends Error {
  readonly code: ErrorCode;
  readonly fields?: Record<string, string>;
  readonly details?: Record<string, unknown>;
  /** For rate_limited: seconds until a retry may succeed (the Retry-After header). */
  readonly retryAfterSeconds?: number;

  constructor(
    code: ErrorCode,
    message?: string,
    options?: { fields?: Record<string, string>; cause?: unknown; details?: Record<string, unknown>; retryAfterSeconds?: number },
  ) {
    super(message ?? DEFAULT_MESSAGES[code], { cause: options?.cause });
    this.name = "AppError";
    this.code = code;
    this.fields = options?.fields;
    this.details = options?.details;
    this.retryAfterSeconds = options?.retryAfterSeconds;
  }

  get status(): number {
    return ERROR_STATUS[this.code];
  }

  toBody(): ErrorBody {
    return {
      error: { code: this.code, message: this.message, ...(this.fields ? { fields: this.fields } : {}), ...(this.details ?? {}) },
    };
  }
}

/** Flattens zod issues to `{ "steps.2.m": "…" }`, the `fields` of the error shape. */
export function zodFields(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "_";
    fields[key] ??= issue.message;
  }
  return fields;
}

export function validationError(error: z.ZodError, message?: string): AppError {
  const fields = zodFields(error);
  const first = Object.entries(fields)[0];
  return new AppError("validation_failed", message ?? (first ? `${first[0]}: ${first[1]}` : undefined), { fields });
}

export function isAppError(value: unknown): value is AppError {
  return value instanceof AppError;
}
