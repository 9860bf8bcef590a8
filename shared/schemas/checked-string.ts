import { z } from 'zod';

/**
 * A string schema whose value must pass a domain check: `problemOf` returns what is wrong with
 * the value in words, or null. The words become the field's error message.
 */
export function checkedString(schema: z.ZodString, problemOf: (value: string) => string | null) {
  return schema.superRefine((value, context) => {
    const problem = problemOf(value);
    if (problem) context.addIssue({ code: 'custom', message: problem });
  });
}
