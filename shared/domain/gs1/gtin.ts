/**
 * GTIN check digits (GS1 mod-10): weights 3 and 1 alternate from the rightmost digit of the
 * number without its check digit; the check digit brings the sum up to a multiple of ten.
 * Source: GS1 check digit calculator (gs1.org) and GS1 Sweden's worked examples.
 */
export function gs1CheckDigit(digitsWithoutCheck: string): number {
  if (!/^\d+$/.test(digitsWithoutCheck)) throw new Error('Only digits carry a GS1 check digit');
  let sum = 0;
  for (let index = 0; index < digitsWithoutCheck.length; index++) {
    const digit = Number(digitsWithoutCheck[digitsWithoutCheck.length - 1 - index]);
    sum += index % 2 === 0 ? digit * 3 : digit;
  }
  return (10 - (sum % 10)) % 10;
}

/** Why a string is not a valid GTIN (8, 12, 13 or 14 digits with the right check digit), or null. */
export function gtinProblem(gtin: string): string | null {
  if (!/^\d+$/.test(gtin)) return 'A GTIN has digits only';
  if (![8, 12, 13, 14].includes(gtin.length)) return 'A GTIN has 8, 12, 13 or 14 digits';
  const expected = gs1CheckDigit(gtin.slice(0, -1));
  if (Number(gtin.at(-1)) !== expected) return `The check digit should be ${expected}`;
  return null;
}

/** The GTIN padded with leading zeros to the 14 digits that GS1 element strings and Digital Link use. */
export function toGtin14(gtin: string): string {
  const problem = gtinProblem(gtin);
  if (problem) throw new Error(problem);
  return gtin.padStart(14, '0');
}

/**
 * GS1 CSET 82: the characters allowed in a batch/lot (AI 10) or serial (AI 21).
 * Source: GS1 Barcode Syntax Dictionary linter (lint_cset82).
 */
export const cset82 = `!"%&'()*+,-./0123456789:;<=>?ABCDEFGHIJKLMNOPQRSTUVWXYZ_abcdefghijklmnopqrstuvwxyz`;

/** Why a lot number cannot go into AI 10 (1–20 characters of CSET 82), or null. */
export function lotNumberProblem(lot: string): string | null {
  if (lot.length < 1 || lot.length > 20) return 'A lot number has 1 to 20 characters (GS1 AI 10)';
  const bad = [...lot].find((character) => !cset82.includes(character));
  if (bad !== undefined) return `“${bad}” cannot be used in a GS1 lot number`;
  return null;
}
