// The screening's two distributions against a reference library from the registry (@stdlib,
// stats-base-dists-*) and against values printed in standard tables.
import binomialCdf from '@stdlib/stats-base-dists-binomial-cdf';
import stdlibNormalCdf from '@stdlib/stats-base-dists-normal-cdf';
import { describe, expect, it } from 'vitest';
import { binomialUpperTail, normalCdf } from '@shared/domain/materials/distribution';

describe('normal CDF', () => {
  it(
    'matches the standard normal table (Φ(1.96) = 0.9750, ' + 'Φ(−1) = 0.1587, Φ(0) = 0.5; any statistics handbook)',
    () => {
      expect(normalCdf(1.96)).toBeCloseTo(0.975, 4);
      expect(normalCdf(-1)).toBeCloseTo(0.1587, 4);
      expect(normalCdf(0)).toBeCloseTo(0.5, 7);
    },
  );

  it('agrees with @stdlib to within the stated 1.5e-7 from −6 to 6', () => {
    for (let z = -6; z <= 6; z += 0.05) expect(Math.abs(normalCdf(z) - stdlibNormalCdf(z, 0, 1))).toBeLessThan(1.5e-7);
  });
});

describe('binomial upper tail', () => {
  it('matches sums done by hand: P(Bin(18, ½) ≥ 16) = (153 + 18 + 1) / 2^18; P(Bin(10, ½) ≥ 8) = 56 / 1024', () => {
    expect(binomialUpperTail(16, 18, 0.5)).toBeCloseTo(172 / 262_144, 12);
    expect(binomialUpperTail(8, 10, 0.5)).toBeCloseTo(56 / 1024, 12);
  });

  it('agrees with @stdlib (1 − CDF(k − 1)) over a grid of n, k and p', () => {
    for (const n of [1, 5, 17, 60, 200]) {
      for (const p of [0.01, 0.2, 0.5, 0.9]) {
        for (let k = 0; k <= n; k += Math.max(1, Math.floor(n / 7))) {
          const reference = k === 0 ? 1 : 1 - binomialCdf(k - 1, n, p);
          expect(Math.abs(binomialUpperTail(k, n, p) - reference)).toBeLessThan(1e-9);
        }
      }
    }
  });

  it('handles the edges', () => {
    expect(binomialUpperTail(0, 10, 0.3)).toBe(1);
    expect(binomialUpperTail(11, 10, 0.3)).toBe(0);
    expect(binomialUpperTail(3, 10, 0)).toBe(0);
    expect(binomialUpperTail(3, 10, 1)).toBe(1);
  });
});
