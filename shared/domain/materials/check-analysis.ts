// The device maker's own (independent) check analysis of a heat: which heats a sampling rule
// selects, and how a check result is judged against the heat limits widened by the
// specification's product-analysis tolerances. Pure: no database, no clock.
import { compareDecimal, decimalsOf, roundE29, toDecimal } from './e29-rounding';
import { readChemistryValue, ReportedValueError } from './reported-value';
import type { ElementLimit } from './specification';

export type SupplierApproval = 'approved' | 'conditional' | 'disqualified';

/**
 * A sampling rule: every Nth heat of a supplier and specification, and/or every heat while the supplier is conditional.
 */
export interface CheckRule {
  /** null: no sampling by count. */
  everyNthHeat: number | null;
  everyHeatWhenConditional: boolean;
}

/** A rule and the scope it was set for; null means "any". */
export interface ScopedCheckRule extends CheckRule {
  supplierId: number | null;
  specId: string | null;
}

/**
 * The most specific rule for a supplier and specification: both named, then the supplier, then the specification, then
 * the plant-wide one.
 */
export function applicableRule<T extends ScopedCheckRule>(
  rules: readonly T[],
  supplierId: number,
  specId: string,
): T | null {
  const specKey = specId.toUpperCase();
  const matches = (rule: T, bySupplier: boolean, bySpec: boolean) =>
    (bySupplier ? rule.supplierId === supplierId : rule.supplierId === null) &&
    (bySpec ? rule.specId?.toUpperCase() === specKey : rule.specId === null);
  for (const [bySupplier, bySpec] of [
    [true, true],
    [true, false],
    [false, true],
    [false, false],
  ] as const) {
    const found = rules.find((rule) => matches(rule, bySupplier, bySpec));
    if (found) return found;
  }
  return null;
}

export interface CheckRequirement {
  required: boolean;
  why: string;
}

export function ordinal(n: number): string {
  const tens = n % 100;
  const suffix = tens >= 11 && tens <= 13 ? 'th' : (['th', 'st', 'nd', 'rd'][n % 10] ?? 'th');
  return `${n}${suffix}`;
}

/**
 * Whether the heat at `position` (1 = the first heat received from this supplier to this
 * specification) needs a check analysis. "Every Nth heat" selects the first heat and every Nth
 * after it (1, 1 + N, 1 + 2N, …), so a new source is always checked first.
 */
export function checkRequirement(
  rule: CheckRule | null,
  position: number,
  approval: SupplierApproval,
): CheckRequirement {
  if (!Number.isInteger(position) || position < 1)
    throw new Error(`position must be a whole number from 1, not ${position}`);
  if (!rule) return { required: false, why: 'No check analysis rule covers this supplier and specification' };
  if (rule.everyNthHeat !== null && (!Number.isInteger(rule.everyNthHeat) || rule.everyNthHeat < 1))
    throw new Error(`everyNthHeat must be a whole number from 1, not ${rule.everyNthHeat}`);
  if (rule.everyHeatWhenConditional && approval === 'conditional')
    return { required: true, why: 'Every heat from a conditionally approved supplier is checked' };
  if (rule.everyNthHeat !== null) {
    const place = `this is the ${ordinal(position)} heat from this supplier to this specification`;
    if (rule.everyNthHeat === 1)
      return { required: true, why: 'Every heat from this supplier to this specification is checked' };
    if ((position - 1) % rule.everyNthHeat === 0)
      return {
        required: true,
        why: `The first heat and every ${ordinal(rule.everyNthHeat)} after it are checked; ${place}`,
      };
    const next = position + rule.everyNthHeat - ((position - 1) % rule.everyNthHeat);
    return {
      required: false,
      why:
        `The first heat and every ${ordinal(rule.everyNthHeat)} after it are checked; ${place}, the next is the ` +
        `${ordinal(next)}`,
    };
  }
  return {
    required: false,
    why: rule.everyHeatWhenConditional
      ? 'Only heats from conditionally approved suppliers are checked; this supplier is ' + approval
      : 'The rule selects no heats',
  };
}

/**
 * "the first heat and every 5th after it; every heat while the supplier is conditional", or null when the rule selects
 * nothing.
 */
export function ruleText(rule: CheckRule): string | null {
  const parts = [
    rule.everyNthHeat === null
      ? null
      : rule.everyNthHeat === 1
        ? 'every heat'
        : `the first heat and every ${ordinal(rule.everyNthHeat)} after it`,
    rule.everyHeatWhenConditional ? 'every heat while the supplier is conditional' : null,
  ].filter((part): part is string => part !== null);
  return parts.length ? parts.join('; ') : null;
}

export type CheckItemVerdict = 'within-limit' | 'within-tolerance' | 'beyond-tolerance' | 'not-measured';

export interface CheckItem {
  element: string;
  /** The value in wt % as read (ppm converted), or null when not measured. */
  value: string | null;
  /** Rounded (ASTM E29) to the place of the widened limit. */
  rounded: string | null;
  heatLimit: string;
  /** The heat limit widened by the tolerance, e.g. "≤ 0.15" for ≤ 0.13 with 0.02 over. */
  checkLimit: string;
  verdict: CheckItemVerdict;
  note?: string;
}

