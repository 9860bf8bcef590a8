import type { EntityManager } from 'typeorm';
import { addressesOfRole, queueMail } from '../mail/mail-outbox';
import { linkTo } from '../mail/links';
import { findLotWithPart } from '../manufacturing/production-lot.repository';
import { lastSubmitter } from './release.repository';

type ReleaseEvent = 'submitted' | 'reviewed' | 'released' | 'returned';

/**
 * Who hears about a release step: QA reviewers when a lot awaits review, QA approvers when it
 * awaits approval, and the engineer who submitted it when it is released or returned.
 */
export async function queueReleaseMail(
  manager: EntityManager,
  lotId: number,
  event: ReleaseEvent,
  reason: string | null = null,
): Promise<void> {
  const lot = await findLotWithPart(manager, lotId);
  if (!lot?.part) return;
  const lotNumber = lot.lotNumber;
  const part = `${lot.part.partNumber} rev ${lot.part.revision} — ${lot.part.description}`;
  const submitter = await lastSubmitter(manager, lotId);
  const link = linkTo(`/lots/${lotId}`);
  const text = (lines: string[]) =>
    [
      ...lines,
      '',
      `Open the lot: ${link}`,
      '',
      'Regulated release rests with your quality system; Ingotrace keeps the records and computes the checks.',
    ].join('\n');
  const messages: Record<ReleaseEvent, { to: () => Promise<string[]>; subject: string; body: string[] }> = {
    submitted: {
      to: () => addressesOfRole(manager, 'qa-reviewer'),
      subject: `Lot ${lotNumber} awaits your review`,
      body: [
        `Lot ${lotNumber} (${part}) was submitted for release by ${submitter?.name ?? 'an engineer'} and ` +
          `awaits a QA review.`,
      ],
    },
    reviewed: {
      to: () => addressesOfRole(manager, 'qa-approver'),
      subject: `Lot ${lotNumber} awaits your approval`,
      body: [`Lot ${lotNumber} (${part}) was reviewed and awaits approval for release.`],
    },
    released: {
      to: async () => (submitter ? [submitter.email] : []),
      subject: `Lot ${lotNumber} is released`,
      body: [
        `Lot ${lotNumber} (${part}) was approved for release. Its release packet can be downloaded from the lot page.`,
      ],
    },
    returned: {
      to: async () => (submitter ? [submitter.email] : []),
      subject: `Lot ${lotNumber} was returned to engineering`,
      body: [`Lot ${lotNumber} (${part}) was returned to engineering for correction.`, `Reason: ${reason ?? '—'}`],
    },
  };
  const message = messages[event];
  await queueMail(manager, {
    to: await message.to(),
    subject: message.subject,
    text: text(message.body),
    event: `lot.${event}`,
    entity: { type: 'lot', id: lotId },
  });
}
