import { z } from 'zod';
import { errorResponseSchema, type ErrorCode, type FieldErrors } from '@shared/errors';

/** An API failure with the server's error code and field messages. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode | 'NETWORK' | 'BAD_RESPONSE',
    message: string,
    readonly fields: FieldErrors = {},
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

export function isApiError(value: unknown): value is ApiError {
  return value instanceof ApiError;
}

let csrfToken: string | null = null;

/** The session's CSRF token (from /api/me), sent with every state-changing request. */
export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  /** A plain-text body (a list, one value a line) instead of JSON. */
  text?: string;
  signal?: AbortSignal;
  /** Defaults to /api. */
  base?: string;
}

/** Sends one file as multipart form data (field name given), parses the reply with the shared schema. */
export async function apiUpload<T>(path: string, field: string, file: File, schema: z.ZodType<T>): Promise<T> {
  const body = new FormData();
  body.append(field, file);
  let response: Response;
  try {
    response = await fetch(`/api${path}`, {
      method: 'POST',
      body,
      headers: csrfToken ? { 'X-CSRF-Token': csrfToken, Accept: 'application/json' } : {},
      credentials: 'same-origin',
    });
  } catch (error) {
    throw new ApiError(
      0,
      'NETWORK',
      `The server could not be reached (${error instanceof Error ? error.message : 'network error'})`,
    );
  }
  return readResponse(response, schema);
}

/**
 * Asks for a file with a state-changing request (POST with the CSRF token: the export is recorded
 * in the audit trail) and hands it to the browser as a download under the server's file name.
 */
export async function apiDownload(path: string, fallbackName: string): Promise<void> {
  let response: Response;
  try {
    response = await fetch(`/api${path}`, {
      method: 'POST',
      headers: csrfToken ? { 'X-CSRF-Token': csrfToken } : {},
      credentials: 'same-origin',
    });
  } catch (error) {
    throw new ApiError(
      0,
      'NETWORK',
      `The server could not be reached (${error instanceof Error ? error.message : 'network error'})`,
    );
  }
  if (!response.ok) await readResponse(response, errorResponseSchema);
  const name = /filename="?([^";]+)"?/.exec(response.headers.get('Content-Disposition') ?? '')?.[1] ?? fallbackName;
  const url = URL.createObjectURL(await response.blob());
  const link = Object.assign(document.createElement('a'), { href: url, download: name });
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

async function readResponse<T>(response: Response, schema: z.ZodType<T>): Promise<T> {
  const payload: unknown = response.status === 204 ? undefined : await response.json().catch(() => undefined);
  if (!response.ok) {
    const parsed = errorResponseSchema.safeParse(payload);
    if (parsed.success) {
      const { code, message, fields } = parsed.data.error;
      throw new ApiError(response.status, code, message, fields);
    }
    throw new ApiError(
      response.status,
      'BAD_RESPONSE',
      `The server answered ${response.status} without an explanation`,
    );
  }
  const result = schema.safeParse(payload);
  if (!result.success)
    throw new ApiError(response.status, 'BAD_RESPONSE', 'The server sent data this screen does not understand');
  return result.data;
}

/** The client's only way to the server: sends JSON, parses the reply with the shared schema. */
export async function apiRequest<T>(path: string, schema: z.ZodType<T>, options: RequestOptions = {}): Promise<T> {
  const method = options.method ?? 'GET';
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  if (options.text !== undefined) headers['Content-Type'] = 'text/plain; charset=utf-8';
  if (method !== 'GET' && csrfToken) headers['X-CSRF-Token'] = csrfToken;
  let response: Response;
  try {
    response = await fetch(`${options.base ?? '/api'}${path}`, {
      method,
      headers,
      body: options.text ?? (options.body !== undefined ? JSON.stringify(options.body) : undefined),
      credentials: 'same-origin',
      signal: options.signal,
    });
  } catch (error) {
    throw new ApiError(
      0,
      'NETWORK',
      `The server could not be reached (${error instanceof Error ? error.message : 'network error'})`,
    );
  }
  return readResponse(response, schema);
}
