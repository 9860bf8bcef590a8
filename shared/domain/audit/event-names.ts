import { wordsOfCode } from '../words-of-code';
/**
 * What a person reads for each kind of audit trail event. The trail stores a short code
 * (`lot.submitted-for-release`); screens, PDFs and the people's CSV columns show the name below.
 * Codes not listed read as their words ("process-run.recorded" → "Process run recorded"); those
 * listed are the ones whose words alone would say something else or use another name for a thing.
 */
const named: Record<string, string> = {
  'audit.exported': 'Audit trail exported',
  'audit.read': 'Audit trail reviewed',
  'ledger.checkpointed': 'Audit trail checkpoint signed',
  'ledger.signing-started': 'Audit trail signing started',
  'bar.cut': 'Bar cut into pieces',
  'bar.heat-marking-mismatch': 'Bar marking does not match its heat',
  'bar.received': 'Bar received into stock',
  'heat.dispositioned': 'Heat disposition signed',
  'heat.screening-finding-acknowledged': 'Certificate screening finding acknowledged',
  'lot.held': 'Lot put on hold',
  'lot.hold-lifted': 'Hold on lot lifted',
  'lot.material-issued': 'Bar issued to lot',
  'lot.material-returned': 'Bar returned from lot',
  'lot.operation-recorded': 'Routing step recorded',
  'lot.operation-file-attached': 'File attached to routing step',
  'lot.release-packet-stored': 'Release packet stored',
  'lot.reviewed': 'Lot reviewed for release',
  'lot.released': 'Lot approved for release',
  'lot.returned-to-engineering': 'Lot returned to engineering',
  'lot.rejected': 'Lot rejected',
  'lot.submitted-for-release': 'Lot submitted for release',
  'nonconformance.dispositioned': 'Nonconformance disposition signed',
  'nonconformance.disposition-proposed': 'Nonconformance disposition proposed',
  'person.identity-provider-roles-changed': 'Roles changed by the identity provider',
  'person.provisioned': 'Person added at first sign-in',
  'person.role-change-requested': 'Role change requested',
  'person.role-change-refused': 'Role change refused',
  'process-method.validation-recorded': "Firm's own method validation recorded",
  'process-method.validation-withdrawn': "Firm's own method validation withdrawn",
  'recall.opened': 'Recall investigation opened',
  'recall.drill-opened': 'Drill opened',
  'recall.rerun': 'Recall investigation traced again',
  'recall.closed': 'Recall investigation closed',
  'recall.exported': 'Recall investigation exported',
  'recall.drill-report-exported': 'Drill report exported',
  'recall.field-action-set': 'Field action set',
  'consignee.contact-changed': 'Consignee contact address changed',
  'recall.notices-prepared': 'Consignee notices prepared',
  'recall.notice-issued': 'Consignee notice issued',
  'recall.notice-replied': 'Consignee replied',
  'recall.reminder-sent': 'Consignee reminded',
  'recall.escalated': 'Unanswered notices escalated',
  'recall.goods-returned': 'Returned goods received',
  'recall.field-action-reported': 'Field action report made',
  'recall.epcis-exported': 'Exported as EPCIS',
  'trace.bulk': 'Many UDIs or lots traced at once',
  'lot.epcis-exported': 'Lot genealogy exported as EPCIS',
  'session.sign-in-refused': 'Sign-in refused',
  'session.signed-in': 'Signed in',
  'session.signed-out': 'Signed out',
  'signature.signed': 'Electronic signature applied',
  'signature.reauthenticated': 'Password confirmed for a signature',
  'signature.reauthentication-refused': 'Password confirmation refused',
  'signature.reauthentication-cancelled': 'Password confirmation cancelled',
};

/** The words for an event code: the name above, else the code's own words in a sentence. */
export function auditEventName(action: string): string {
  const known = named[action];
  if (known) return known;
  return wordsOfCode(action);
}
