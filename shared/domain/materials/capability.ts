import { Decimal } from 'decimal.js';

/**
 * Process capability of one value per heat against a one- or two-sided limit, and a run rule.
 * Both indices are min((USL − x̄) / 3σ, (x̄ − LSL) / 3σ) over the sides that exist:
 * - Ppk with σ the overall sample standard deviation s (n − 1);
 * - Cpk with σ the within estimate MR̄ / d₂, MR̄ the average moving range of consecutive heats and
 *   d₂ = 1.128 for ranges of two (AIAG SPC manual; ISO 22514-2; d₂ as tabled in the NIST/SEMATECH
 *   e-Handbook's control-chart pages).
 * Each comes with Bissell's approximate 95 % interval, Ĉ[1 ± 1.96 √(1/(9nĈ²) + 1/(2(n − 1)))]
 * (Bissell 1990, as printed in Rodriguez, J. Quality Technology 24(4), 1992), and is marked
 * indicative only below 25 values (common practice, no single source).
 * Run rule: nine points in a row on one side of the mean (the second Western Electric / Nelson rule).
 */
export interface CapabilityIndex {
  value: string | null;
  sigma: string | null;
  formula: string;
  interval: { low: string; high: string } | null;
}

export interface Capability {
  n: number;
  mean: string | null;
  /** Overall sample standard deviation (kept for readers of earlier responses). */
  sigma: string | null;
  ppk: CapabilityIndex;
  cpk: CapabilityIndex;
  /** Below this many values the indices are indicative only. */
  minimumForClaim: number;
  indicativeOnly: boolean;
  formula: string;
  runRule: { triggered: boolean; fromIndex: number | null; rule: string };
}

const RUN_LENGTH = 9;
export const D2_FOR_RANGES_OF_TWO = '1.128';
export const MINIMUM_FOR_CLAIM = 25;

const ppkFormula = 'Ppk = min((USL − x̄) / 3s, (x̄ − LSL) / 3s), s = overall sample standard deviation (n − 1)';
const cpkFormula =
  'Cpk = min((USL − x̄) / 3σ̂, (x̄ − LSL) / 3σ̂), σ̂ = MR̄ / 1.128 from the moving ranges of consecutive heats';

/** Bissell's approximate 95 % interval for a capability index from n values. */
export function bissellInterval(value: Decimal.Value, n: number): { low: string; high: string } | null {
  const estimate = new Decimal(value);
  if (estimate.isZero() || n < 2) return null;
  const spread = new Decimal(1)
    .div(estimate.pow(2).times(9 * n))
    .plus(new Decimal(1).div(2 * (n - 1)))
    .sqrt()
    .times('1.96');
  return {
    low: estimate.times(new Decimal(1).minus(spread)).toDecimalPlaces(3).toFixed(3),
    high: estimate.times(new Decimal(1).plus(spread)).toDecimalPlaces(3).toFixed(3),
  };
}

function index(
  mean: Decimal,
  sigma: Decimal | null,
  limit: { min?: string; max?: string },
  n: number,
  formula: string,
): CapabilityIndex {
  if (!sigma || sigma.isZero())
    return { value: null, sigma: sigma ? sigma.toSignificantDigits(6).toFixed() : null, formula, interval: null };
  const sides: Decimal[] = [];
  if (limit.max !== undefined) sides.push(new Decimal(limit.max).minus(mean).div(sigma.times(3)));
  if (limit.min !== undefined) sides.push(mean.minus(limit.min).div(sigma.times(3)));
  if (!sides.length) return { value: null, sigma: sigma.toSignificantDigits(6).toFixed(), formula, interval: null };
  const value = Decimal.min(...sides);
  return {
    value: value.toDecimalPlaces(3).toFixed(3),
    sigma: sigma.toSignificantDigits(6).toFixed(),
    formula,
    interval: bissellInterval(value, n),
  };
}

function runRule(numbers: Decimal[], mean: Decimal): Capability['runRule'] {
  const rule = `${RUN_LENGTH} points in a row on the same side of the mean`;
  let fromIndex: number | null = null;
  let runStart = 0;
  let runSide = 0;
  numbers.forEach((value, position) => {
    const side = value.comparedTo(mean);
    if (side === 0 || side !== runSide) {
      runSide = side;
      runStart = position;
    }
    if (fromIndex === null && side !== 0 && position - runStart + 1 >= RUN_LENGTH) fromIndex = runStart;
  });
  return { triggered: fromIndex !== null, fromIndex, rule };
}

export function capability(values: string[], limit: { min?: string; max?: string }): Capability {
  const numbers = values.map((value) => new Decimal(value));
  const n = numbers.length;
  const empty = (formula: string): CapabilityIndex => ({ value: null, sigma: null, formula, interval: null });
  const base = {
    n,
    minimumForClaim: MINIMUM_FOR_CLAIM,
    indicativeOnly: n < MINIMUM_FOR_CLAIM,
    formula: `${ppkFormula}; ${cpkFormula}`,
  };
  if (n < 2) {
    return {
      ...base,
      mean: n ? numbers[0]!.toFixed() : null,
      sigma: null,
      ppk: empty(ppkFormula),
      cpk: empty(cpkFormula),
      runRule: {
        triggered: false,
        fromIndex: null,
        rule: `${RUN_LENGTH} points in a row on the same side of the mean`,
      },
    };
  }
  const mean = numbers.reduce((sum, value) => sum.plus(value), new Decimal(0)).div(n);
  const overall = numbers
    .reduce((sum, value) => sum.plus(value.minus(mean).pow(2)), new Decimal(0))
    .div(n - 1)
    .sqrt();
  const movingRanges = numbers.slice(1).map((value, position) => value.minus(numbers[position]!).abs());
  const within = movingRanges
    .reduce((sum, range) => sum.plus(range), new Decimal(0))
    .div(movingRanges.length)
    .div(D2_FOR_RANGES_OF_TWO);
  return {
    ...base,
    mean: mean.toSignificantDigits(6).toFixed(),
    sigma: overall.toSignificantDigits(6).toFixed(),
    ppk: index(mean, overall, limit, n, ppkFormula),
    cpk: index(mean, within, limit, n, cpkFormula),
    runRule: runRule(numbers, mean),
  };
}
