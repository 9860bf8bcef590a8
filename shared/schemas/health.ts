import { z } from 'zod';

export const healthSchema = z.object({
  status: z.literal('ok'),
  version: z.string(),
  database: z.object({ server: z.string(), migrationsPending: z.literal(0) }),
});

export type Health = z.infer<typeof healthSchema>;
