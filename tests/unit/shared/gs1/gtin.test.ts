import bwipjs from 'bwip-js/node';
import { describe, expect, it } from 'vitest';
import { gs1CheckDigit, gtinProblem, lotNumberProblem, toGtin14 } from '@shared/domain/gs1/gtin';

describe('GTIN check digits (GS1 mod-10)', () => {
  it(
    '[GS1-CHECK-DIGIT] when the GS1 worked example 0952123454321 is checked, then the weighted sum is 77 and ' +
      'the check digit 3',
    () => {
      // Source: GS1 check digit rule (gs1.org calculator); GTIN 09521234543213 as used in GS1 Digital Link examples.
      expect(gs1CheckDigit('0952123454321')).toBe(3);
      expect(gtinProblem('09521234543213')).toBeNull();
    },
  );
  it('when the published examples are checked, then their check digits agree', () => {
    // Source: gs1.org check digit calculator example 629104150021 → 6291041500213.
    expect(gs1CheckDigit('629104150021')).toBe(3);
    // Source: GS1 Sweden, "Så beräknas kontrollsiffran": 730001100001 → 7300011000017.
    expect(gs1CheckDigit('730001100001')).toBe(7);
    // Source: GS1 syntax dictionary / Digital Link examples: (01)09506000134352 and 10614141000019.
    expect(gtinProblem('09506000134352')).toBeNull();
    expect(gtinProblem('10614141000019')).toBeNull();
  });
  it('when a digit is wrong or the length is not a GTIN length, then the problem is named', () => {
    expect(gtinProblem('09521234543214')).toBe('The check digit should be 3');
    // Worked by hand: 0 9 5 2 1 2 3 4 5 4 3 2 weighted 1,3 from the left of a 13-digit number sums to 86, so 4.
    expect(gtinProblem('0952123454321')).toBe('The check digit should be 4');
    expect(gtinProblem('123456789')).toBe('A GTIN has 8, 12, 13 or 14 digits');
    expect(gtinProblem('0952123454321X')).toBe('A GTIN has digits only');
  });
  it('when a GTIN-13 is padded, then it becomes the 14 digits used in element strings', () => {
    expect(toGtin14('6291041500213')).toBe('06291041500213');
  });
  it(
    'when bwip-js (a port of BWIPP, which lints GS1 data) encodes our GTINs, then it accepts the valid ones and ' +
      'refuses a wrong check digit',
    async () => {
      // Reference library from the registry as an outside oracle for the check digit.
      await expect(
        bwipjs.toBuffer({ bcid: 'gs1datamatrix', text: '(01)09521234543213(10)ABC123' }),
      ).resolves.toBeInstanceOf(Buffer);
      await expect(bwipjs.toBuffer({ bcid: 'gs1datamatrix', text: '(01)09521234543214(10)ABC123' })).rejects.toThrow(
        /GS1badChecksum/,
      );
    },
  );
});

describe('lot numbers as GS1 AI 10 values', () => {
  it('[GS1-LOT-CHARACTERS] when a lot number uses only CSET 82 and at most 20 characters, then it is accepted', () => {
    // Source: GS1 Barcode Syntax Dictionary, AI 10 = X..20 in CSET 82.
    expect(lotNumberProblem('KIW-2614-0001')).toBeNull();
    expect(lotNumberProblem('A:;<=>?_z')).toBeNull();
  });
  it('when it holds a space, a hash or non-ASCII, or is too long, then it is refused', () => {
    expect(lotNumberProblem('LOT 1')).toBe('“ ” cannot be used in a GS1 lot number');
    expect(lotNumberProblem('LOT#1')).toBe('“#” cannot be used in a GS1 lot number');
    expect(lotNumberProblem('LOTÄ')).toBe('“Ä” cannot be used in a GS1 lot number');
    expect(lotNumberProblem('X'.repeat(21))).toBe('A lot number has 1 to 20 characters (GS1 AI 10)');
  });
});
