import { describe, expect, it } from 'vitest';
import { wordsOfCode } from '@shared/domain/words-of-code';

// The product's own fallback for codes without a name (WORDS.md: labels never show a code); no published source.
describe('a code read as words', () => {
  it('when a code has dots, hyphens, underscores or camel case, then none of them reaches the reader', () => {
    expect(wordsOfCode('process-run.recorded')).toBe('Process run recorded');
    expect(wordsOfCode('dispositionNote')).toBe('Disposition note');
    expect(wordsOfCode('reduction_of_area')).toBe('Reduction of area');
    expect(wordsOfCode('use-as-is')).toBe('Use as is');
  });
  it('when the code is empty, already words or odd, then it stays readable and never throws', () => {
    expect(wordsOfCode('')).toBe('');
    expect(wordsOfCode('  lot  ')).toBe('Lot');
    expect(wordsOfCode('a..b--c')).toBe('A b c');
    expect(wordsOfCode('qa2Approver')).toBe('Qa2 approver');
  });
});
