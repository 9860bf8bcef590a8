import { z } from 'zod';
import { signatureMeanings } from '../domain/signatures';

export const meaningSchema = z.enum(signatureMeanings);

export const signatureIntentSchema = z.object({
  recordType: z.string().min(1).max(60),
  recordId: z.string().min(1).max(100),
  meaning: meaningSchema,
});
export type SignatureIntent = z.infer<typeof signatureIntentSchema>;

/** What the signer is shown before signing, and what their re-authentication is bound to. */
export const signaturePreparationSchema = z.object({
  recordType: z.string(),
  recordId: z.string(),
  title: z.string(),
  meaning: meaningSchema,
  content: z.unknown(),
  contentHash: z.string(),
  bindingHash: z.string(),
  statement: z.string(),
  reasonRequired: z.boolean(),
  /** The signature also covers the record's audit trail through this ledger event (else null). */
  trailThroughSeq: z.number().int().nullable(),
  /** How many events of the audit trail that is. */
  trailEvents: z.number().int().nullable(),
});
export type SignaturePreparation = z.infer<typeof signaturePreparationSchema>;

export const signatureRequestSchema = signatureIntentSchema.extend({
  contentHash: z.string().regex(/^[0-9a-f]{64}$/, 'Expected the content hash shown when signing started'),
  reauthenticationId: z.string().regex(/^[0-9a-f]{32}$/, 'Re-authenticate before signing'),
  reason: z.string().trim().max(1000).optional(),
  withdrawsSignatureId: z.number().int().positive().optional(),
  /** The trailThroughSeq of the preparation, when it had one. */
  trailThroughSeq: z.number().int().nonnegative().optional(),
});
export type SignatureRequest = z.infer<typeof signatureRequestSchema>;

export const signatureSchema = z.object({
  id: z.number().int(),
  recordType: z.string(),
  recordId: z.string(),
  meaning: meaningSchema,
  reason: z.string().nullable(),
  signerId: z.number().int(),
  signerName: z.string(),
  signerRole: z.string(),
  signedAt: z.string(),
  manifestation: z.string(),
  contentHash: z.string(),
  withdrawsSignatureId: z.number().int().nullable(),
  /** The record's current content no longer matches what was signed. */
  changedAfterSigning: z.boolean(),
});
export type Signature = z.infer<typeof signatureSchema>;

/** One record's signatures, or (without recordId) the newest 50 of a record type. */
export const signatureListQuerySchema = z.object({
  recordType: z.string().min(1).max(60),
  recordId: z.string().min(1).max(100).optional(),
});
