import { describe, expect, it } from 'vitest';
import { bissellInterval, capability } from '@shared/domain/materials/capability';

describe('capability and run rule', () => {
  it(
    'when given the textbook sample 2, 4, 4, 4, 5, 5, 7, 9, then the mean is 5 and the sample standard ' +
      'deviation √(32/7)',
    () => {
      // Source: the worked example of the Wikipedia article "Standard deviation" (population σ = 2;
      // with n − 1 the sample s = √(32/7) ≈ 2.13809) — unverified.
      const result = capability(['2', '4', '4', '4', '5', '5', '7', '9'], { max: '20' });
      expect(result.mean).toBe('5');
      expect(result.sigma).toBe('2.13809');
    },
  );

  it('when the process sits off centre, then Ppk takes the nearer limit (USL 20, LSL 8, mean 16, s 2 → 0.667)', () => {
    // Source: NIST/SEMATECH e-Handbook of Statistical Methods §6.1.6, capability example (unverified
    // page reference): min((20 − 16)/6, (16 − 8)/6) = 0.667. Values chosen to have mean 16 and s = 2.
    const result = capability(['14', '16', '18'], { min: '8', max: '20' });
    expect(result.sigma).toBe('2');
    expect(result.ppk).toMatchObject({ value: '0.667', sigma: '2' });
  });

  it(
    'when Cpk is asked for, then σ comes from the average moving range over d2 = 1.128, not from s (AIAG SPC ' +
      'manual; ISO 22514-2)',
    () => {
      // Worked by hand: moving ranges |16 − 14| = 2, |18 − 16| = 2, MR̄ = 2, σ̂ = 2 / 1.128 = 1.77305;
      // Cpk = (20 − 16) / (3 × 1.77305) = 0.752. d2 = 1.128 is the control-chart constant for n = 2.
      const result = capability(['14', '16', '18'], { min: '8', max: '20' });
      expect(result.cpk).toMatchObject({ value: '0.752', sigma: '1.77305' });
      // A drifting process: overall s counts the drift, the moving range does not, so Cpk > Ppk.
      const drifting = capability(['0.100', '0.102', '0.104', '0.106', '0.108', '0.110'], { max: '0.13' });
      expect(Number(drifting.cpk.value)).toBeGreaterThan(Number(drifting.ppk.value));
    },
  );

  it('when an interval is given, then it is Bissell’s: Ĉ = 0.625 from 30 parts → 0.425 to 0.825', () => {
    // Source: Bissell's approximation as printed in Rodriguez, J. Quality Technology 24(4), 1992,
    // applied to the textbook exercise USL 100, LSL 90, n = 30, x̄ = 97, s = 1.6 (Ĉpk = 3 / 4.8 = 0.625),
    // worked by hand: 1.96 √(1/(9·30·0.390625) + 1/58) = 0.32040 → 0.625 × (1 ∓ 0.32040).
    expect(bissellInterval('0.625', 30)).toEqual({ low: '0.425', high: '0.825' });
  });

  it('when fewer than 25 heats are behind an index, then it is marked indicative only', () => {
    expect(capability(['14', '16', '18'], { min: '8', max: '20' })).toMatchObject({
      n: 3,
      indicativeOnly: true,
      minimumForClaim: 25,
    });
    expect(
      capability(
        Array.from({ length: 25 }, (_, position) => String(10 + (position % 5))),
        { max: '20' },
      ).indicativeOnly,
    ).toBe(false);
  });

  it('when only a maximum exists, then the upper side decides (oxygen ≤ 0.13, mean 0.11, s 0.01 → Ppk 0.667)', () => {
    expect(capability(['0.10', '0.11', '0.12'], { max: '0.13' })).toMatchObject({
      mean: '0.11',
      sigma: '0.01',
      ppk: { value: '0.667' },
    });
  });

  it('when nine points in a row fall on one side of the mean, then the run rule fires at the start of the run', () => {
    const values = ['0.10', '0.12', '0.11', '0.11', '0.11', '0.11', '0.11', '0.11', '0.11', '0.11', '0.11', '0.05'];
    const result = capability(values, { max: '0.13' });
    expect(result.runRule.triggered).toBe(true);
    // The mean is 1.26 / 12 = 0.105, so the run above it starts with the 0.12 at index 1.
    expect(result.runRule.fromIndex).toBe(1);
    expect(
      capability(['0.10', '0.12', '0.10', '0.12', '0.10', '0.12', '0.10', '0.12', '0.10', '0.12'], { max: '0.13' })
        .runRule.triggered,
    ).toBe(false);
  });

  it('when there are too few points, then no Ppk or Cpk is claimed', () => {
    expect(capability(['0.11'], { max: '0.13' })).toMatchObject({
      n: 1,
      ppk: { value: null },
      cpk: { value: null },
      sigma: null,
    });
  });
});
