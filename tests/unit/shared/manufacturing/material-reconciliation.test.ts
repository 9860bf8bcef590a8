import { describe, expect, it } from 'vitest';
import { reconcileMaterial } from '@shared/domain/manufacturing/material-reconciliation';

// Worked by hand (common practice, no source): consumed = issued − returned; expected = units × (length + cut-off).
describe('bar length reconciliation', () => {
  const part = { unitLengthMm: '60', cutoffAllowanceMm: '4.5', tolerancePct: '2' };
  it(
    'when 3000 mm is issued, 412 mm returned and 40 units started, then 2588 against 2580 mm is 8 mm (0.31 %) ' +
      'within 2 %',
    () => {
      expect(reconcileMaterial({ ...part, issuedMm: '3000', returnedMm: '412', unitsStarted: 40 })).toMatchObject({
        verdict: 'reconciled',
        consumedMm: '2588.00',
        expectedMm: '2580.00',
        differenceMm: '8.00',
        differencePct: '0.31',
      });
    },
  );
  it('when 200 mm more is used than the units account for, then it is a discrepancy beyond the tolerance', () => {
    const result = reconcileMaterial({ ...part, issuedMm: '3000', returnedMm: '220', unitsStarted: 40 });
    expect(result).toMatchObject({ verdict: 'discrepancy', differenceMm: '200.00', differencePct: '7.75' });
    expect(result.why).toContain(
      '200.00 mm (7.75 %) more bar used than the units account for, beyond the 2 % tolerance',
    );
  });
  it('when decimals are involved, then the arithmetic is exact', () => {
    expect(
      reconcileMaterial({
        unitLengthMm: '0.1',
        cutoffAllowanceMm: '0.2',
        tolerancePct: '0',
        issuedMm: '0.3',
        returnedMm: '0',
        unitsStarted: 1,
      }).verdict,
    ).toBe('reconciled');
  });
  it('when no unit has started, then it says so rather than dividing by zero', () => {
    expect(reconcileMaterial({ ...part, issuedMm: '3000', returnedMm: '0', unitsStarted: 0 })).toMatchObject({
      verdict: 'not-started',
      differencePct: null,
    });
  });
});