export interface CheckEvaluation {
  verdict: 'conforms' | 'does-not-conform';
  items: CheckItem[];
}

export class CheckAnalysisInputError extends Error {
  constructor(
    message: string,
    readonly fields: Record<string, string>,
  ) {
    super(message);
  }
}

function rangeText(min?: string, max?: string): string {
  if (min !== undefined && max !== undefined) return `${min}–${max}`;
  if (max !== undefined) return `≤ ${max}`;
  return `≥ ${min}`;
}

function widen(limit: ElementLimit): { min?: string; max?: string; decimals: number } {
  const under = limit.tolerance?.under;
  const over = limit.tolerance?.over;
  const decimals = Math.max(
    ...[limit.min, limit.max, limit.min !== undefined ? under : undefined, limit.max !== undefined ? over : undefined]
      .filter((v): v is string => v !== undefined)
      .map(decimalsOf),
  );
  return {
    ...(limit.min !== undefined
      ? { min: under !== undefined ? toDecimal(limit.min).minus(toDecimal(under)).toFixed(decimals) : limit.min }
      : {}),
    ...(limit.max !== undefined
      ? { max: over !== undefined ? toDecimal(limit.max).plus(toDecimal(over)).toFixed(decimals) : limit.max }
      : {}),
    decimals,
  };
}

/** Each element's heat limit and the limit a check analysis is held to. */
export function checkLimitsOf(
  chemistry: readonly ElementLimit[],
): Array<{ element: string; heatLimit: string; checkLimit: string }> {
  return chemistry.map((limit) => {
    const widened = widen(limit);
    return {
      element: limit.element,
      heatLimit: rangeText(limit.min, limit.max),
      checkLimit: rangeText(widened.min, widened.max),
    };
  });
}

function inside(value: string, min?: string, max?: string): boolean {
  return (
    (min === undefined || compareDecimal(value, min) >= 0) && (max === undefined || compareDecimal(value, max) <= 0)
  );
}

/**
 * Judges a check analysis: each measured element, rounded by ASTM E29 to the place of its widened
 * limit, may lie outside the heat limit by no more than the product-analysis tolerance. Elements
 * without a tolerance in the library are held to the heat limit. At least one element must be
 * measured; elements not measured are listed as such and do not fail the check.
 */
export function evaluateCheckAnalysis(
  chemistry: readonly ElementLimit[],
  results: Record<string, string>,
): CheckEvaluation {
  const fields: Record<string, string> = {};
  const values: Record<string, string> = {};
  for (const [element, raw] of Object.entries(results)) {
    if (!chemistry.some((limit) => limit.element === element)) {
      fields[`chemistry.${element}`] = 'The specification sets no limit for this element';
      continue;
    }
    try {
      values[element] = readChemistryValue(raw).value;
    } catch (error) {
      if (!(error instanceof ReportedValueError)) throw error;
      fields[`chemistry.${element}`] = error.message;
    }
  }
  if (Object.keys(fields).length)
    throw new CheckAnalysisInputError('Some check analysis results cannot be judged', fields);
  if (!Object.keys(values).length)
    throw new CheckAnalysisInputError('Enter at least one measured element', { chemistry: 'No element measured' });

  const items: CheckItem[] = chemistry.map((limit) => {
    const heatLimit = rangeText(limit.min, limit.max);
    const widened = widen(limit);
    const checkLimit = rangeText(widened.min, widened.max);
    const value = values[limit.element];
    if (value === undefined)
      return { element: limit.element, value: null, rounded: null, heatLimit, checkLimit, verdict: 'not-measured' };
    // Rounded once to the heat limit's place to compare with it, once to the widened limit's place to compare with
    // that.
    const atHeatPlace = roundE29(
      value,
      Math.max(...[limit.min, limit.max].filter((v): v is string => v !== undefined).map(decimalsOf)),
    );
    const rounded = roundE29(value, widened.decimals);
    const note = limit.tolerance ? undefined : 'no product-analysis tolerance in the library: held to the heat limit';
    const verdict: CheckItemVerdict = inside(atHeatPlace, limit.min, limit.max)
      ? 'within-limit'
      : inside(rounded, widened.min, widened.max)
        ? 'within-tolerance'
        : 'beyond-tolerance';
    return { element: limit.element, value, rounded, heatLimit, checkLimit, verdict, ...(note ? { note } : {}) };
  });
  return {
    verdict: items.some((item) => item.verdict === 'beyond-tolerance') ? 'does-not-conform' : 'conforms',
    items,
  };
}

/** One line naming the elements beyond tolerance, for refusals and the ledger. */
export function checkFailureText(evaluation: CheckEvaluation): string {
  return evaluation.items
    .filter((item) => item.verdict === 'beyond-tolerance')
    .map((item) => `${item.element} ${item.rounded} outside ${item.checkLimit}`)
    .join('; ');
}
