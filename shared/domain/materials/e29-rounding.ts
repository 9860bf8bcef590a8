import { Decimal } from 'decimal.js';

/**
 * ASTM E29 rounding method: round the reported value once, to the place of the last digit of the
 * specification limit as written, with round-half-to-even for an exact trailing 5. Arithmetic is
 * decimal (decimal.js), never binary floating point.
 */
const E29 = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN });

export const decimalPattern = /^[+-]?(\d+(\.\d*)?|\.\d+)$/;

export function isDecimalString(value: string): boolean {
  return decimalPattern.test(value.trim());
}

export function toDecimal(value: string): Decimal {
  if (!isDecimalString(value)) throw new Error(`"${value}" is not a decimal number`);
  return new E29(value.trim());
}

/** Number of decimal places a limit is written with ("0.13" → 2, "860" → 0, "26.0" → 1). */
export function decimalsOf(limit: string): number {
  const trimmed = limit.trim();
  if (!isDecimalString(trimmed)) throw new Error(`"${limit}" is not a decimal number`);
  const point = trimmed.indexOf('.');
  return point === -1 ? 0 : trimmed.length - point - 1;
}

/**
 * Rounds in one step to the given number of decimals, half to even; returns a string with exactly that many decimals.
 */
export function roundE29(value: string | Decimal, decimals: number): string {
  const decimal = typeof value === 'string' ? toDecimal(value) : new E29(value);
  return decimal.toDecimalPlaces(decimals, Decimal.ROUND_HALF_EVEN).toFixed(decimals);
}

export function compareDecimal(a: string, b: string): number {
  return toDecimal(a).comparedTo(toDecimal(b));
}

export { E29 as DecimalE29 };
