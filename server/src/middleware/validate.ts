import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { fieldErrorsFromZod } from '@shared/errors';
import { AppError } from '../errors';

export interface RequestSchemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

export interface ValidatedRequest {
  body?: unknown;
  query?: unknown;
  params?: unknown;
}

/**
 * Parses body, query and path parameters with the shared zod schemas. Parsed values go to
 * res.locals.valid (Express 5's req.query is read-only); failures become one 400 with every
 * field's message.
 */
export function validate(schemas: RequestSchemas): RequestHandler {
  return (req, res, next) => {
    const valid: ValidatedRequest = {};
    const fields: Record<string, string> = {};
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const result = schema.safeParse(req[part] ?? {});
      if (result.success) valid[part] = result.data;
      else Object.assign(fields, fieldErrorsFromZod(result.error, part === 'body' ? [] : [part]));
    }
    if (Object.keys(fields).length > 0) {
      next(new AppError('VALIDATION_FAILED', 'Some fields are not valid', fields));
      return;
    }
    res.locals.valid = valid;
    next();
  };
}
