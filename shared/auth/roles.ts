import { z } from 'zod';

/** The roles people hold in Ingotrace; what each may do is in permissions.ts. */
export const roles = [
  'manufacturing-engineer',
  'qa-reviewer',
  'qa-approver',
  'auditor',
  'recall-coordinator',
  'administrator',
] as const;

export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

export const roleLabels: Record<Role, string> = {
  'manufacturing-engineer': 'Manufacturing engineer',
  'qa-reviewer': 'QA reviewer',
  'qa-approver': 'QA approver',
  auditor: 'Auditor',
  'recall-coordinator': 'Recall coordinator',
  administrator: 'Administrator',
};
