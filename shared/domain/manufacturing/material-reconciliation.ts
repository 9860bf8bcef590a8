import { DecimalE29, toDecimal } from '../materials/e29-rounding';

/**
 * Bar length issued to a lot against what its units account for: each unit started uses its
 * finished length plus the cut-off (parting) allowance; what came back to stores is subtracted.
 * The difference must stay within the part's tolerance, as a percentage of the expected use.
 * Common practice in bar-fed machining, no published source.
 */
export interface MaterialInput {
  issuedMm: string;
  returnedMm: string;
  unitsStarted: number;
  unitLengthMm: string;
  cutoffAllowanceMm: string;
  tolerancePct: string;
}

export interface MaterialReconciliation {
  verdict: 'reconciled' | 'discrepancy' | 'not-started';
  consumedMm: string;
  expectedMm: string;
  differenceMm: string;
  differencePct: string | null;
  why: string;
}

export function reconcileMaterial(input: MaterialInput): MaterialReconciliation {
  const consumed = toDecimal(input.issuedMm).minus(toDecimal(input.returnedMm));
  const perUnit = toDecimal(input.unitLengthMm).plus(toDecimal(input.cutoffAllowanceMm));
  const expected = perUnit.times(input.unitsStarted);
  const difference = consumed.minus(expected);
  const base = {
    consumedMm: consumed.toFixed(2),
    expectedMm: expected.toFixed(2),
    differenceMm: difference.toFixed(2),
  };
  if (input.unitsStarted === 0) {
    return {
      verdict: 'not-started',
      ...base,
      differencePct: null,
      why: consumed.isZero()
        ? 'No bar issued and no units started yet'
        : `${base.consumedMm} mm of bar issued but no units started yet`,
    };
  }
  const pct = difference.abs().div(expected).times(100);
  const pctText = pct.toDecimalPlaces(2, DecimalE29.ROUND_HALF_EVEN).toFixed(2);
  const within = pct.lessThanOrEqualTo(toDecimal(input.tolerancePct));
  const direction = difference.isNegative()
    ? 'less bar used than the units need'
    : 'more bar used than the units account for';
  const formula =
    `${input.issuedMm} issued − ${input.returnedMm} returned = ${base.consumedMm} mm; ${input.unitsStarted} ` +
    `units × (${input.unitLengthMm} + ${input.cutoffAllowanceMm}) mm = ${base.expectedMm} mm`;
  return {
    verdict: within ? 'reconciled' : 'discrepancy',
    ...base,
    differencePct: pctText,
    why: difference.isZero()
      ? formula
      : `${formula}; ${difference.abs().toFixed(2)} mm (${pctText} %) ` +
        `${direction}, ${within ? 'within' : 'beyond'} the ${input.tolerancePct} % tolerance`,
  };
}
