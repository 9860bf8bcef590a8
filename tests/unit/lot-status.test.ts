import { describe, expect, it } from 'vitest';
import { lotStatusChangeProblem, lotStatusChanges, type LotStatus } from '../../shared/domain/manufacturing/lot-status';
import { lotStatuses } from '../../shared/schemas/manufacturing';

// Common practice for lot release, no published source for the state machine.
describe('the lot status rule', () => {
  it('follows the release path: open → submitted → reviewed → released', () => {
    expect(lotStatusChangeProblem('open', 'submit-for-release')).toBeNull();
    expect(lotStatusChangeProblem('submitted', 'review')).toBeNull();
    expect(lotStatusChangeProblem('reviewed', 'approve-for-release')).toBeNull();
    expect(lotStatusChanges['approve-for-release'].to).toBe('released');
  });

  it('does not skip the review, nor submit a lot twice', () => {
    expect(lotStatusChangeProblem('submitted', 'approve-for-release')).toMatch(/submitted cannot be approved/);
    expect(lotStatusChangeProblem('open', 'approve-for-release')).not.toBeNull();
    expect(lotStatusChangeProblem('submitted', 'submit-for-release')).not.toBeNull();
    expect(lotStatusChangeProblem('open', 'review')).not.toBeNull();
  });

  it('returns only a lot under review to engineering', () => {
    expect(lotStatusChangeProblem('submitted', 'return-to-engineering')).toBeNull();
    expect(lotStatusChangeProblem('reviewed', 'return-to-engineering')).toBeNull();
    expect(lotStatusChangeProblem('open', 'return-to-engineering')).not.toBeNull();
    expect(lotStatusChangeProblem('released', 'return-to-engineering')).not.toBeNull();
  });

  it('never moves a released or rejected lot, by any change', () => {
    const changes = Object.keys(lotStatusChanges) as Array<keyof typeof lotStatusChanges>;
    for (const terminal of ['released', 'rejected'] as LotStatus[])
      for (const change of changes)
        expect(lotStatusChangeProblem(terminal, change), `${terminal} ${change}`).not.toBeNull();
  });

  it('consumes only an open lot, and rejects a consumed one but not a released one', () => {
    expect(lotStatusChangeProblem('open', 'consume')).toBeNull();
    expect(lotStatusChangeProblem('submitted', 'consume')).not.toBeNull();
    expect(lotStatusChangeProblem('consumed', 'reject')).toBeNull();
    expect(lotStatusChangeProblem('released', 'reject')).toMatch(/released cannot be rejected/);
  });

  it('leads every change to a status the schema knows, and from statuses it knows', () => {
    for (const rule of Object.values(lotStatusChanges)) {
      expect(lotStatuses).toContain(rule.to);
      for (const from of rule.from) expect(lotStatuses).toContain(from);
    }
  });
});
