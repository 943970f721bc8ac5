/** Failures that Gatewell reports to people, each with the HTTP status it maps to. */
export const ERROR_STATUS = {
  invalid: 422,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  locked: 423,
  rate_limited: 429,
  too_large: 413,
  unavailable: 503,
  storage_full: 507,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

/** An error whose message is safe to show; anything else is logged and shown as a generic failure. */
export class AppError extends Error {
  readonly code: ErrorCode;
  readonly details: unknown;

  constructor(code: ErrorCode, message: string, details?: unknown) {
    super(message);
    this.name = 'AppError';
    this.code = code;
    this.details = details;
  }

  get status(): number {
    return ERROR_STATUS[this.code];
  }
}

export function isAppError(error: unknown): error is AppError {
  return error instanceof AppError;
}
