// A lot's audit trail for its release: the ledger events on the lot and the lots its units came
// through, since they were opened. The QA reviewer's "reviewed" signature records how far the
// trail went when they reviewed it; an event after that voids the review.
import type { EntityManager } from 'typeorm';
import type { AuditTrail } from '@shared/schemas/release';
import { latestLotEvent, lotTrailRows, type TrailRow } from './release-dossier.repository';

const lineageOwn = (row: TrailRow, lotId: number) => row.entity_id === String(lotId);

/** The review's own ledger event is not part of what it reviews. */
const REVIEW_ACTION = 'lot.reviewed';

export async function lotAuditTrail(manager: EntityManager, lotId: number, lineage: number[]): Promise<AuditTrail> {
  const rows = await lotTrailRows(manager, lineage, REVIEW_ACTION);
  // The lots its units came through belong to its history only until it began: their later
  // events (their own release, shipments) are theirs alone.
  const own = rows.filter((row) => lineageOwn(row, lotId));
  const began = own.length ? Math.min(...own.map((row) => Number(row.seq))) : Number.POSITIVE_INFINITY;
  const events = rows
    .filter((row) => lineageOwn(row, lotId) || Number(row.seq) < began)
    .map((row) => ({
      seq: Number(row.seq),
      occurredAt: new Date(row.occurred_at).toISOString(),
      actor: row.actor_name,
      action: row.action,
      lot: row.lot_number,
      reason: row.reason,
    }));
  const review = await latestLotEvent(manager, lotId, REVIEW_ACTION);
  // Reviews recorded before the trail was recorded with them covered everything before their own event.
  const recorded = review?.after_json
    ? (JSON.parse(review.after_json) as { auditTrail?: { throughSeq?: number } }).auditTrail?.throughSeq
    : undefined;
  const reviewedThroughSeq = review ? (recorded ?? Number(review.seq)) : null;
  return {
    events,
    reviewedThroughSeq,
    afterReview: reviewedThroughSeq === null ? [] : events.filter((event) => event.seq > reviewedThroughSeq),
  };
}
