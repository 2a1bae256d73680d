/**
 * The one error type the app throws on purpose. Each code maps to an HTTP status and a message a
 * person can act on; anything else is logged and answered with a generic 500.
 */
export type AppErrorCode = "bad_request" | "unauthorized" | "forbidden" | "not_found" | "conflict" | "payload_too_large" | "unsupported_media_type" | "too_many_requests" | "unavailable";

const statusByCode: Record<AppErrorCode, number> = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  too_many_requests: 429,
  unavailable: 503,
};

export class AppError extends Error {
  readonly code: AppErrorCode;
  readonly status: number;
  /** Per-field messages for forms (field path → message). */
  readonly fieldErrors?: Record<string, string>;
  /** For 429 and 503: when trying again makes sense (sent as Retry-After). */
  readonly retryAfterSeconds?: number;

  constructor(code: AppErrorCode, message: string, options?: { fieldErrors?: Record<string, string>; cause?: unknown; retryAfterSeconds?: number }) {
    super(message, { cause: options?.cause });
    this.name = "AppError";
    this.code = code;
    this.status = statusByCode[code];
    this.fieldErrors = options?.fieldErrors;
    this.retryAfterSeconds = options?.retryAfterSeconds;
  }
}

export const notFound = (what: string) => new AppError("not_found", `${what} was not found.`);
