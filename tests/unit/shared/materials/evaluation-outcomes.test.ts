import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluateAgainst, evaluateCertificate } from '@shared/domain/materials/evaluate-certificate';
import { specificationLibrary } from '@shared/domain/materials/library';
import {
  mechanicalProperties,
  productConditions,
  productForms,
  scopeOf,
  type Specification,
  type SpecificationGrade,
} from '@shared/domain/materials/specification';
import { certificateInputSchema, readStoredEvaluation } from '@shared/schemas/evaluation';

// Regression cases for verdicts that must not pass. Sources: the domain reference sheet's sections
// named beside each case (ASTM F67-13 scope, F136 table, BSSA on ISO 5832-1, ASTM E29 rounding
// method as described by ASTM Standardization News, "Data Points").

const f67Chemistry = { N: '0.01', C: '0.01', H: '0.002', Fe: '0.10', O: '0.15' };
const f136Chemistry = { Al: '6.1', V: '4.0', Fe: '0.18', O: '0.12', C: '0.02', N: '0.01', H: '0.004' };
const iso58321Chemistry = {
  C: '0.020',
  Si: '0.5',
  Mn: '1.5',
  P: '0.015',
  S: '0.002',
  Cr: '18.0',
  Mo: '2.80',
  Ni: '14.0',
  N: '0.05',
  Cu: '0.10',
};
const f1537Chemistry = { C: '0.05', Cr: '28', Mo: '6', Ni: '0.5', Fe: '0.3', Si: '0.5', Mn: '0.5', N: '0.1' };

describe('no silent pass when no requirement applies', () => {
  it(
    'when F67 grade 2 plate reports a tensile strength of 200 MPa, then it cannot be evaluated, never conforms ' +
      '(F67-13 scope covers plate; plate has its own table, S3/S4)',
    () => {
      const evaluation = evaluateCertificate({
        spec: 'ASTM F67',
        grade: '2',
        form: 'plate',
        sizeMm: '6',
        chemistry: f67Chemistry,
        mechanical: { utsMPa: '200' },
      });
      expect(evaluation.verdict).toBe('cannot-be-evaluated');
      expect(evaluation.items.find((item) => item.kind === 'selection')).toMatchObject({
        verdict: 'cannot-be-evaluated',
        reason: 'no-requirement',
      });
      expect(evaluation.items.find((item) => item.kind === 'selection')?.note).toContain(
        'no mechanical requirements for plate',
      );
    },
  );

  it(
    'when F136 bar says "Annealed" with UTS 500 MPa and 3 % elongation, then the annealed minima apply and it ' +
      'does not conform (F136 ≥ 860 MPa, ≥ 10 %)',
    () => {
      const evaluation = evaluateCertificate({
        spec: 'ASTM F136',
        form: 'bar',
        condition: 'Annealed',
        sizeMm: '25',
        chemistry: f136Chemistry,
        mechanical: { utsMPa: '500', ysMPa: '450', elongationPct: '3', reductionOfAreaPct: '30' },
      });
      expect(evaluation.verdict).toBe('does-not-conform');
      expect(evaluation.items.filter((item) => item.verdict === 'does-not-conform').map((item) => item.item)).toEqual([
        'Tensile strength (MPa)',
        '0.2 % yield strength (MPa)',
        'Elongation (%)',
      ]);
    },
  );

  it('when a condition is typed freely, then it is refused instead of matching nothing', () => {
    expect(certificateInputSchema.safeParse({ spec: 'ASTM F136', condition: 'mill annealed' }).success).toBe(false);
    expect(certificateInputSchema.parse({ spec: 'ASTM F136', condition: ' Cold Worked ' }).condition).toBe(
      'cold-worked',
    );
  });

  it(
    'when the form is outside the scope, the size outside every range, or the specification holds no mechanical ' +
      'minima, then each cannot be evaluated',
    () => {
      const mechanical = { utsMPa: '2000', ysMPa: '2000', elongationPct: '50', reductionOfAreaPct: '60' };
      for (const [input, note] of [
        [{ spec: 'ASTM F136', form: 'plate', sizeMm: '10' }, 'plate is not a product form'],
        [{ spec: 'ASTM F136', form: 'bar', sizeMm: '120' }, '120 mm is outside every size range'],
        [{ spec: 'ASTM F136', form: 'bar', condition: 'cold-worked', sizeMm: '20' }, 'cold worked is not a condition'],
        [{ spec: 'ISO 5832-1', grade: 'D', form: 'bar', sizeMm: '20' }, 'holds no mechanical requirements'],
        [
          { spec: 'ASTM F138', form: 'bar', condition: 'extra-hard', sizeMm: '10' },
          'no mechanical requirements for bar in the extra hard condition',
        ],
      ] as const) {
        const chemistry =
          input.spec === 'ISO 5832-1'
            ? iso58321Chemistry
            : input.spec === 'ASTM F138'
              ? { ...iso58321Chemistry, Cr: '18.00', Ni: '14.00', Mo: '2.80', Si: '0.40', Mn: '1.50' }
              : f136Chemistry;
        const evaluation = evaluateCertificate({ ...input, chemistry, mechanical });
        expect(evaluation.verdict, note).toBe('cannot-be-evaluated');
        expect(evaluation.items.find((item) => item.kind === 'selection')?.note, note).toContain(note);
      }
    },
  );

  it(
    'when F136 bar is under 4.75 mm, then reduction of area is not asked for (the table gives none) and the ' +
      'rest decides',
    () => {
      const evaluation = evaluateCertificate({
        spec: 'ASTM F136',
        form: 'wire',
        sizeMm: '3',
        chemistry: f136Chemistry,
        mechanical: { utsMPa: '900', ysMPa: '800', elongationPct: '12' },
      });
      expect(evaluation.verdict).toBe('conforms');
      expect(evaluation.items.some((item) => item.item === 'Reduction of area (%)')).toBe(false);
    },
  );
});

