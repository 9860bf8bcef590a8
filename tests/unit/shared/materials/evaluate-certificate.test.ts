import { describe, expect, it } from 'vitest';
import { evaluateCertificate, EvaluationInputError } from '@shared/domain/materials/evaluate-certificate';
import { readChemistryValue } from '@shared/domain/materials/reported-value';

const f136 = {
  spec: 'ASTM F136',
  grade: null,
  form: 'bar' as const,
  sizeMm: '25',
  chemistry: { Al: '6.1', V: '4.0', Fe: '0.18', O: '0.12', C: '0.02', N: '0.01', H: '0.004' },
  mechanical: { utsMPa: '950', ysMPa: '880', elongationPct: '14', reductionOfAreaPct: '40' },
};

describe('certificate evaluation', () => {
  it(
    'when an F136 bar certificate is inside every limit, then it conforms item by item (limits: F136 Table 1 ' +
      'and bar minima as reproduced by bktitanium)',
    () => {
      const evaluation = evaluateCertificate(f136);
      expect(evaluation.verdict).toBe('conforms');
      expect(evaluation.spec).toMatchObject({ id: 'ASTM F136', revision: 'L2', grade: null });
      expect(evaluation.items.find((item) => item.item === 'O')).toMatchObject({
        reported: '0.12',
        rounded: '0.12',
        limit: '≤ 0.13',
        verdict: 'conforms',
      });
      expect(evaluation.items.find((item) => item.item === 'Al')).toMatchObject({
        rounded: '6.10',
        limit: '5.50–6.50',
      });
      expect(evaluation.items.find((item) => item.item === 'Tensile strength (MPa)')).toMatchObject({
        reported: '950',
        limit: '≥ 860',
        verdict: 'conforms',
      });
      expect(evaluation.items.find((item) => item.item === 'Reduction of area (%)')).toMatchObject({ limit: '≥ 25' });
      expect(evaluation.derived.alloyClass).toBe('alpha-beta');
    },
  );

  it(
    'when the bar is above 44.45 mm, then the lower minima of the next size range apply (F136, 44.45–63.50 mm: ' +
      '825/760/8/20)',
    () => {
      const evaluation = evaluateCertificate({
        ...f136,
        sizeMm: '50',
        mechanical: { utsMPa: '830', ysMPa: '765', elongationPct: '8', reductionOfAreaPct: '20' },
      });
      expect(evaluation.verdict).toBe('conforms');
      expect(evaluation.items.find((item) => item.item === 'Tensile strength (MPa)')?.limit).toBe('≥ 825');
      expect(
        evaluateCertificate({
          ...f136,
          sizeMm: '25',
          mechanical: { utsMPa: '830', ysMPa: '765', elongationPct: '8', reductionOfAreaPct: '20' },
        }).verdict,
      ).toBe('does-not-conform');
    },
  );

  it(
    'when oxygen is over the ELI limit, then the heat does not conform (F136 O ≤ 0.13; grade 5 material at 0.18 ' +
      'O)',
    () => {
      const evaluation = evaluateCertificate({ ...f136, chemistry: { ...f136.chemistry, O: '0.18' } });
      expect(evaluation.verdict).toBe('does-not-conform');
      expect(evaluation.items.filter((item) => item.verdict === 'does-not-conform').map((item) => item.item)).toEqual([
        'O',
      ]);
    },
  );

  it('when a required value is missing, then it cannot be evaluated and the item says why', () => {
    const { H: _h, ...withoutHydrogen } = f136.chemistry;
    const evaluation = evaluateCertificate({ ...f136, chemistry: withoutHydrogen });
    expect(evaluation.verdict).toBe('cannot-be-evaluated');
    expect(evaluation.items.find((item) => item.item === 'H')).toMatchObject({
      reported: null,
      verdict: 'cannot-be-evaluated',
      reason: 'missing-value',
      note: 'not reported',
    });
  });

  it(
    'when the size is not given for a size-dependent specification, then the mechanical items cannot be ' + 'evaluated',
    () => {
      const { sizeMm: _size, ...withoutSize } = f136;
      const evaluation = evaluateCertificate(withoutSize);
      expect(evaluation.verdict).toBe('cannot-be-evaluated');
      expect(evaluation.items.find((item) => item.kind === 'selection')).toMatchObject({
        verdict: 'cannot-be-evaluated',
        reason: 'missing-value',
      });
    },
  );

  it('when hydrogen is given in ppm, then it is converted explicitly (1 ppm = 0.0001 wt %) and shown', () => {
    expect(readChemistryValue('40 ppm')).toEqual({
      value: '0.0040',
      asReported: '40 ppm',
      conversion: '40 ppm = 0.0040 %',
    });
    expect(readChemistryValue('125ppm').value).toBe('0.0125');
    const evaluation = evaluateCertificate({ ...f136, chemistry: { ...f136.chemistry, H: '130 ppm' } });
    expect(evaluation.items.find((item) => item.item === 'H')).toMatchObject({
      reported: '0.0130',
      rounded: '0.013',
      verdict: 'does-not-conform',
      note: '130 ppm = 0.0130 %',
    });
  });

  it(
    'when hydrogen looks like ppm entered as %, or a value is impossibly precise or out of range, then it is ' +
      'flagged',
    () => {
      const evaluation = evaluateCertificate({
        ...f136,
        chemistry: { ...f136.chemistry, H: '40', O: '0.1234567', Fe: '-0.1' },
      });
      expect(evaluation.flags.map((flag) => `${flag.kind}:${flag.item}`).sort()).toEqual([
        'excess-precision:O',
        'looks-like-ppm:H',
        'out-of-range:Fe',
      ]);
    },
  );

  it(
    'when an unalloyed grade is evaluated, then the grade chooses the limits (F67: Fe ≤ 0.20 for grade 1, ≤ ' +
      '0.50 for grade 4)',
    () => {
      const certificate = {
        spec: 'astm f67',
        form: 'bar' as const,
        sizeMm: '20',
        chemistry: { N: '0.01', C: '0.01', H: '0.002', Fe: '0.35', O: '0.30' },
        mechanical: { utsMPa: '600', ysMPa: '500', elongationPct: '25', reductionOfAreaPct: '35' },
      };
      expect(evaluateCertificate({ ...certificate, grade: '4' }).verdict).toBe('conforms');
      const grade1 = evaluateCertificate({ ...certificate, grade: 1 });
      expect(grade1.items.filter((item) => item.verdict === 'does-not-conform').map((item) => item.item)).toEqual([
        'Fe',
        'O',
      ]);
      expect(() => evaluateCertificate({ ...certificate, grade: null })).toThrow(
        'ASTM F67 needs a grade: one of 1, 2, 3, 4',
      );
      expect(grade1.derived.oxygenEquivalent).toMatchObject({ formula: 'O + 2 N + 0.67 C' });
    },
  );

  it(
    'when stainless is checked against Cr + 3.3 × Mo ≥ 26.0, then the sum is rounded by E29 before comparing ' +
      '(test vectors on the domain sheet §1.5)',
    () => {
      const stainless = (cr: string, mo: string) =>
        evaluateCertificate({
          spec: 'ASTM F138',
          sizeMm: '10',
          chemistry: {
            C: '0.020',
            Mn: '1.50',
            P: '0.015',
            S: '0.002',
            Si: '0.40',
            Cr: cr,
            Ni: '14.20',
            Mo: mo,
            N: '0.05',
            Cu: '0.10',
          },
        }).items.find((item) => item.kind === 'requirement');
      expect(stainless('17.00', '2.25')).toMatchObject({
        reported: '24.425',
        rounded: '24.4',
        verdict: 'does-not-conform',
      });
      expect(stainless('17.60', '2.55')).toMatchObject({ reported: '26.015', rounded: '26.0', verdict: 'conforms' });
      expect(stainless('17.50', '2.55')).toMatchObject({
        reported: '25.915',
        rounded: '25.9',
        verdict: 'does-not-conform',
      });
    },
  );

  it('when the input is wrong, then a clear error names the field', () => {
    expect(() => evaluateCertificate({ ...f136, spec: 'ASTM X999' })).toThrow('Unknown specification "ASTM X999"');
    try {
      evaluateCertificate({ ...f136, chemistry: { ...f136.chemistry, O: 'about 0.1' } });
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(EvaluationInputError);
      expect((error as EvaluationInputError).fields).toEqual({
        'chemistry.O': '"about 0.1" is not a decimal number (write e.g. 0.12 or 40 ppm)',
      });
    }
    expect(() => evaluateCertificate({ ...f136, mechanical: { tensile: '900' } as never })).toThrow(
      'The certificate input is not valid',
    );
  });
});
