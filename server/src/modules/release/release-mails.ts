import type { EntityManager } from 'typeorm';
import { addressesOfRole, queueMail } from '../mail/mail-outbox';
import { linkTo } from '../mail/links';

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
  const [lot]: Array<{ lot_number: string; part: string }> = await manager.query(
    "SELECT l.lot_number, CONCAT(p.part_number, ' rev ', p.revision, ' — ', p.description) AS part FROM production_lot l JOIN part p ON p.id = l.part_id WHERE l.id = ?",
    [lotId],
  );
  if (!lot) return;
  const [submitter]: Array<{ email: string; name: string }> = await manager.query(
    'SELECT p.email, p.name FROM release_submission r JOIN person p ON p.id = r.submitted_by WHERE r.lot_id = ? ORDER BY r.id DESC LIMIT 1',
    [lotId],
  );
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
      subject: `Lot ${lot.lot_number} awaits your review`,
      body: [
        `Lot ${lot.lot_number} (${lot.part}) was submitted for release by ${submitter?.name ?? 'an engineer'} and awaits a QA review.`,
      ],
    },
    reviewed: {
      to: () => addressesOfRole(manager, 'qa-approver'),
      subject: `Lot ${lot.lot_number} awaits your approval`,
      body: [`Lot ${lot.lot_number} (${lot.part}) was reviewed and awaits approval for release.`],
    },
    released: {
      to: async () => (submitter ? [submitter.email] : []),
      subject: `Lot ${lot.lot_number} is released`,
      body: [
        `Lot ${lot.lot_number} (${lot.part}) was approved for release. Its release packet can be downloaded from the lot page.`,
      ],
    },
    returned: {
      to: async () => (submitter ? [submitter.email] : []),
      subject: `Lot ${lot.lot_number} was returned to engineering`,
      body: [
        `Lot ${lot.lot_number} (${lot.part}) was returned to engineering for correction.`,
        `Reason: ${reason ?? '—'}`,
      ],
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
