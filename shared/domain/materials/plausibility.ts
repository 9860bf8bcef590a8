import type { EvaluationFlag } from '../../schemas/evaluation';
import { decimalsOf, toDecimal } from './e29-rounding';
import type { ElementLimit } from './specification';

/** Warnings on a reported chemistry value that is possible but unlikely (they never change a verdict). */
export function plausibilityFlags(limit: ElementLimit, value: string, asReported: string): EvaluationFlag[] {
  const flags: EvaluationFlag[] = [];
  const decimal = toDecimal(value);
  if (decimal.isNegative() || decimal.greaterThan(100))
    flags.push({
      kind: 'out-of-range',
      item: limit.element,
      message: `${limit.element} ${asReported} is outside 0–100 %`,
    });
  const reference = limit.max ?? limit.min!;
  const reportedDecimals = value.split('.')[1]?.length ?? 0;
  if (reportedDecimals > decimalsOf(reference) + 3) {
    flags.push({
      kind: 'excess-precision',
      item: limit.element,
      message:
        `${limit.element} is reported to ${reportedDecimals} decimals, far finer than a mill's method reports ` +
        `against a limit of ${reference}`,
    });
  }
  if (
    limit.max !== undefined &&
    limit.min === undefined &&
    toDecimal(limit.max).lessThan(0.1) &&
    decimal.greaterThanOrEqualTo(1) &&
    decimal.greaterThan(toDecimal(limit.max).times(50))
  ) {
    flags.push({
      kind: 'looks-like-ppm',
      item: limit.element,
      message: `${limit.element} ${asReported} % against a limit of ${limit.max} %: was it reported in ppm?`,
    });
  }
  return flags;
}
