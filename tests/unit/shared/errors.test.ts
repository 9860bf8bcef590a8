import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { fieldErrorsFromZod, isErrorResponse } from '@shared/errors';

describe('fieldErrorsFromZod', () => {
  it('when several issues hit one field, then their messages are joined under its dotted path', () => {
    const schema = z.object({
      bar: z.object({ lengthMm: z.string().min(2, 'too short').regex(/^\d+$/, 'digits only') }),
    });
    const result = schema.safeParse({ bar: { lengthMm: 'x' } });
    expect(result.success).toBe(false);
    if (!result.success) expect(fieldErrorsFromZod(result.error)).toEqual({ 'bar.lengthMm': 'too short; digits only' });
  });

  it('when the error concerns the whole body, then it is filed under (body)', () => {
    const result = z.object({}).strict().safeParse('text');
    if (!result.success) expect(Object.keys(fieldErrorsFromZod(result.error))).toEqual(['(body)']);
  });
});

describe('isErrorResponse', () => {
  it('when given the error shape, then true; when given anything else, then false', () => {
    expect(isErrorResponse({ error: { code: 'NOT_FOUND', message: 'x' } })).toBe(true);
    expect(isErrorResponse({ error: { code: 'NOPE', message: 'x' } })).toBe(false);
    expect(isErrorResponse({ status: 'ok' })).toBe(false);
  });
});
