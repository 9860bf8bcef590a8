import type { SignableRecordType } from '../signatures/signable-records';
import { eventAt } from './ledger-events.repository';

/**
 * A ledger review: an auditor or QA signs that they reviewed the audit trail up to an event.
 * The signed content names that event and its hash, so a later change to the ledger shows as
 * "changed after signing" on the review.
 */
export const ledgerReviewRecordType: SignableRecordType = {
  type: 'ledger-review',
  label: 'audit-trail review',
  action: 'audit.read',
  readAction: 'audit.read',
  meanings: ['reviewed'],
  async load(manager, recordId) {
    if (!/^\d{1,18}$/.test(recordId)) return null;
    const event = await eventAt(manager, Number(recordId));
    if (!event) return null;
    return {
      title: `Audit trail reviewed through event ${event.seq}`,
      content: { reviewedThroughEvent: event.seq, eventOccurredAt: event.occurredAt, chainHash: event.hash },
      authorIds: [],
    };
  },
};
