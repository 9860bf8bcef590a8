/**
 * Separation of duties: nobody reviews or approves a record they authored, and nobody approves
 * what they reviewed. Returns the reason for a refusal, or null when the person may sign.
 */
export interface SignatureHistory {
  /** People who created or changed the record (or the records it is built from). */
  authorIds: readonly number[];
  reviewerIds: readonly number[];
}

export type SigningStep = 'review' | 'approval';

export function separationOfDutiesRefusal(
  personId: number,
  step: SigningStep,
  history: SignatureHistory,
): string | null {
  if (history.authorIds.includes(personId)) {
    return step === 'review'
      ? 'You authored this record, so you cannot review it'
      : 'You authored this record, so you cannot approve it';
  }
  if (step === 'approval' && history.reviewerIds.includes(personId)) {
    return 'You reviewed this record, so someone else must approve it';
  }
  return null;
}
