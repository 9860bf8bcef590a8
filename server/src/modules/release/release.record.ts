import type { SignatureMeaning } from '@shared/domain/signatures';
import { contentHash } from '@shared/domain/signatures';
import { checkpointLedger, checkpointTriggers } from '../ledger/ledger-checkpoints';
import { loadConfig } from '../../config/env';
import type { SignableRecordType } from '../signatures/signable-records';
import { signaturesFor } from '../signatures/signatures.repository';
import { appendLedgerEvent, sha256Hex } from '../ledger/ledger.repository';
import { lotAuditTrail } from './audit-trail';
import { releaseDossierIn } from './release-dossier';
import { queueReleaseMail } from './release-mails';
import { changeLotStatus, findLot } from '../manufacturing/production-lot.repository';
import { closePendingSubmission } from './release.repository';

const actions = {
  reviewed: 'release.review',
  'approved-for-release': 'release.approve',
  'returned-to-engineering': 'release.reject',
} as const;

/**
 * A lot's release: the QA reviewer signs "reviewed", then a different QA approver signs
 * "approved for release", each over the release content; either may sign "returned to engineering" with a
 * reason, which returns the lot to the engineer. Approval needs the reviewer's signature to
 * cover the release content as it is now.
 */
export const lotReleaseRecordType: SignableRecordType<{
  status: string;
  ready: boolean;
  reviewedCurrent: boolean;
  trailAfterReview: string[];
  /** How far the lot's audit trail went when the record was loaded, and how many events that is. */
  trail: { throughSeq: number; events: number };
  /** Good units the release would release. */
  onHand: number;
}> = {
  type: 'lot-release',
  label: 'lot release',
  action: 'release.review',
  readAction: 'release.read',
  actionFor: (meaning: SignatureMeaning) => actions[meaning as keyof typeof actions] ?? 'release.approve',
  meanings: ['reviewed', 'approved-for-release', 'returned-to-engineering'],
  // Every release is witnessed outside the database: the audit ledger is checkpointed once it commits.
  async afterCommit(dataSource, { meaning }) {
    if (meaning === 'approved-for-release' && checkpointTriggers.onRelease)
      await checkpointLedger(dataSource, loadConfig(), 'release');
  },
  async load(manager, recordId) {
    if (!/^\d{1,10}$/.test(recordId)) return null;
    const lot = await findLot(manager, Number(recordId));
    if (!lot) return null;
    const dossier = await releaseDossierIn(manager, lot.id);
    const hash = contentHash(dossier.content, sha256Hex);
    const reviews = (await signaturesFor(manager, 'lot-release', recordId)).filter((row) => row.meaning === 'reviewed');
    const trail = await lotAuditTrail(manager, lot.id, dossier.lineage);
    return {
      title: `Release of lot ${lot.lotNumber}`,
      content: dossier.content,
      authorIds: dossier.authorIds,
      status: lot.status,
      ready: dossier.readiness.ready,
      reviewedCurrent: reviews.some((row) => row.content_hash === hash),
      trailAfterReview: trail.afterReview.map((event) => `#${event.seq} ${event.action} by ${event.actor}`),
      trail: { throughSeq: trail.events.at(-1)?.seq ?? 0, events: trail.events.length },
      onHand: dossier.lot.onHand ?? 0,
    };
  },
  // The review covers the trail as the reviewer was shown it; an event in between refuses the signature.
  trailMark: (record, meaning) => (meaning === 'reviewed' ? record.trail : undefined),
  refusal({ meaning, record }) {
    const facts = record;
    const reviewVoid = !facts.reviewedCurrent || facts.trailAfterReview.length > 0;
    if (meaning === 'reviewed') {
      if (facts.status !== 'submitted' && !(facts.status === 'reviewed' && reviewVoid))
        return `The lot is ${facts.status}, not awaiting review`;
      if (!facts.ready) return 'The lot is no longer ready for release; see its checklist';
    }
    if (meaning === 'approved-for-release') {
      if (facts.status !== 'reviewed') return `The lot is ${facts.status}, not reviewed`;
      if (!facts.reviewedCurrent) return 'The lot changed after it was reviewed; it must be reviewed again';
      if (facts.trailAfterReview.length) {
        return (
          `The lot's audit trail has ${facts.trailAfterReview.length} event(s) after the review ` +
          `(${facts.trailAfterReview.join('; ')}); it must be reviewed again`
        );
      }
      if (!facts.ready) return 'The lot is no longer ready for release; see its checklist';
    }
    if (meaning === 'returned-to-engineering' && facts.status !== 'submitted' && facts.status !== 'reviewed')
      return `The lot is ${facts.status}; only a lot under review can be returned to engineering`;
    return null;
  },
  // The record was built once for this signature, in its transaction: what was signed is what changes.
  async afterSign(manager, { recordId, meaning, signer, reason, origin, record }) {
    const lotId = Number(recordId);
    let moved: { from: string; to: string };
    if (meaning === 'approved-for-release') {
      moved = await changeLotStatus(manager, lotId, 'approve-for-release', { qty: record.onHand });
      await closePendingSubmission(manager, lotId, 'released');
    } else if (meaning === 'returned-to-engineering') {
      moved = await changeLotStatus(manager, lotId, 'return-to-engineering');
      await closePendingSubmission(manager, lotId, 'returned');
    } else {
      moved = await changeLotStatus(manager, lotId, 'review');
    }
    await queueReleaseMail(
      manager,
      lotId,
      meaning === 'approved-for-release' ? 'released' : meaning === 'returned-to-engineering' ? 'returned' : 'reviewed',
      reason,
    );
    await appendLedgerEvent(manager, {
      actor: signer,
      action: `lot.${meaning === 'approved-for-release' ? 'released' : meaning}`,
      entity: { type: 'lot', id: lotId },
      before: { status: moved.from },
      after: {
        status: moved.to,
        // The review records how far the lot's audit trail went when it was signed.
        ...(meaning === 'reviewed'
          ? { auditTrail: { events: record.trail.events, throughSeq: record.trail.throughSeq } }
          : {}),
      },
      reason,
      origin,
    });
  },
};
