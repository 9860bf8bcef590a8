import { Decimal } from 'decimal.js';

/**
 * Process capability of reported values against a one- or two-sided limit, and a run rule.
 * Cpk = min((USL − mean) / 3σ, (mean − LSL) / 3σ) over the sides that exist, with σ the sample
 * standard deviation (n − 1). Run rule: nine points in a row on one side of the mean (the second
 * of the Western Electric / Nelson rules).
 */
export interface Capability {
  n: number;
  mean: string | null;
  sigma: string | null;
  cpk: string | null;
  formula: string;
  runRule: { triggered: boolean; fromIndex: number | null; rule: string };
}

const RUN_LENGTH = 9;

export function capability(values: string[], limit: { min?: string; max?: string }): Capability {
  const formula = 'Cpk = min((USL − x̄) / 3s, (x̄ − LSL) / 3s), s = sample standard deviation (n − 1)';
  const rule = `${RUN_LENGTH} points in a row on the same side of the mean`;
  const numbers = values.map((value) => new Decimal(value));
  const n = numbers.length;
  if (n < 2) return { n, mean: n ? numbers[0]!.toFixed() : null, sigma: null, cpk: null, formula, runRule: { triggered: false, fromIndex: null, rule } };
  const mean = numbers.reduce((sum, value) => sum.plus(value), new Decimal(0)).div(n);
  const variance = numbers.reduce((sum, value) => sum.plus(value.minus(mean).pow(2)), new Decimal(0)).div(n - 1);
  const sigma = variance.sqrt();
  let cpk: Decimal | null = null;
  if (!sigma.isZero()) {
    const sides: Decimal[] = [];
    if (limit.max !== undefined) sides.push(new Decimal(limit.max).minus(mean).div(sigma.times(3)));
    if (limit.min !== undefined) sides.push(mean.minus(limit.min).div(sigma.times(3)));
    cpk = sides.length ? Decimal.min(...sides) : null;
  }
  let fromIndex: number | null = null;
  let runStart = 0;
  let runSide = 0;
  numbers.forEach((value, index) => {
    const side = value.comparedTo(mean);
    if (side === 0 || side !== runSide) {
      runSide = side;
      runStart = index;
    }
    if (fromIndex === null && side !== 0 && index - runStart + 1 >= RUN_LENGTH) fromIndex = runStart;
  });
  return {
    n,
    mean: mean.toSignificantDigits(6).toFixed(),
    sigma: sigma.toSignificantDigits(6).toFixed(),
    cpk: cpk ? cpk.toDecimalPlaces(3).toFixed(3) : null,
    formula,
    runRule: { triggered: fromIndex !== null, fromIndex, rule },
  };
}
