import { z } from 'zod';
import { effectivenessLevels, type Effectiveness } from '../domain/recall/effectiveness';
import { templateProblems } from '../domain/recall/notice-template';

const capitalised = (label: string) => label.charAt(0).toUpperCase() + label.slice(1);
const count = (label: string) =>
  z.coerce
    .number({ error: `Give ${label} as a whole number` })
    .int(`Give ${label} as a whole number`)
    .min(0, `${capitalised(label)} cannot be negative`)
    .max(1_000_000, `${capitalised(label)} is too large`);

/** The strategy a coordinator sets for a recall's field action (or for a drill that exercises notices). */
export const fieldActionInputSchema = z
  .object({
    level: z.enum(effectivenessLevels, { error: 'Choose the effectiveness check level the recall strategy names' }),
    levelBPercent: z.coerce
      .number({ error: 'Give the share as a whole per cent' })
      .int('Give the share as a whole per cent')
      .nullable()
      .default(null),
    actionAsked: z
      .string()
      .trim()
      .min(10, 'Say in a sentence what each consignee is asked to do')
      .max(1000, 'Keep the action asked to 1,000 characters'),
    template: z
      .string()
      .trim()
      .min(20, 'The notice text is too short to be a notice')
      .max(20_000, 'Keep the notice text to 20,000 characters'),
    reminderEveryDays: z.coerce
      .number({ error: 'Give the days between reminders' })
      .int('Give whole days')
      .min(1, 'Remind at most once a day')
      .max(30, 'Remind at least every 30 days'),
    escalateAfterReminders: z.coerce
      .number({ error: 'Give the number of reminders before escalation' })
      .int('Give a whole number of reminders')
      .min(1, 'Escalate after at least one reminder')
      .max(10, 'Escalate after at most 10 reminders'),
  })
  .superRefine((input, context) => {
    if (
      input.level === 'B' &&
      (input.levelBPercent === null || input.levelBPercent <= 10 || input.levelBPercent >= 100)
    )
      context.addIssue({
        code: 'custom',
        path: ['levelBPercent'],
        message: 'Level B needs a share above 10 % and below 100 %',
      });
    if (input.level !== 'B' && input.levelBPercent !== null)
      context.addIssue({ code: 'custom', path: ['levelBPercent'], message: 'Only level B takes a share of its own' });
    for (const problem of templateProblems(input.template))
      context.addIssue({ code: 'custom', path: ['template'], message: problem });
  });
export type FieldActionInput = z.input<typeof fieldActionInputSchema>;

export const lotAnswerSchema = z.object({
  lotId: z.coerce.number().int().positive().max(4_294_967_295),
  onHand: count('units on hand'),
  returned: count('units returned'),
  destroyed: count('units destroyed'),
  used: count('units already used'),
});

/** What a consignee sends through its reply link. */
export const noticeReplyInputSchema = z.object({
  contactName: z
    .string()
    .trim()
    .min(2, 'Give the name of the person answering')
    .max(200, 'Keep the name to 200 characters'),
  lots: z.array(lotAnswerSchema).min(1, 'Answer for every lot in your notice').max(500),
});
export type NoticeReplyInput = z.input<typeof noticeReplyInputSchema>;

export const replyTokenParamsSchema = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'Not a reply link'),
});

export const fieldActionReportQuerySchema = z.object({
  format: z.enum(['csv', 'pdf'], { error: 'Ask for csv or pdf' }),
});

export const returnedGoodsInputSchema = z.object({
  consigneeId: z.coerce.number({ error: 'Choose the consignee' }).int().positive('Choose the consignee'),
  lotId: z.coerce.number({ error: 'Choose the lot' }).int().positive('Choose the lot'),
  units: z.coerce
    .number({ error: 'Give the units received' })
    .int('Give whole units')
    .min(1, 'Receive at least one unit')
    .max(1_000_000, 'Too many units'),
  note: z.string().trim().max(500, 'Keep the note to 500 characters').optional(),
});
export type ReturnedGoodsInput = z.input<typeof returnedGoodsInputSchema>;

const noticeLotSchema = z.object({
  lotId: z.number(),
  lotNumber: z.string(),
  part: z.string(),
  gtin: z.string(),
  shipped: z.number(),
  udi: z.string(),
});
export type NoticeLotView = z.infer<typeof noticeLotSchema>;

