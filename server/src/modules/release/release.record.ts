import type { SignatureMeaning } from '@shared/domain/signatures';
import { contentHash } from '@shared/domain/signatures';
import { checkpointLedger, checkpointTriggers } from '../ledger/ledger-checkpoints';
import { loadConfig } from '../../config/env';
import type { SignableRecordType } from '../signatures/signable-records';
import { signaturesFor } from '../signatures/signatures.repository';
import { appendLedgerEvent, sha256Hex } from '../ledger/ledger.repository';
import { lotAuditTrail } from './audit-trail';
import { ancestry, releaseDossierIn } from './release-dossier';
import { queueReleaseMail } from './release-mails';
import { changeLotStatus, findLot, lockLot } from '../manufacturing/production-lot.repository';
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
export const lotReleaseRecordType: SignableRecordType = {
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
    };
  },
  // The review covers the trail as the reviewer was shown it; an event in between refuses the signature.
  trailMark: (record, meaning) =>
    meaning === 'reviewed' ? (record.trail as { throughSeq: number; events: number }) : undefined,
  refusal({ meaning, record }) {
    const facts = record as unknown as {
      status: string;
      ready: boolean;
      reviewedCurrent: boolean;
      trailAfterReview: string[];
    };
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
        return `The lot's audit trail has ${facts.trailAfterReview.length} event(s) after the review (${facts.trailAfterReview.join('; ')}); it must be reviewed again`;
      }
      if (!facts.ready) return 'The lot is no longer ready for release; see its checklist';
    }
    if (meaning === 'returned-to-engineering' && facts.status !== 'submitted' && facts.status !== 'reviewed')
      return `The lot is ${facts.status}; only a lot under review can be returned to engineering`;
    return null;
  },
  async afterSign(manager, { recordId, meaning, signerId, signerName, reason }) {
    const lotId = Number(recordId);
    await lockLot(manager, lotId);
    // The review records how far the lot's audit trail went when it was signed.
    const trail = meaning === 'reviewed' ? await lotAuditTrail(manager, lotId, await ancestry(manager, lotId)) : null;
    let moved: { from: string; to: string };
    if (meaning === 'approved-for-release') {
      const dossier = await releaseDossierIn(manager, lotId);
      moved = await changeLotStatus(manager, lotId, 'approve-for-release', { qty: dossier.lot.onHand ?? 0 });
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
      actor: {
        id: signerId,
        name: signerName,
        role: meaning === 'approved-for-release' ? 'qa-approver' : 'qa-reviewer',
      },
      action: `lot.${meaning === 'approved-for-release' ? 'released' : meaning}`,
      entity: { type: 'lot', id: lotId },
      before: { status: moved.from },
      after: {
        status: moved.to,
        ...(trail ? { auditTrail: { events: trail.events.length, throughSeq: trail.events.at(-1)?.seq ?? 0 } } : {}),
      },
      reason,
    });
  },
};
