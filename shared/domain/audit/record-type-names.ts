import { wordsOfCode } from '../words-of-code';
/** What a person reads for each kind of record the audit trail and the signatures name. */
const recordTypeNames: Record<string, string> = {
  'audit-ledger': 'Audit trail',
  'ledger-review': 'Audit trail review',
  'bar-piece': 'Bar',
  'check-analysis-rule': 'Check analysis rule',
  consignee: 'Consignee',
  heat: 'Heat',
  'heat-evaluation': 'Heat evaluation',
  'heat-mixing': 'Heat mixing in a lot',
  lot: 'Lot',
  'lot-hold': 'Hold on a lot',
  'lot-release': 'Lot release',
  nonconformance: 'Nonconformance',
  organisation: 'Organisation',
  part: 'Part',
  person: 'Person',
  'process-method-validation': "Firm's method validation",
  'process-run': 'Process run',
  reauthentication: 'Password confirmation',
  recall: 'Recall investigation',
  'recall-investigation': 'Recall investigation',
  'role-change': 'Role change',
  specification: 'Specification',
  'specification-draft': 'Specification revision',
  supplier: 'Supplier',
};

/** The words for a record type code; an unknown code reads as its own words. */
export function recordTypeName(code: string): string {
  const known = recordTypeNames[code];
  if (known) return known;
  return wordsOfCode(code);
}
