import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import {
  aluminiumEquivalent,
  alloyClass,
  molybdenumEquivalentBania,
  molybdenumEquivalentBoyer,
  oxygenEquivalent,
} from '@shared/domain/materials/titanium-indices';

// Test vectors: the domain sheet §3.2 table, computed there from the formulas (each formula's
// coefficients are unverified, tagged [M] on the sheet) and printed to 2–3 decimals. We compute
// in exact decimals, so each check allows half a unit of the printed place.
const near = (value: string, printed: string, places: number) =>
  expect(
    new Decimal(value)
      .minus(printed)
      .abs()
      .lessThanOrEqualTo(new Decimal(0.5).times(new Decimal(10).pow(-places))),
  ).toBe(true);

const vectors: Array<{
  alloy: string;
  chemistry: Record<string, string>;
  boyer: string;
  bania: string;
  al: string;
  oeq: string;
}> = [
  {
    alloy: 'Ti-6Al-4V ELI',
    chemistry: { Al: '6', V: '4', Fe: '0.15', O: '0.10', C: '0.02', N: '0.01' },
    boyer: '-2.88',
    bania: '3.06',
    al: '7.40',
    oeq: '0.133',
  },
  {
    alloy: 'Ti-6Al-7Nb',
    chemistry: { Al: '6', Nb: '7', Fe: '0.15', O: '0.15', C: '0.02', N: '0.01' },
    boyer: '-3.60',
    bania: '2.33',
    al: '7.90',
    oeq: '0.183',
  },
  {
    alloy: 'CP-Ti grade 4 at its limits',
    chemistry: { O: '0.40', N: '0.05', C: '0.08', Fe: '0.50' },
    boyer: '1.45',
    bania: '1.25',
    al: '5.80',
    oeq: '0.554',
  },
  {
    alloy: 'Ti-15Mo',
    chemistry: { Mo: '15', Fe: '0.05', O: '0.15' },
    boyer: '15.14',
    bania: '15.12',
    al: '1.50',
    oeq: '0.150',
  },
];

describe('titanium indices', () => {
  for (const vector of vectors) {
    it(`when computing the indices of ${vector.alloy}, then they match the domain sheet`, () => {
      near(molybdenumEquivalentBoyer(vector.chemistry).value, vector.boyer, 2);
      near(molybdenumEquivalentBania(vector.chemistry).value, vector.bania, 2);
      near(aluminiumEquivalent(vector.chemistry).value, vector.al, 2);
      near(oxygenEquivalent(vector.chemistry).value, vector.oeq, 3);
    });
  }

  // Alloy classes as the trade knows them (common practice): unalloyed grades are alpha, Ti-6Al-4V
  // ("grade 5") and its ELI variant alpha-beta, Ti-15Mo metastable beta. Nominal compositions unverified.
  const classes: Array<[string, Record<string, string>, string]> = [
    ['CP-Ti grade 2 (nominal Fe 0.10)', { O: '0.18', Fe: '0.10', N: '0.01', C: '0.01' }, 'alpha'],
    ['CP-Ti grade 4 (nominal Fe 0.30)', { O: '0.35', Fe: '0.30', N: '0.02', C: '0.02' }, 'alpha'],
    ['Ti-6Al-4V grade 5 (Fe 0.20)', { Al: '6', V: '4', Fe: '0.20', O: '0.18' }, 'alpha-beta'],
    ['Ti-6Al-4V ELI (Fe 0.15)', { Al: '6', V: '4', Fe: '0.15', O: '0.10' }, 'alpha-beta'],
    ['Ti-15Mo', { Mo: '15', Fe: '0.05', O: '0.15' }, 'metastable-beta'],
  ];
  for (const [alloy, chemistry, expected] of classes) {
    it(`when classifying ${alloy}, then it is ${expected}`, () => {
      expect(alloyClass(molybdenumEquivalentBania(chemistry).value).alloyClass).toBe(expected);
    });
  }
});
