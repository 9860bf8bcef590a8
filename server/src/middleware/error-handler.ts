import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ErrorResponse } from '@shared/errors';
import { AppError } from '../errors';
import { transientKind } from '../db/transient-errors';

/** Unknown API routes get the same JSON error shape as every other failure. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError('NOT_FOUND', `No route for ${req.method} ${req.path}`));
};

interface HttpishError {
  type?: string;
  status?: number;
  statusCode?: number;
  expose?: boolean;
}

/** Normalises anything thrown into an AppError; unknown errors are logged and answered as a bare 500. */
export function toAppError(error: unknown): AppError | null {
  if (error instanceof AppError) return error;
  const httpish = error as HttpishError;
  if ((error as { code?: string })?.code === 'EBADCSRFTOKEN') {
    return new AppError('FORBIDDEN', 'This request lacks a valid CSRF token; reload the page and try again');
  }
  if (httpish?.type === 'entity.parse.failed')
    return new AppError('INVALID_JSON', 'The request body is not valid JSON');
  if (httpish?.type === 'entity.too.large') return new AppError('PAYLOAD_TOO_LARGE', 'The request body is too large');
  if (httpish?.type === 'encoding.unsupported' || httpish?.type === 'charset.unsupported') {
    return new AppError('UNSUPPORTED_MEDIA_TYPE', 'The request body encoding is not supported');
  }
  if (transientKind(error) === 'unavailable') {
    return new AppError('SERVICE_UNAVAILABLE', 'The database cannot be reached just now; try again in a few seconds');
  }
  return null;
}

export const errorHandler: ErrorRequestHandler = (error, req, res, next) => {
  if (res.headersSent) {
    next(error);
    return;
  }
  const known = toAppError(error);
  const requestId = String(req.id ?? '');
  if (!known) req.log?.error({ err: error }, 'unhandled error');
  const appError =
    known ?? new AppError('INTERNAL', 'Something went wrong on the server; the request id identifies it in the log');
  const body: ErrorResponse = {
    error: {
      code: appError.code,
      message: appError.message,
      ...(appError.fields ? { fields: appError.fields } : {}),
      ...(requestId ? { requestId } : {}),
    },
  };
  res.status(appError.status).json(body);
};