/** A notice exactly as the consignee gets it (stored once prepared; its hash is what issuing signs). */
export const noticeContentSchema = z.object({
  recallNumber: z.string(),
  drill: z.boolean(),
  consignee: z.object({ id: z.number(), name: z.string(), country: z.string() }),
  recipient: z.string().nullable(),
  subject: z.string(),
  text: z.string(),
  lots: z.array(noticeLotSchema),
});
export type NoticeContent = z.infer<typeof noticeContentSchema>;

export const fieldActionStrategySchema = z.object({
  level: z.enum(effectivenessLevels),
  levelBPercent: z.number().nullable(),
  actionAsked: z.string(),
  template: z.string(),
  reminderEveryDays: z.number(),
  escalateAfterReminders: z.number(),
  setBy: z.string(),
  setAt: z.string(),
});

export const noticeSummarySchema = z.object({
  id: z.number(),
  consigneeId: z.number(),
  consignee: z.string(),
  recipient: z.string().nullable(),
  lots: z.array(noticeLotSchema),
  preparedAt: z.string(),
  issuedAt: z.string().nullable(),
  replies: z.number(),
  lastReplyAt: z.string().nullable(),
  lastContact: z.string().nullable(),
  remindersSent: z.number(),
  lastReminderAt: z.string().nullable(),
  escalatedAt: z.string().nullable(),
});
export type NoticeSummary = z.infer<typeof noticeSummarySchema>;

const balanceLineSchema = z.object({
  consigneeId: z.number(),
  consignee: z.string(),
  lotId: z.number(),
  lotNumber: z.string(),
  shipped: z.number(),
  onHand: z.number(),
  returned: z.number(),
  destroyed: z.number(),
  used: z.number(),
  accounted: z.number(),
  unaccounted: z.number(),
  received: z.number(),
  answered: z.boolean(),
});

export const effectivenessSchema = z.object({
  level: z.enum(effectivenessLevels),
  percent: z.number(),
  consignees: z.number(),
  notified: z.number(),
  replied: z.number(),
  needed: z.number(),
  met: z.boolean(),
  shortfalls: z.array(z.string()),
  unitsShipped: z.number(),
  unitsAccounted: z.number(),
  lines: z.array(balanceLineSchema),
  differences: z.array(balanceLineSchema.extend({ problem: z.string() })),
  series: z.array(z.object({ at: z.string(), accounted: z.number() })),
}) satisfies z.ZodType<Effectiveness>;
export type EffectivenessView = z.infer<typeof effectivenessSchema>;

export const returnedGoodsViewSchema = z.object({
  id: z.number(),
  consignee: z.string(),
  consigneeId: z.number(),
  lotId: z.number(),
  lotNumber: z.string(),
  units: z.number(),
  note: z.string().nullable(),
  receivedBy: z.string(),
  receivedAt: z.string(),
});

/** Everything the notices screen shows for one recall. */
export const fieldActionViewSchema = z.object({
  recallId: z.number(),
  recallNumber: z.string(),
  mode: z.enum(['recall', 'drill']),
  status: z.enum(['open', 'closed']),
  strategy: fieldActionStrategySchema.nullable(),
  notices: z.array(noticeSummarySchema),
  /** Consignees in the latest traced scope that have no notice yet. */
  notPrepared: z.array(z.object({ id: z.number(), name: z.string() })),
  /** Notices prepared and not yet issued (issuing signs these). */
  waitingToIssue: z.number(),
  effectiveness: effectivenessSchema.nullable(),
  returnedGoods: z.array(returnedGoodsViewSchema),
});
export type FieldActionView = z.infer<typeof fieldActionViewSchema>;

export const noticePreviewSchema = z.object({
  id: z.number(),
  sha256: z.string(),
  issuedAt: z.string().nullable(),
  content: noticeContentSchema,
});
export type NoticePreview = z.infer<typeof noticePreviewSchema>;

/** What a consignee's reply page shows: its own notice's lots and its last answer, nothing else. */
export const replyPageSchema = z.object({
  recallNumber: z.string(),
  firm: z.string(),
  /** The plant's time zone, in which the page states times. */
  timeZone: z.string(),
  consignee: z.string(),
  drill: z.boolean(),
  actionAsked: z.string(),
  lots: z.array(noticeLotSchema),
  lastReply: z.object({ contactName: z.string(), repliedAt: z.string(), lots: z.array(lotAnswerSchema) }).nullable(),
});
export type ReplyPage = z.infer<typeof replyPageSchema>;