describe('condition chooses the requirement set', () => {
  it(
    'when a cold-worked F138 bar reports 1000 / 800 MPa / 15 %, then it is judged against the cold-worked ' +
      'minima and conforms on unverified limits (F138 cold-worked 860/690/12, §1.5 [M])',
    () => {
      const chemistry = {
        C: '0.020',
        Mn: '1.50',
        P: '0.015',
        S: '0.002',
        Si: '0.40',
        Cr: '18.00',
        Ni: '14.00',
        Mo: '2.80',
        N: '0.05',
        Cu: '0.10',
      };
      const mechanical = { utsMPa: '1000', ysMPa: '800', elongationPct: '15' };
      const coldWorked = evaluateCertificate({
        spec: 'ASTM F138',
        form: 'bar',
        condition: 'cold-worked',
        sizeMm: '10',
        chemistry,
        mechanical,
      });
      expect(coldWorked.verdict).toBe('conforms');
      expect(coldWorked.items.find((item) => item.item === 'Elongation (%)')).toMatchObject({
        limit: '≥ 12',
        verdict: 'conforms',
        unverified: true,
      });
      expect(coldWorked.restsOnUnverified).toEqual(
        expect.arrayContaining(['Mn', 'Si', 'Cr + 3.3 × Mo', 'Tensile strength (MPa)', 'Elongation (%)']),
      );
      const asAnnealed = evaluateCertificate({
        spec: 'ASTM F138',
        form: 'bar',
        condition: 'annealed',
        sizeMm: '10',
        chemistry,
        mechanical,
      });
      expect(asAnnealed.items.find((item) => item.item === 'Elongation (%)')).toMatchObject({
        limit: '≥ 40',
        verdict: 'does-not-conform',
      });
    },
  );
});

describe('each limit rounds at its own place (ASTM E29 rounding method)', () => {
  const iso = (mo: string) =>
    evaluateCertificate({
      spec: 'ISO 5832-1',
      grade: 'D',
      form: 'bar',
      sizeMm: '10',
      chemistry: { ...iso58321Chemistry, Mo: mo },
    }).items.find((item) => item.item === 'Mo');

  it(
    'when ISO 5832-1 Mo 2.25–3.5 reports 3.54, then it is rounded to 3.5 against the maximum and conforms (one ' +
      'decimal, as the maximum is written)',
    () => {
      expect(iso('3.54')).toMatchObject({ rounded: '3.5', verdict: 'conforms' });
    },
  );

  it(
    'when it reports 3.55, then it rounds to 3.6 (5 after an odd 5 goes up) and does not conform; 3.45 rounds ' +
      'to 3.4 and conforms',
    () => {
      expect(iso('3.55')).toMatchObject({ rounded: '3.6', verdict: 'does-not-conform' });
      expect(iso('3.45')).toMatchObject({ verdict: 'conforms' });
    },
  );

  it(
    'when it reports 2.245, then it is rounded to 2.24 against the minimum 2.25 (two decimals, half to even) ' +
      'and does not conform',
    () => {
      expect(iso('2.245')).toMatchObject({ rounded: '2.24', verdict: 'does-not-conform' });
      expect(iso('2.255')).toMatchObject({ rounded: '2.26', verdict: 'conforms' });
    },
  );
});

