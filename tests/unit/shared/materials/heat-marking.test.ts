// Receipt confirmation rules (common practice, no source: mills stamp heat numbers with or without
// separators; look-alike characters are never merged).
import { describe, expect, it } from 'vitest';
import { compareHeatMarking } from '@shared/domain/materials/heat-marking';

describe('comparing the heat number marked on a bar with the certificate', () => {
  it('matches regardless of case, spaces and separators', () => {
    for (const marked of ['NV-24-1107', 'nv 24 1107', 'NV241107', ' NV/24.1107 ', 'ＮＶ-２４-１１０７']) {
      expect(compareHeatMarking(marked, 'NV-24-1107').matches, marked).toBe(true);
    }
  });

  it('refuses look-alike characters and says where the numbers part', () => {
    const result = compareHeatMarking('NV-24-11O7', 'NV-24-1107');
    expect(result.matches).toBe(false);
    expect(result.problem).toBe(
      'The bar is marked NV-24-11O7, the certificate is for heat NV-24-1107; they differ from character 7 (O ' +
        'against 0)',
    );
  });

  it('refuses a marking that is a prefix or an extension of the number', () => {
    expect(compareHeatMarking('NV-24-110', 'NV-24-1107').problem).toMatch(
      /differ from character 8 \(nothing against 7\)$/,
    );
    expect(compareHeatMarking('NV-24-11070', 'NV-24-1107').problem).toMatch(
      /differ from character 9 \(0 against nothing\)$/,
    );
  });

  it('refuses a marking with no letters or digits', () => {
    expect(compareHeatMarking(' -- ', 'NV-24-1107')).toMatchObject({
      matches: false,
      problem: 'The marking holds no letters or digits; read the heat number off the bar',
    });
  });
});
