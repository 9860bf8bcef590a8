import type { Request, RequestHandler, Response } from 'express';
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

/** The parsed input a validated handler receives: each part the schemas name, as the schema outputs it. */
export type ParsedRequest<S extends RequestSchemas> = {
  [Part in keyof S]: S[Part] extends z.ZodType ? z.output<S[Part]> : never;
};

/**
 * validate() and the handler in one: the handler is given the parsed body, query and path
 * parameters, typed from the schemas, and never reads the raw request's. Spread into the route:
 * `router.post(path, requireAction(…), ...validated({ body: schema }, async (input, req, res) => …))`.
 */
export function validated<S extends RequestSchemas>(
  schemas: S,
  handler: (input: ParsedRequest<S>, req: Request, res: Response) => unknown,
): RequestHandler[] {
  return [validate(schemas), (req, res) => handler(res.locals.valid as ParsedRequest<S>, req, res)];
}
