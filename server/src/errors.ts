import type { ErrorCode, FieldErrors } from '@shared/errors';

const statusByCode: Record<ErrorCode, number> = {
  INVALID_JSON: 400,
  VALIDATION_FAILED: 400,
  RULE_VIOLATION: 422,
  UNAUTHENTICATED: 401,
  FORBIDDEN: 403,
  NOT_FOUND: 404,
  CONFLICT: 409,
  PAYLOAD_TOO_LARGE: 413,
  UNSUPPORTED_MEDIA_TYPE: 415,
  RATE_LIMITED: 429,
  SERVICE_UNAVAILABLE: 503,
  INTERNAL: 500,
};

/** The one error type services throw; the error middleware turns it into the JSON error shape. */
export class AppError extends Error {
  readonly status: number;

  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: FieldErrors,
  ) {
    super(message);
    this.name = 'AppError';
    this.status = statusByCode[code];
  }

  static notFound(what: string): AppError {
    return new AppError('NOT_FOUND', `${what} not found`);
  }

  static rule(message: string, fields?: FieldErrors): AppError {
    return new AppError('RULE_VIOLATION', message, fields);
  }
}
