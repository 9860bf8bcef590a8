import { describe, expect, it } from 'vitest';
import { capability } from '@shared/domain/materials/capability';

describe('capability and run rule', () => {
  it('when given the textbook sample 2, 4, 4, 4, 5, 5, 7, 9, then the mean is 5 and the sample standard deviation √(32/7)', () => {
    // Source: the worked example of the Wikipedia article "Standard deviation" (population σ = 2;
    // with n − 1 the sample s = √(32/7) ≈ 2.13809) — from memory.
    const result = capability(['2', '4', '4', '4', '5', '5', '7', '9'], { max: '20' });
    expect(result.mean).toBe('5');
    expect(result.sigma).toBe('2.13809');
  });

  it('when the process sits off centre, then Cpk takes the nearer limit (USL 20, LSL 8, mean 16, σ 2 → 0.667)', () => {
    // Source: NIST/SEMATECH e-Handbook of Statistical Methods §6.1.6, capability example (from memory):
    // Cpk = min((20 − 16)/6, (16 − 8)/6) = 0.667. Values chosen to have mean 16 and s = 2.
    const result = capability(['14', '18'], { min: '8', max: '20' });
    expect(result.mean).toBe('16');
    expect(Number(result.sigma)).toBeCloseTo(2.828427, 5);
    const withSigmaTwo = capability(['14', '16', '18'], { min: '8', max: '20' });
    expect(withSigmaTwo.sigma).toBe('2');
    expect(withSigmaTwo.cpk).toBe('0.667');
  });

  it('when only a maximum exists, then Cpk is the upper side (oxygen ≤ 0.13, mean 0.11, s 0.01 → 0.667)', () => {
    expect(capability(['0.10', '0.11', '0.12'], { max: '0.13' })).toMatchObject({ mean: '0.11', sigma: '0.01', cpk: '0.667' });
  });

  it('when nine points in a row fall on one side of the mean, then the run rule fires at the start of the run', () => {
    const values = ['0.10', '0.12', '0.11', '0.11', '0.11', '0.11', '0.11', '0.11', '0.11', '0.11', '0.11', '0.05'];
    const result = capability(values, { max: '0.13' });
    expect(result.runRule.triggered).toBe(true);
    // The mean is 1.26 / 12 = 0.105, so the run above it starts with the 0.12 at index 1.
    expect(result.runRule.fromIndex).toBe(1);
    expect(capability(['0.10', '0.12', '0.10', '0.12', '0.10', '0.12', '0.10', '0.12', '0.10', '0.12'], { max: '0.13' }).runRule.triggered).toBe(false);
  });

  it('when there are too few points, then no Cpk is claimed', () => {
    expect(capability(['0.11'], { max: '0.13' })).toMatchObject({ n: 1, cpk: null, sigma: null });
  });
});
