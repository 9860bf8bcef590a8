import { z } from 'zod';
import { pageOf } from './page';
import type { Readiness } from '../domain/release/readiness';
import { lotStatuses } from './manufacturing';

export const labelMovementSchema = z
  .object({
    kind: z.enum(['print', 'void']),
    qty: z
      .number({ error: 'A whole number of labels' })
      .int('A whole number of labels')
      .min(1, 'At least one label')
      .max(100_000),
    reason: z.string().trim().max(500).optional(),
  })
  .superRefine((movement, context) => {
    if (movement.kind === 'void' && (!movement.reason || movement.reason.length < 3))
      context.addIssue({ code: 'custom', message: 'Say why the labels are voided', path: ['reason'] });
  });
export type LabelMovement = z.input<typeof labelMovementSchema>;

export const releaseQueues = ['review', 'approval', 'released', 'returned'] as const;
export const releaseQueueQuerySchema = z.object({
  queue: z.enum(releaseQueues),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});
export type ReleaseQueueQuery = z.infer<typeof releaseQueueQuerySchema>;

export const releaseQueueItemSchema = z.object({
  lotId: z.number(),
  lotNumber: z.string(),
  part: z.string(),
  releasedQty: z.number(),
  submittedAt: z.string().nullable(),
  submittedBy: z.string().nullable(),
  /** The latest "reviewed" signature on the lot's release: who reviewed it, and when. */
  reviewedBy: z.string().nullable(),
  reviewedAt: z.string().nullable(),
});
export type ReleaseQueueItem = z.infer<typeof releaseQueueItemSchema>;
export const releaseQueuePageSchema = pageOf(releaseQueueItemSchema).extend({
  /** How many lots wait in each queue, for the tabs. */
  counts: z.object({ review: z.number(), approval: z.number(), returned: z.number(), released: z.number() }),
});
export type ReleaseQueuePage = z.infer<typeof releaseQueuePageSchema>;

export const labelSheetQuerySchema = z.object({
  count: z.coerce.number().int().min(1, 'At least one label').max(2_000, 'At most 2,000 labels at once'),
  widthMm: z.coerce.number().min(30, 'At least 30 mm wide').max(210).default(100),
  heightMm: z.coerce.number().min(20, 'At least 20 mm high').max(297).default(50),
});
export type LabelSheetQuery = z.infer<typeof labelSheetQuerySchema>;

/** A ledger event on a lot (or a lot its units came through), as the release review shows it. */
export const trailEventSchema = z.object({
  seq: z.number(),
  occurredAt: z.string(),
  actor: z.string(),
  action: z.string(),
  lot: z.string(),
  reason: z.string().nullable(),
});
export type TrailEvent = z.infer<typeof trailEventSchema>;

/** A lot's audit trail since it was opened, and how far the latest release review covered it. */
export const auditTrailSchema = z.object({
  events: z.array(trailEventSchema),
  /** The last event the latest review covered, or null before any review. */
  reviewedThroughSeq: z.number().nullable(),
  /** Events after that review (which void it). */
  afterReview: z.array(trailEventSchema),
});
export type AuditTrail = z.infer<typeof auditTrailSchema>;

const readinessSchema = z.object({
  ready: z.boolean(),
  items: z.array(
    z.object({
      key: z.enum([
        'heats',
        'routing',
        'runs',
        'inspections',
        'units',
        'material',
        'held-material',
        'nonconformances',
        'holds',
        'labels',
      ]),
      title: z.string(),
      verdict: z.enum(['pass', 'fail']),
      why: z.string(),
      link: z.string().nullable(),
    }),
  ),
}) satisfies z.ZodType<Readiness>;

/** A lot's readiness checklist, its release content (what the signatures cover) and where it stands. */
export const releaseViewSchema = z.object({
  lotId: z.number(),
  lotNumber: z.string(),
  status: z.enum(lotStatuses),
  readiness: readinessSchema,
  dossier: z.record(z.string(), z.unknown()),
  dossierHash: z.string(),
  submissions: z.array(
    z.object({
      id: z.number(),
      submittedAt: z.string(),
      submittedBy: z.string(),
      outcome: z.enum(['pending', 'released', 'returned']),
      changedSinceSubmission: z.boolean(),
    }),
  ),
  reviewedCurrent: z.boolean(),
  auditTrail: auditTrailSchema,
});
export type ReleaseView = z.infer<typeof releaseViewSchema>;

export const releaseSubmittedSchema = z.object({
  lotId: z.number(),
  status: z.literal('submitted'),
  dossierHash: z.string(),
});
export const labelsCountedSchema = z.object({ netLabels: z.number() });
