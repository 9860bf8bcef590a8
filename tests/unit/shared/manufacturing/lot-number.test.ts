import { describe, expect, it } from 'vitest';
import { formatLotNumber, lotNumberParts, lotPatternProblem } from '@shared/domain/manufacturing/lot-number';

// The pattern language is the product's own (common practice, no source).
describe('lot numbers from a pattern', () => {
  const context = { partNumber: 'KIW-BS-3520', openedOn: new Date(Date.UTC(2026, 2, 14)) };
  it('when the default pattern is expanded, then part, year and a padded sequence appear', () => {
    expect(formatLotNumber('{PART}-{YY}{SEQ:4}', context, 7)).toBe('KIW-BS-3520-260007');
  });
  it('when the sequence is not last, then the prefix and suffix are kept apart for counting', () => {
    expect(lotNumberParts('L{YYYY}{MM}-{SEQ:3}X', context)).toEqual({ prefix: 'L202603-', suffix: 'X', width: 3 });
    expect(formatLotNumber('L{YYYY}{MM}-{SEQ:3}X', context, 12)).toBe('L202603-012X');
  });
  it(
    'when a pattern has no sequence, an unknown token or makes numbers over 20 characters, then the problem is ' +
      'named',
    () => {
      expect(lotPatternProblem('{PART}-{YY}', 'P1')).toBe('Use {SEQ} or {SEQ:n} exactly once');
      expect(lotPatternProblem('{PART}-{WEEK}{SEQ:3}', 'P1')).toBe(
        'Only {YYYY}, {YY}, {MM}, {DD}, {PART} and {SEQ:n} may appear in braces',
      );
      expect(lotPatternProblem('{PART}-{YYYY}{MM}{DD}-{SEQ:5}', 'KIW-BS-3520')).toBe(
        'A lot number has 1 to 20 characters (GS1 AI 10)',
      );
      expect(lotPatternProblem('{YY}{MM}-{SEQ:4}', 'KIW-BS-3520')).toBeNull();
    },
  );
});
