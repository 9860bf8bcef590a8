import { z } from 'zod';

/** Every error the API returns carries one of these codes; clients branch on the code, not the text. */
export const errorCodes = [
  'INVALID_JSON',
  'VALIDATION_FAILED',
  'RULE_VIOLATION',
  'UNAUTHENTICATED',
  'FORBIDDEN',
  'NOT_FOUND',
  'CONFLICT',
  'PAYLOAD_TOO_LARGE',
  'UNSUPPORTED_MEDIA_TYPE',
  'RATE_LIMITED',
  'SERVICE_UNAVAILABLE',
  'INTERNAL',
] as const;

export type ErrorCode = (typeof errorCodes)[number];

/** Field path (dot-separated, e.g. "chemistry.O") → what is wrong with it. */
export const fieldErrorsSchema = z.record(z.string(), z.string());
export type FieldErrors = z.infer<typeof fieldErrorsSchema>;

export const errorResponseSchema = z.object({
  error: z.object({
    code: z.enum(errorCodes),
    message: z.string(),
    fields: fieldErrorsSchema.optional(),
    requestId: z.string().optional(),
  }),
});

export type ErrorResponse = z.infer<typeof errorResponseSchema>;

export function isErrorResponse(value: unknown): value is ErrorResponse {
  return errorResponseSchema.safeParse(value).success;
}

/** Collapses zod issues into one message per field path. */
export function fieldErrorsFromZod(error: z.ZodError, prefix: string[] = []): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const path = [...prefix, ...issue.path.map(String)].join('.') || '(body)';
    fields[path] = fields[path] ? `${fields[path]}; ${issue.message}` : issue.message;
  }
  return fields;
}
