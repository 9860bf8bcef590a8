import { compareDecimal, decimalsOf, roundE29, toDecimal } from './e29-rounding';

export interface LimitJudgement {
  conforms: boolean;
  /** The value rounded to the place of the limit that decides (the one broken, else the nearer one). */
  rounded: string;
  /** The value rounded to each limit's own place. */
  atMin?: string;
  atMax?: string;
}

/**
 * ASTM E29 rounding method, limit by limit: the value is rounded once to the place of the minimum
 * as written to compare with the minimum, and once to the place of the maximum as written to
 * compare with the maximum (Mo 2.25–3.5: 3.54 → 3.5 against the maximum, so it conforms).
 */
export function judgeAgainstLimits(value: string, min?: string, max?: string): LimitJudgement {
  const atMin = min !== undefined ? roundE29(value, decimalsOf(min)) : undefined;
  const atMax = max !== undefined ? roundE29(value, decimalsOf(max)) : undefined;
  const belowMin = atMin !== undefined && compareDecimal(atMin, min!) < 0;
  const aboveMax = atMax !== undefined && compareDecimal(atMax, max!) > 0;
  let rounded: string;
  if (belowMin) rounded = atMin!;
  else if (aboveMax) rounded = atMax!;
  else if (atMin !== undefined && atMax !== undefined) {
    // The nearer limit is the one whose rounding matters to a reader.
    const toMin = toDecimal(value).minus(toDecimal(min!)).abs();
    const toMax = toDecimal(max!).minus(toDecimal(value)).abs();
    rounded = toMin.lessThanOrEqualTo(toMax) ? atMin : atMax;
  } else rounded = (atMin ?? atMax)!;
  return {
    conforms: !belowMin && !aboveMax,
    rounded,
    ...(atMin !== undefined ? { atMin } : {}),
    ...(atMax !== undefined ? { atMax } : {}),
  };
}

/** ASTM E29's absolute method: no rounding; any deviation beyond the limit does not conform. */
export function conformsAbsolutely(value: string, min?: string, max?: string): boolean {
  return (
    (min === undefined || compareDecimal(value, min) >= 0) && (max === undefined || compareDecimal(value, max) <= 0)
  );
}