describe('limits whose written form is unverified', () => {
  const f1537 = (chemistry: Record<string, string>) =>
    evaluateCertificate({
      spec: 'ASTM F1537',
      grade: '1',
      form: 'bar',
      sizeMm: '20',
      chemistry: { ...f1537Chemistry, ...chemistry },
      mechanical: { utsMPa: '950', ysMPa: '600', elongationPct: '25', reductionOfAreaPct: '25' },
    });

  it(
    'when F1537 Cr 25.6 passes only because 26 is stored without decimals, then Cr cannot be evaluated and says ' +
      'so',
    () => {
      const evaluation = f1537({ Cr: '25.6' });
      expect(evaluation.verdict).toBe('cannot-be-evaluated');
      expect(evaluation.items.find((item) => item.item === 'Cr')).toMatchObject({
        rounded: '26',
        verdict: 'cannot-be-evaluated',
        reason: 'unverified-written-form',
        unverified: true,
      });
    },
  );

  it(
    'when Cr 25.4 fails at every place, or 27.3 passes at every place, then a verdict is given, marked as ' +
      'resting on an unverified limit',
    () => {
      expect(f1537({ Cr: '25.4' }).items.find((item) => item.item === 'Cr')).toMatchObject({
        verdict: 'does-not-conform',
      });
      const inside = f1537({ Cr: '27.3' });
      expect(inside.items.find((item) => item.item === 'Cr')).toMatchObject({ verdict: 'conforms', unverified: true });
      expect(inside.restsOnUnverified).toContain('Cr');
    },
  );

  it(
    'when ISO 5832-1 Cr + 3.3 Mo is 25.9 against a minimum written "26" by the source, then it cannot be ' +
      'evaluated (26.0 would fail it)',
    () => {
      const evaluation = evaluateCertificate({
        spec: 'ISO 5832-1',
        grade: 'D',
        form: 'bar',
        sizeMm: '10',
        chemistry: { ...iso58321Chemistry, Cr: '17.32', Mo: '2.60' },
      });
      expect(evaluation.items.find((item) => item.kind === 'requirement')).toMatchObject({
        reported: '25.9',
        rounded: '26',
        verdict: 'cannot-be-evaluated',
        reason: 'unverified-written-form',
      });
    },
  );

  it(
    'when F1295 Nb reports 6.46 against 6.5 (weak source), then it cannot be evaluated; 6.50 conforms either ' + 'way',
    () => {
      const f1295 = (nb: string) =>
        evaluateCertificate({
          spec: 'ASTM F1295',
          form: 'bar',
          sizeMm: '20',
          chemistry: { Al: '6.00', Nb: nb, Ta: '0.10', Fe: '0.10', O: '0.10', C: '0.02', N: '0.01', H: '0.003' },
        }).items.find((item) => item.item === 'Nb');
      expect(f1295('6.46')).toMatchObject({ verdict: 'cannot-be-evaluated', reason: 'unverified-written-form' });
      expect(f1295('6.50')).toMatchObject({ verdict: 'conforms', unverified: true });
    },
  );
});

describe('evaluations stored before the third outcome', () => {
  it(
    'when an evaluation says "incomplete" with "missing" items, then it reads as cannot be evaluated (missing ' +
      'value)',
    () => {
      const stored = {
        verdict: 'incomplete',
        items: [
          {
            item: 'H',
            kind: 'chemistry',
            reported: null,
            rounded: null,
            limit: '≤ 0.012',
            verdict: 'missing',
            note: 'not reported',
            source: 's',
            confidence: 'secondary',
          },
        ],
        derived: {},
        flags: [],
        spec: { id: 'ASTM F136', revision: 'L1', edition: 'x', grade: null },
        caution: 'c',
      };
      const read = readStoredEvaluation(stored);
      expect(read.verdict).toBe('cannot-be-evaluated');
      expect(read.items[0]).toMatchObject({
        verdict: 'cannot-be-evaluated',
        reason: 'missing-value',
        unverified: false,
      });
    },
  );
});

