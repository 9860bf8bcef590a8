// The independent check analysis: which heats a sampling rule selects, and how a check result is
// judged. Tolerances are ASTM F136's product-analysis tolerances as reproduced in DOMAIN.md
// (source S5: Al ±0.40, V ±0.15, Fe +0.10, O +0.02, C +0.02, N +0.02, H +0.0020), and the rule
// that a check analysis may lie outside a heat limit by no more than the tolerance (DOMAIN.md,
// "Heat analysis vs product (check) analysis", S5). Rounding is ASTM E29 (half to even).
import { describe, expect, it } from 'vitest';
import {
  applicableRule,
  checkFailureText,
  checkRequirement,
  ruleText,
  evaluateCheckAnalysis,
  CheckAnalysisInputError,
  type ScopedCheckRule,
} from '@shared/domain/materials/check-analysis';
import { findSpecification } from '@shared/domain/materials/library';

const f136 = findSpecification('ASTM F136')!.grades[0]!.chemistry;
const f67Grade4 = findSpecification('ASTM F67')!.grades.find((grade) => grade.grade === '4')!.chemistry;
const f138 = findSpecification('ASTM F138')!.grades[0]!.chemistry;

function verdictOf(results: Record<string, string>, element: string) {
  return evaluateCheckAnalysis(f136, results).items.find((item) => item.element === element)!;
}

describe('judging a check analysis against the widened limits', () => {
  it(
    'oxygen in F136 (≤ 0.13, tolerance 0.02 over): 0.13 within the limit, 0.14 and 0.15 within the tolerance, ' +
      '0.16 beyond',
    () => {
      expect(verdictOf({ O: '0.13' }, 'O')).toMatchObject({
        rounded: '0.13',
        heatLimit: '≤ 0.13',
        checkLimit: '≤ 0.15',
        verdict: 'within-limit',
      });
      expect(verdictOf({ O: '0.14' }, 'O').verdict).toBe('within-tolerance');
      expect(verdictOf({ O: '0.15' }, 'O').verdict).toBe('within-tolerance');
      expect(verdictOf({ O: '0.16' }, 'O').verdict).toBe('beyond-tolerance');
    },
  );

  it('rounds by ASTM E29 before comparing: 0.145 → 0.14, 0.155 → 0.16, 0.134 → 0.13 (half to even)', () => {
    expect(verdictOf({ O: '0.134' }, 'O').verdict).toBe('within-limit');
    expect(verdictOf({ O: '0.155' }, 'O')).toMatchObject({ rounded: '0.16', verdict: 'beyond-tolerance' });
    expect(verdictOf({ O: '0.154' }, 'O')).toMatchObject({ rounded: '0.15', verdict: 'within-tolerance' });
    expect(verdictOf({ O: '0.145' }, 'O')).toMatchObject({ rounded: '0.14', verdict: 'within-tolerance' });
  });

  it('aluminium in F136 (5.50–6.50, ±0.40) widens both ways: 5.10 and 6.90 pass, 5.09 and 6.91 fail', () => {
    expect(verdictOf({ Al: '5.10' }, 'Al')).toMatchObject({ checkLimit: '5.10–6.90', verdict: 'within-tolerance' });
    expect(verdictOf({ Al: '6.90' }, 'Al').verdict).toBe('within-tolerance');
    expect(verdictOf({ Al: '5.09' }, 'Al').verdict).toBe('beyond-tolerance');
    expect(verdictOf({ Al: '6.91' }, 'Al').verdict).toBe('beyond-tolerance');
    expect(verdictOf({ Al: '6.05' }, 'Al').verdict).toBe('within-limit');
  });

  it(
    'hydrogen (≤ 0.012, +0.0020) is judged at the tolerance place and read from ppm: 140 ppm passes, 141 ppm ' +
      'fails',
    () => {
      expect(verdictOf({ H: '140 ppm' }, 'H')).toMatchObject({
        value: '0.0140',
        rounded: '0.0140',
        checkLimit: '≤ 0.0140',
        verdict: 'within-tolerance',
      });
      expect(verdictOf({ H: '141 ppm' }, 'H').verdict).toBe('beyond-tolerance');
      // 0.0124 rounds to the heat limit's place as 0.012: within the heat limit itself.
      expect(verdictOf({ H: '0.0124' }, 'H').verdict).toBe('within-limit');
    },
  );

  it(
    'F67 grade 4 iron (≤ 0.50) takes the 0.15 tolerance for limits over 0.25 (F67 tolerance table, DOMAIN.md ' +
      '§1.1, S1)',
    () => {
      const fe = evaluateCheckAnalysis(f67Grade4, { Fe: '0.65' }).items.find((item) => item.element === 'Fe')!;
      expect(fe).toMatchObject({ checkLimit: '≤ 0.65', verdict: 'within-tolerance' });
      expect(evaluateCheckAnalysis(f67Grade4, { Fe: '0.66' }).verdict).toBe('does-not-conform');
    },
  );

  it('an element without a tolerance in the library is held to the heat limit, and says so', () => {
    const carbon = evaluateCheckAnalysis(f138, { C: '0.031' }).items.find((item) => item.element === 'C')!;
    expect(carbon.heatLimit).toBe(carbon.checkLimit);
    expect(carbon.verdict).toBe('beyond-tolerance');
    expect(carbon.note).toMatch(/held to the heat limit/);
  });

  it(
    'the check fails when any element is beyond its tolerance, lists unmeasured elements, and names the ' + 'failures',
    () => {
      const evaluation = evaluateCheckAnalysis(f136, { O: '0.17', Fe: '0.20', H: '0.0100' });
      expect(evaluation.verdict).toBe('does-not-conform');
      expect(evaluation.items.filter((item) => item.verdict === 'not-measured').map((item) => item.element)).toEqual([
        'Al',
        'V',
        'C',
        'N',
      ]);
      expect(checkFailureText(evaluation)).toBe('O 0.17 outside ≤ 0.15');
      expect(evaluateCheckAnalysis(f136, { O: '0.15', Fe: '0.35' }).verdict).toBe('conforms');
    },
  );

  it('refuses input it cannot judge, field by field', () => {
    const attempt = (results: Record<string, string>) => {
      try {
        evaluateCheckAnalysis(f136, results);
        return null;
      } catch (error) {
        expect(error).toBeInstanceOf(CheckAnalysisInputError);
        return (error as CheckAnalysisInputError).fields;
      }
    };
    expect(attempt({})).toEqual({ chemistry: 'No element measured' });
    expect(attempt({ O: 'low', Nb: '0.01' })).toEqual({
      'chemistry.O': '"low" is not a decimal number (write e.g. 0.12 or 40 ppm)',
      'chemistry.Nb': 'The specification sets no limit for this element',
    });
  });
});

