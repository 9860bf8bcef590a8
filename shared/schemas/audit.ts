import { z } from 'zod';
import { pageOf } from './page';

export const ledgerEventSchema = z.object({
  seq: z.number().int(),
  occurredAt: z.string(),
  actor: z.object({ id: z.number().int().nullable(), name: z.string().nullable(), role: z.string().nullable() }),
  action: z.string(),
  entity: z.object({ type: z.string(), id: z.string().nullable() }),
  before: z.unknown(),
  after: z.unknown(),
  reason: z.string().nullable(),
  requestId: z.string().nullable(),
  clientAddress: z.string().nullable(),
  previousHash: z.string(),
  hash: z.string(),
});
export type LedgerEvent = z.infer<typeof ledgerEventSchema>;

const isoDateTime = z.iso.datetime({ offset: true, message: 'Expected a date and time such as 2026-12-01T08:00:00Z' });

export const ledgerQuerySchema = z.object({
  actor: z.string().trim().max(200).optional(),
  action: z.string().trim().max(60).optional(),
  entityType: z.string().trim().max(60).optional(),
  entityId: z.string().trim().max(100).optional(),
  from: isoDateTime.optional(),
  to: isoDateTime.optional(),
  order: z.enum(['newest-first', 'oldest-first']).default('newest-first'),
  page: z.coerce.number().int().min(1).max(1_000_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type LedgerQuery = z.infer<typeof ledgerQuerySchema>;

export const ledgerPageSchema = pageOf(ledgerEventSchema);
export type LedgerPage = z.infer<typeof ledgerPageSchema>;

export const verificationSchema = z.object({
  ok: z.boolean(),
  events: z.number().int(),
  signatures: z.number().int(),
  /** Events signed with the ledger's key, that key's id, and the checkpoints held by the witness file. */
  signedEvents: z.number().int(),
  keyId: z.string(),
  checkpoints: z.number().int(),
  chainHead: z.object({ seq: z.number().int(), hash: z.string() }),
  firstBroken: z.object({ seq: z.number().int(), why: z.string() }).nullable(),
  signatureProblems: z.array(z.object({ id: z.number().int(), why: z.string() })),
  milliseconds: z.number(),
  summary: z.string(),
});
export type Verification = z.infer<typeof verificationSchema>;

export const ledgerActionsSchema = z.array(z.string());
