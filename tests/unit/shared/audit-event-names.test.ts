import { describe, expect, it } from 'vitest';
import { auditEventName } from '@shared/domain/audit/event-names';

// The names are the product's own words (WORDS: "audit trail", "Returned to engineering"); no published source.
describe('audit trail event names', () => {
  it('when an event code is named, then people read words, never the stored code', () => {
    expect(auditEventName('lot.submitted-for-release')).toBe('Lot submitted for release');
    expect(auditEventName('lot.returned-to-engineering')).toBe('Lot returned to engineering');
    expect(auditEventName('ledger.checkpointed')).toBe('Audit trail checkpoint signed');
    expect(auditEventName('lot.material-issued')).toBe('Bar issued to lot');
  });
  it('when a code has no name of its own, then its words are read as a sentence, without dots or hyphens', () => {
    expect(auditEventName('process-run.recorded')).toBe('Process run recorded');
    expect(auditEventName('check-analysis-rule.set')).toBe('Check analysis rule set');
    expect(auditEventName('')).toBe('');
  });
});
