import { DecimalE29, toDecimal } from './e29-rounding';

/**
 * Whether a cut of one bar piece into child pieces accounts for the material: the children plus
 * the saw kerf of each cut must equal the piece, within the kerf allowance. Common practice, no
 * published source: a cut into n pieces makes n − 1 saw cuts, each losing at most the allowance.
 */
export interface CutCheck {
  ok: boolean;
  childrenTotalMm: string;
  lossMm: string;
  allowedLossMm: string;
  reason: string | null;
}

export function checkCut(parentLengthMm: string, childLengthsMm: string[], kerfAllowancePerCutMm: string): CutCheck {
  const parent = toDecimal(parentLengthMm);
  const children = childLengthsMm.map(toDecimal);
  const total = children.reduce((sum, length) => sum.plus(length), new DecimalE29(0));
  const loss = parent.minus(total);
  const allowed = toDecimal(kerfAllowancePerCutMm).times(Math.max(children.length - 1, 0));
  const result = { childrenTotalMm: total.toFixed(), lossMm: loss.toFixed(), allowedLossMm: allowed.toFixed() };
  if (children.length < 2) return { ok: false, ...result, reason: 'A cut makes at least two pieces' };
  if (children.some((length) => length.lessThanOrEqualTo(0)))
    return { ok: false, ...result, reason: 'Every piece needs a positive length' };
  if (loss.isNegative())
    return {
      ok: false,
      ...result,
      reason: `The pieces add up to ${result.childrenTotalMm} mm, more than the ${parent.toFixed()} mm bar`,
    };
  if (loss.greaterThan(allowed)) {
    return {
      ok: false,
      ...result,
      reason:
        `${result.lossMm} mm of the bar is not accounted for (the kerf allowance is ${result.allowedLossMm} ` +
        `mm); record the remnant as a piece`,
    };
  }
  return { ok: true, ...result, reason: null };
}