/** Values inside every limit of a grade, so that only the choice of requirements can change the verdict. */
function passingChemistry(grade: SpecificationGrade): Record<string, string> {
  const chemistry: Record<string, string> = {};
  for (const limit of grade.chemistry) {
    if (limit.min !== undefined && limit.max !== undefined)
      chemistry[limit.element] = String((Number(limit.min) + Number(limit.max)) / 2);
    else chemistry[limit.element] = limit.min ?? '0';
  }
  for (const requirement of grade.weightedSums) for (const term of requirement.terms) chemistry[term.element] ??= '0';
  return chemistry;
}

describe('the whole shipped library', () => {
  it(
    'when any form × condition × size is evaluated with every value passing, then "conforms" only comes with a ' +
      'requirement applied to every mechanical property the grade lists',
    () => {
      const cases = specificationLibrary.flatMap((specification) =>
        specification.grades.map((grade) => ({ specification, grade })),
      );
      const size = fc.oneof(
        fc.constantFrom('0.5', '3', '3.18', '4.75', '44.45', '44.46', '63.50', '101.60', '101.61', '250'),
        fc.integer({ min: 1, max: 300_000 }).map((hundredths) => (hundredths / 100).toFixed(2)),
      );
      fc.assert(
        fc.property(
          fc.constantFrom(...cases),
          fc.constantFrom(...productForms),
          fc.constantFrom(...productConditions),
          size,
          ({ specification, grade }, form, condition, sizeMm) => {
            const evaluation = evaluateAgainst(
              specification as Specification,
              certificateInputSchema.parse({
                spec: specification.id,
                grade: grade.grade,
                form,
                condition,
                sizeMm,
                chemistry: passingChemistry(grade),
                mechanical: { utsMPa: '9999', ysMPa: '9999', elongationPct: '99', reductionOfAreaPct: '99' },
              }),
            );
            if (evaluation.verdict !== 'conforms') return;
            const listed =
              grade.mechanicalProperties ??
              mechanicalProperties.filter((property) =>
                grade.mechanical.some((set) => set.limits.some((limit) => limit.property === property)),
              );
            expect(listed.length, `${specification.id}: conforms with no mechanical property listed`).toBeGreaterThan(
              0,
            );
            const scope = scopeOf(specification);
            expect(scope.forms).toContain(form);
            expect(scope.conditions).toContain(condition);
            const applied = grade.mechanical.filter((set) => set.forms.includes(form) && set.condition === condition);
            for (const property of listed) {
              const judged = evaluation.items.some(
                (item) =>
                  item.kind === 'mechanical' &&
                  item.verdict === 'conforms' &&
                  item.item.startsWith(
                    property === 'utsMPa'
                      ? 'Tensile'
                      : property === 'ysMPa'
                        ? '0.2 %'
                        : property === 'elongationPct'
                          ? 'Elongation'
                          : 'Reduction',
                  ),
              );
              const explicitlyNotRequired = applied.some((set) =>
                set.notRequired?.some((entry) => entry.property === property),
              );
              expect(
                judged || explicitlyNotRequired,
                `${specification.id} ${form} ${condition} ${sizeMm} mm: ${property} neither judged nor marked ` +
                  `not required`,
              ).toBe(true);
            }
          },
        ),
        { numRuns: 3000 },
      );
    },
  );

  it('when a passing heat drops any one mechanical value, then it never conforms', () => {
    for (const specification of specificationLibrary) {
      for (const grade of specification.grades) {
        for (const set of grade.mechanical) {
          const sizeMm = set.size
            ? set.size.fromMm === '0'
              ? '1'
              : (Number(set.size.fromMm) + 0.01).toFixed(2)
            : '20';
          for (const dropped of set.limits) {
            const mechanical = Object.fromEntries(
              set.limits.filter((limit) => limit !== dropped).map((limit) => [limit.property, '9999']),
            );
            const evaluation = evaluateAgainst(
              specification,
              certificateInputSchema.parse({
                spec: specification.id,
                grade: grade.grade,
                form: set.forms[0],
                condition: set.condition,
                sizeMm,
                chemistry: passingChemistry(grade),
                mechanical,
              }),
            );
            expect(evaluation.verdict, `${specification.id} without ${dropped.property}`).not.toBe('conforms');
          }
        }
      }
    }
  });
});