// The sampling rules are the plant's choice (common practice, no source); these tests pin the
// arithmetic of "the first heat and every Nth after it".
describe('which heats a rule selects', () => {
  const everyFifth = { everyNthHeat: 5, everyHeatWhenConditional: true };

  it('every 5th heat selects positions 1, 6, 11 and 16 of the first 16', () => {
    const selected = Array.from({ length: 16 }, (_, index) => index + 1).filter(
      (position) => checkRequirement(everyFifth, position, 'approved').required,
    );
    expect(selected).toEqual([1, 6, 11, 16]);
    expect(checkRequirement(everyFifth, 7, 'approved').why).toBe(
      'The first heat and every 5th after it are checked; this is the 7th heat from this supplier to this ' +
        'specification, the next is the 11th',
    );
    expect(checkRequirement(everyFifth, 11, 'approved').why).toBe(
      'The first heat and every 5th after it are checked; this is the 11th heat from this supplier to this ' +
        'specification',
    );
  });

  it('selects every heat of a conditionally approved supplier when the rule says so, and only then', () => {
    expect(checkRequirement(everyFifth, 7, 'conditional')).toEqual({
      required: true,
      why: 'Every heat from a conditionally approved supplier is checked',
    });
    expect(checkRequirement({ everyNthHeat: null, everyHeatWhenConditional: true }, 2, 'approved').required).toBe(
      false,
    );
    expect(checkRequirement({ everyNthHeat: 5, everyHeatWhenConditional: false }, 7, 'conditional').required).toBe(
      false,
    );
  });

  it('describes what a rule selects in words', () => {
    expect(ruleText(everyFifth)).toBe(
      'the first heat and every 5th after it; every heat while the supplier is conditional',
    );
    expect(ruleText({ everyNthHeat: 1, everyHeatWhenConditional: false })).toBe('every heat');
    expect(ruleText({ everyNthHeat: 22, everyHeatWhenConditional: false })).toBe(
      'the first heat and every 22nd after it',
    );
    expect(ruleText({ everyNthHeat: null, everyHeatWhenConditional: false })).toBeNull();
  });

  it('every heat, no rule, and impossible positions', () => {
    expect(checkRequirement({ everyNthHeat: 1, everyHeatWhenConditional: false }, 9, 'approved').required).toBe(true);
    expect(checkRequirement(null, 1, 'conditional')).toEqual({
      required: false,
      why: 'No check analysis rule covers this supplier and specification',
    });
    expect(() => checkRequirement(everyFifth, 0, 'approved')).toThrow(/position/);
    expect(() => checkRequirement({ everyNthHeat: 0, everyHeatWhenConditional: false }, 1, 'approved')).toThrow(
      /everyNthHeat/,
    );
  });

  it(
    'the most specific rule applies: supplier and specification, then supplier, then specification, then ' +
      'plant-wide',
    () => {
      const rule = (supplierId: number | null, specId: string | null, everyNthHeat: number): ScopedCheckRule => ({
        supplierId,
        specId,
        everyNthHeat,
        everyHeatWhenConditional: false,
      });
      const rules = [rule(null, null, 10), rule(null, 'ASTM F136', 8), rule(3, null, 4), rule(3, 'ASTM F136', 2)];
      expect(applicableRule(rules, 3, 'astm f136')!.everyNthHeat).toBe(2);
      expect(applicableRule(rules, 3, 'ASTM F67')!.everyNthHeat).toBe(4);
      expect(applicableRule(rules, 4, 'ASTM F136')!.everyNthHeat).toBe(8);
      expect(applicableRule(rules, 4, 'ASTM F67')!.everyNthHeat).toBe(10);
      expect(applicableRule(rules.slice(1, 3), 4, 'ASTM F67')).toBeNull();
    },
  );
});
