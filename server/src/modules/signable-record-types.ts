import { ledgerReviewRecordType } from './ledger/ledger-review.record';
import { heatRecordType } from './materials/heat.record';
import { heatEvaluationRecordType } from './materials/heat-evaluation.record';
import { specificationDraftRecordType } from './materials/specification-drafts.service';
import { heatMixingRecordType } from './manufacturing/heat-mixing.record';
import { nonconformanceRecordType } from './manufacturing/nonconformances.service';
import { lotReleaseRecordType } from './release/release.record';
import { lotHoldRecordType } from './recall/lot-holds';
import { recallInvestigationRecordType } from './recall/recall.record';
import { recallNoticesRecordType } from './recall/notices.record';
import { registerSignableRecordType } from './signatures/signable-records';
import { roleChangeRecordType } from './people/role-change.record';

/** Every kind of record the product lets people sign; the app and the demo seed register the same set. */
export function registerProductRecordTypes(): void {
  registerSignableRecordType(ledgerReviewRecordType);
  registerSignableRecordType(heatRecordType);
  registerSignableRecordType(heatEvaluationRecordType);
  registerSignableRecordType(specificationDraftRecordType);
  registerSignableRecordType(heatMixingRecordType);
  registerSignableRecordType(nonconformanceRecordType);
  registerSignableRecordType(lotReleaseRecordType);
  registerSignableRecordType(lotHoldRecordType);
  registerSignableRecordType(recallInvestigationRecordType);
  registerSignableRecordType(recallNoticesRecordType);
  registerSignableRecordType(roleChangeRecordType);
}
