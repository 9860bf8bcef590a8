import { Decimal } from 'decimal.js';
import { DecimalE29 } from './e29-rounding';

/**
 * Empirical indices for titanium heats, from the reported chemistry (wt %). Each formula names its
 * source; the coefficients and class thresholds are unverified where the sheet says so.
 */
export type Chemistry = Record<string, string>;

const get = (chemistry: Chemistry, element: string): Decimal => new DecimalE29(chemistry[element] ?? '0');
const sum = (chemistry: Chemistry, terms: Array<[string, string]>): Decimal =>
  terms.reduce((total, [element, factor]) => total.plus(get(chemistry, element).times(factor)), new DecimalE29(0));

/** Exact decimal value (display rounding is the screen's business); Sn/3 and Zr/6 are cut at 6 decimals. */
const trimmed = (value: Decimal): string => value.toDecimalPlaces(6).toFixed();

export interface TitaniumIndex {
  value: string;
  formula: string;
  source: string;
}

/** O-eq = O + 2N + 0.67C, for unalloyed grades (coefficients unverified, attributed to Ogden & Jaffee). */
export function oxygenEquivalent(chemistry: Chemistry): TitaniumIndex {
  return {
    value: sum(chemistry, [
      ['O', '1'],
      ['N', '2'],
      ['C', '0.67'],
    ]).toFixed(),
    formula: 'O + 2 N + 0.67 C',
    source: 'attributed to Ogden & Jaffee; coefficients unverified',
  };
}

/** [Al]eq = Al + Sn/3 + Zr/6 + 10 (O + C + 2N) (Rosenberg 1970; unverified). */
export function aluminiumEquivalent(chemistry: Chemistry): TitaniumIndex {
  const interstitials = sum(chemistry, [
    ['O', '1'],
    ['C', '1'],
    ['N', '2'],
  ]).times(10);
  const value = get(chemistry, 'Al')
    .plus(get(chemistry, 'Sn').div(3))
    .plus(get(chemistry, 'Zr').div(6))
    .plus(interstitials);
  return {
    value: trimmed(value),
    formula: 'Al + Sn/3 + Zr/6 + 10 (O + C + 2 N)',
    source: 'attributed to Rosenberg (1970); unverified',
  };
}

/** [Mo]eq after Bania (1993): Mo + 0.2 Ta + 0.28 Nb + 0.4 W + 0.67 V + 1.25 Cr + 1.25 Ni + 1.7 Mn + 1.7 Co + 2.5 Fe. */
export function molybdenumEquivalentBania(chemistry: Chemistry): TitaniumIndex {
  const terms: Array<[string, string]> = [
    ['Mo', '1'],
    ['Ta', '0.2'],
    ['Nb', '0.28'],
    ['W', '0.4'],
    ['V', '0.67'],
    ['Cr', '1.25'],
    ['Ni', '1.25'],
    ['Mn', '1.7'],
    ['Co', '1.7'],
    ['Fe', '2.5'],
  ];
  return {
    value: sum(chemistry, terms).toFixed(),
    formula: 'Mo + 0.2 Ta + 0.28 Nb + 0.4 W + 0.67 V + 1.25 Cr + 1.25 Ni + 1.7 Mn + 1.7 Co + 2.5 Fe',
    source: 'Bania (1993) form; coefficients unverified',
  };
}

/**
 * [Mo]eq after Boyer, Welsch & Collings (1994), Molchanova's concept: Mo + 0.67 V + 0.44 W + 0.28 Nb + 0.22 Ta + 2.9 Fe
 * + 1.6 Cr − Al.
 */
export function molybdenumEquivalentBoyer(chemistry: Chemistry): TitaniumIndex {
  const terms: Array<[string, string]> = [
    ['Mo', '1'],
    ['V', '0.67'],
    ['W', '0.44'],
    ['Nb', '0.28'],
    ['Ta', '0.22'],
    ['Fe', '2.9'],
    ['Cr', '1.6'],
    ['Al', '-1'],
  ];
  return {
    value: sum(chemistry, terms).toFixed(),
    formula: 'Mo + 0.67 V + 0.44 W + 0.28 Nb + 0.22 Ta + 2.9 Fe + 1.6 Cr − Al',
    source: 'Boyer, Welsch & Collings, Materials Properties Handbook: Titanium Alloys (1994); coefficients unverified',
  };
}

export type AlloyClass = 'alpha' | 'near-alpha' | 'alpha-beta' | 'metastable-beta' | 'beta';

/**
 * Alloy class from the Bania Mo-equivalent. Thresholds vary by author (unverified): alpha below
 * 1, near-alpha to 2, alpha-beta to 10 (βc), metastable beta to 30 (βs), stable beta above.
 */
export function alloyClass(molybdenumEquivalent: string): { alloyClass: AlloyClass; rule: string } {
  const value = new DecimalE29(molybdenumEquivalent);
  const rule =
    'Bania [Mo]eq: alpha < 1 ≤ near-alpha < 2 ≤ alpha-beta < 10 ≤ metastable beta < 30 ≤ beta (thresholds ' +
    'vary by author; unverified)';
  if (value.lessThan(1)) return { alloyClass: 'alpha', rule };
  if (value.lessThan(2)) return { alloyClass: 'near-alpha', rule };
  if (value.lessThan(10)) return { alloyClass: 'alpha-beta', rule };
  if (value.lessThan(30)) return { alloyClass: 'metastable-beta', rule };
  return { alloyClass: 'beta', rule };
}

/** The indices shown for titanium heats (empty for other families). */
export function titaniumIndices(family: string, chemistry: Chemistry): Record<string, TitaniumIndex | string> {
  if (family !== 'titanium-unalloyed' && family !== 'titanium-alloy') return {};
  const derived: Record<string, TitaniumIndex | string> = {};
  if (family === 'titanium-unalloyed') derived.oxygenEquivalent = oxygenEquivalent(chemistry);
  derived.aluminiumEquivalent = aluminiumEquivalent(chemistry);
  derived.molybdenumEquivalentBania = molybdenumEquivalentBania(chemistry);
  derived.molybdenumEquivalentBoyer = molybdenumEquivalentBoyer(chemistry);
  const classified = alloyClass(molybdenumEquivalentBania(chemistry).value);
  derived.alloyClass = classified.alloyClass;
  derived.alloyClassRule = classified.rule;
  return derived;
}
