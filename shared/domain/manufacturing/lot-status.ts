/**
 * The only ways a lot's status changes. Open → submitted → reviewed → released is the release
 * path; a lot under review may be returned to engineering (open again) and a review the lot has
 * outgrown may be signed again; an open lot whose units all went to other lots is consumed; a
 * lot whose own nonconformance is dispositioned Scrap is rejected unless it was released already
 * (units in the field are a recall's matter). Released, consumed-then-released and rejected lots
 * never move back. Common practice for lot release, no published source for the state machine.
 */
import type { lotStatuses } from '../../schemas/manufacturing';

export type LotStatus = (typeof lotStatuses)[number];

export type LotStatusChange =
  'submit-for-release' | 'review' | 'approve-for-release' | 'return-to-engineering' | 'consume' | 'reject';

export const lotStatusChanges: Record<LotStatusChange, { from: readonly LotStatus[]; to: LotStatus; words: string }> = {
  'submit-for-release': { from: ['open'], to: 'submitted', words: 'submitted for release' },
  review: { from: ['submitted', 'reviewed'], to: 'reviewed', words: 'reviewed' },
  'approve-for-release': { from: ['reviewed'], to: 'released', words: 'approved for release' },
  'return-to-engineering': { from: ['submitted', 'reviewed'], to: 'open', words: 'returned to engineering' },
  consume: { from: ['open'], to: 'consumed', words: 'consumed by a split or merge' },
  reject: { from: ['open', 'consumed', 'submitted', 'reviewed'], to: 'rejected', words: 'rejected' },
};

/** Why a lot in the given status cannot take the change, or null when it can. */
export function lotStatusChangeProblem(current: LotStatus, change: LotStatusChange): string | null {
  const rule = lotStatusChanges[change];
  if (rule.from.includes(current)) return null;
  return `A lot that is ${current} cannot be ${rule.words}; only a lot that is ${rule.from.join(' or ')} can`;
}
