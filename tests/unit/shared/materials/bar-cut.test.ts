import { describe, expect, it } from 'vitest';
import { checkCut } from '@shared/domain/materials/bar-cut';

// Worked examples of material conservation at a saw cut (common practice, no published source):
// n pieces need n − 1 cuts; each cut may lose up to the kerf allowance.
describe('checking a bar cut', () => {
  it('when 3000 mm is cut into 1000 + 997 + 997 with a 3 mm kerf, then the 6 mm lost is within 2 × 3 mm', () => {
    expect(checkCut('3000', ['1000', '997', '997'], '3')).toEqual({
      ok: true,
      childrenTotalMm: '2994',
      lossMm: '6',
      allowedLossMm: '6',
      reason: null,
    });
  });
  it('when the pieces add up to more than the bar, then it is refused', () => {
    expect(checkCut('1000', ['600', '401'], '3').reason).toBe(
      'The pieces add up to 1001 mm, more than the 1000 mm bar',
    );
  });
  it('when material is unaccounted for beyond the kerf, then it asks for the remnant', () => {
    expect(checkCut('1000', ['400', '400'], '3')).toMatchObject({
      ok: false,
      lossMm: '200',
      reason: '200 mm of the bar is not accounted for (the kerf allowance is 3 mm); record the remnant as a piece',
    });
  });
  it('when decimals are involved, then the arithmetic is exact (0.1 + 0.2 is 0.3 here)', () => {
    expect(checkCut('1000.3', ['500.1', '500.2'], '0')).toMatchObject({ ok: true, lossMm: '0' });
  });
  it('when a cut makes a single piece, then it is refused', () => {
    expect(checkCut('1000', ['1000'], '3').reason).toBe('A cut makes at least two pieces');
  });
});
