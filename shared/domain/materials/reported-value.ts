import { DecimalE29, isDecimalString } from './e29-rounding';

export interface ReportedValue {
  /** The value in the unit the limits use (wt % for chemistry). */
  value: string;
  /** What was reported, as entered. */
  asReported: string;
  /** Set when the value was converted, e.g. "40 ppm = 0.0040 %". */
  conversion: string | null;
}

export class ReportedValueError extends Error {}

/**
 * Reads a reported chemistry value: a decimal in wt %, or a decimal followed by "ppm" (parts per
 * million by mass; 1 ppm = 0.0001 wt %), converted explicitly.
 */
export function readChemistryValue(input: string | number): ReportedValue {
  const asReported = typeof input === 'number' ? String(input) : input.trim();
  const ppm = /^(.+?)\s*ppm$/i.exec(asReported);
  const numberPart = (ppm ? ppm[1]! : asReported.replace(/\s*%$/, '')).trim();
  if (!isDecimalString(numberPart))
    throw new ReportedValueError(`"${asReported}" is not a decimal number (write e.g. 0.12 or 40 ppm)`);
  if (!ppm) return { value: numberPart, asReported, conversion: null };
  const percent = new DecimalE29(numberPart).div(10_000);
  const places = Math.max(0, (numberPart.split('.')[1]?.length ?? 0) + 4);
  const value = percent.toFixed(places);
  return { value, asReported, conversion: `${numberPart} ppm = ${value} %` };
}

export function readMechanicalValue(input: string | number): string {
  const text = typeof input === 'number' ? String(input) : input.trim();
  if (!isDecimalString(text)) throw new ReportedValueError(`"${text}" is not a decimal number`);
  return text;
}
