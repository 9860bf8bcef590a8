import { z } from 'zod';

export const reauthenticationStartSchema = z.object({
  purpose: z.string().trim().min(3).max(300),
  /** SHA-256 (hex) of exactly what the person is about to sign. */
  bindingHash: z.string().regex(/^[0-9a-f]{64}$/, 'Expected a SHA-256 hash in lower-case hex'),
  /** Where the browser returns afterwards: a path inside Ingotrace. */
  returnTo: z
    .string()
    .max(500)
    .regex(/^\/(?!\/)[^\s\\]*$/, 'Expected a path inside Ingotrace')
    .default('/reauthentication-complete'),
});
export type ReauthenticationStart = z.infer<typeof reauthenticationStartSchema>;

export const reauthenticationStatusSchema = z.object({
  id: z.string(),
  status: z.enum(['pending', 'confirmed', 'refused', 'used', 'expired']),
  reason: z.string().nullable(),
  url: z.string(),
});
export type ReauthenticationStatus = z.infer<typeof reauthenticationStatusSchema>;

export const reauthenticationIdSchema = z.object({
  reauthenticationId: z.string().regex(/^[0-9a-f]{32}$/, 'Unknown re-authentication'),
});
