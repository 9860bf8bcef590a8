import bwipjs from 'bwip-js/node';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildBarcodeData, buildDigitalLink, buildElementString, centuryOf, GS, gs1DateToIso, parseUdi } from '@shared/domain/gs1/element-string';
import { gs1CheckDigit } from '@shared/domain/gs1/gtin';

const example = { gtin: '09506000134352', expiry: '261231', lot: 'ABC123', serial: '12345', productionDate: null };

describe('GS1 element strings', () => {
  it('[GS1-ELEMENT-STRING] when the syntax dictionary’s example is built, then fixed-length AIs come first and GS follows the lot only', () => {
    // Source: GS1 Barcode Syntax Dictionary AI formats; vector (01)09506000134352(17)261231(10)ABC123(21)12345 as worked on the reference sheet.
    expect(buildElementString(example)).toBe('(01)09506000134352(17)261231(10)ABC123(21)12345');
    expect(buildBarcodeData(example)).toBe(`0109506000134352172612311` + `0ABC123${GS}2112345`);
  });
  it('when scan data, bracketed text or a Digital Link is read, then the same parts come out', () => {
    const expected = { gtin: '09506000134352', lot: 'ABC123', serial: '12345', expiry: '261231', productionDate: null };
    expect(parseUdi('(01)09506000134352(17)261231(10)ABC123(21)12345')).toEqual(expected);
    expect(parseUdi(`]d2010950600013435217261231` + `10ABC123${GS}2112345`)).toEqual(expected);
    // Source: GS1 Digital Link examples (BWIPP wiki, "GS1 Digital Link URIs").
    expect(parseUdi('https://id.gs1.org/01/09521234543213/10/ABC123/21/12345')).toMatchObject({ gtin: '09521234543213', lot: 'ABC123', serial: '12345' });
    expect(parseUdi('https://id.gs1.org/01/09521234543213/10/ABC123?17=261231')).toMatchObject({ lot: 'ABC123', expiry: '261231' });
    expect(parseUdi('https://example.com/products/01/09521234543213')).toMatchObject({ gtin: '09521234543213', lot: null });
  });
  it('when the input is wrong, then the reason is named', () => {
    expect(() => parseUdi('(01)09506000134353(10)A')).toThrow('AI 01 (GTIN): the check digit should be 2');
    expect(() => parseUdi('(01)09506000134352(17)261331')).toThrow('AI 17: invalid month 13');
    expect(() => parseUdi('(01)09506000134352(10)AB C')).toThrow('AI 10: “ ” is not allowed (GS1 CSET 82)');
    expect(() => parseUdi('https://id.gs1.org/01/09521234543213/10/ABC/22/X')).toThrow('Key qualifiers are out of order (22, then 10, then 21)');
    expect(() => parseUdi('(10)ABC')).toThrow('No GTIN (AI 01) found');
    expect(() => parseUdi('0109506000134352(10)x')).toThrow();
  });
  it('[GS1-BWIPP] when bwip-js (BWIPP’s GS1 linter) checks what we build, then it accepts it; a bad check digit it refuses like we do', async () => {
    // Reference library from the registry as the outside oracle.
    await expect(bwipjs.toBuffer({ bcid: 'gs1datamatrix', text: buildElementString(example) })).resolves.toBeInstanceOf(Buffer);
    await expect(bwipjs.toBuffer({ bcid: 'gs1dlqrcode', text: buildDigitalLink(example) })).resolves.toBeInstanceOf(Buffer);
    await expect(bwipjs.toBuffer({ bcid: 'gs1dlqrcode', text: 'https://id.gs1.org/01/09521234543214/10/ABC123' })).rejects.toThrow(/GS1badChecksum/);
  });
  it('when random valid parts are built and read back, then they survive both forms, and bwip-js accepts each element string (property)', async () => {
    const lotCharacter = fc.constantFrom(...'ABCXYZ0189-./_:'.split(''));
    const arbitrary = fc.record({
      body: fc.array(fc.integer({ min: 0, max: 9 }), { minLength: 13, maxLength: 13 }).map((digits) => digits.join('')),
      lot: fc.array(lotCharacter, { minLength: 1, maxLength: 20 }).map((characters) => characters.join('')),
      serial: fc.option(fc.array(lotCharacter, { minLength: 1, maxLength: 20 }).map((characters) => characters.join('')), { nil: null }),
      expiry: fc.option(fc.tuple(fc.integer({ min: 0, max: 99 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 28 })).map(([y, m, d]) => [y, m, d].map((n) => String(n).padStart(2, '0')).join('')), { nil: null }),
    });
    await fc.assert(
      fc.asyncProperty(arbitrary, async ({ body, lot, serial, expiry }) => {
        const parts = { gtin: `${body}${gs1CheckDigit(body)}`, lot, serial, expiry, productionDate: null };
        expect(parseUdi(buildElementString(parts))).toEqual(parts);
        expect(parseUdi(buildBarcodeData(parts))).toEqual(parts);
        expect(parseUdi(buildDigitalLink(parts, 'https://trace.example.com'))).toEqual(parts);
        await bwipjs.toBuffer({ bcid: 'gs1datamatrix', text: buildElementString(parts) });
      }),
      { numRuns: 60 },
    );
  });
});

describe('GS1 dates', () => {
  it('when a two-digit year is read, then GS1’s sliding window picks the century', () => {
    // Source: GS1 syntax dictionary yymmd0 linter: YY − current YY ≥ 51 → last century; > −50 → this century; else next.
    const in2026 = new Date(Date.UTC(2026, 5, 1));
    expect(centuryOf('75', in2026)).toBe(2075);
    expect(centuryOf('77', in2026)).toBe(1977);
    const in2080 = new Date(Date.UTC(2080, 5, 1));
    expect(centuryOf('31', in2080)).toBe(2031);
    expect(centuryOf('29', in2080)).toBe(2129);
  });
  it('when the day is 00, then the month’s last day is used (GS1 wording, unconfirmed here)', () => {
    expect(gs1DateToIso('280200')).toBe('2028-02-29');
    expect(gs1DateToIso('261231')).toBe('2026-12-31');
  });
});
