import { z } from 'zod';
import { pageOf } from './page';
import { roleSchema } from '../auth/roles';
import { actions } from '../auth/permissions';

export const personSchema = z.object({
  id: z.number().int(),
  subject: z.string(),
  name: z.string(),
  email: z.string(),
  active: z.boolean(),
  roles: z.array(roleSchema),
  identityProviderRoles: z.array(roleSchema),
  lastSignInAt: z.string().nullable(),
});
export type Person = z.infer<typeof personSchema>;

export const meSchema = z.object({
  person: z.object({ id: z.number().int(), name: z.string(), email: z.string(), roles: z.array(roleSchema) }),
  actions: z.array(z.enum(actions)),
  csrfToken: z.string(),
  session: z.object({ idleMinutes: z.number(), absoluteExpiresAt: z.string() }),
});
export type Me = z.infer<typeof meSchema>;

export const peopleQuerySchema = z.object({
  search: z.string().trim().max(100).optional(),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
  status: z.enum(['active', 'deactivated', 'all']).default('all'),
});
export type PeopleQuery = z.infer<typeof peopleQuerySchema>;

export const peoplePageSchema = pageOf(personSchema);
export type PeoplePage = z.infer<typeof peoplePageSchema>;

export const reasonSchema = z
  .string()
  .trim()
  .min(3, 'Give a reason of at least 3 characters')
  .max(1000, 'Keep the reason under 1000 characters');

export const roleChangeSchema = z.object({
  roles: z.array(roleSchema).max(6),
  reason: reasonSchema,
});
export type RoleChange = z.infer<typeof roleChangeSchema>;

export const roleChangeRequestSchema = z.object({
  id: z.number().int(),
  personId: z.number().int(),
  personName: z.string(),
  rolesBefore: z.array(roleSchema),
  rolesAfter: z.array(roleSchema),
  reason: z.string(),
  requestedBy: z.string(),
  requestedById: z.number().int(),
  requestedAt: z.string(),
});
export type RoleChangeRequest = z.infer<typeof roleChangeRequestSchema>;

/** A role change either takes effect at once or, when it touches a signing role, waits for a second administrator. */
export const roleChangeOutcomeSchema = z.object({
  applied: z.boolean(),
  person: personSchema,
  pending: roleChangeRequestSchema.nullable(),
});
export type RoleChangeOutcome = z.infer<typeof roleChangeOutcomeSchema>;

export const peopleSettingsSchema = z.object({
  administratorsMayApprove: z.boolean(),
  pendingRoleChanges: z.array(roleChangeRequestSchema),
});
export type PeopleSettings = z.infer<typeof peopleSettingsSchema>;

export const activationChangeSchema = z.object({
  active: z.boolean(),
  reason: reasonSchema,
});
export type ActivationChange = z.infer<typeof activationChangeSchema>;

export const personIdParamsSchema = z.object({ personId: z.coerce.number().int().positive() });
