import bwipjs from 'bwip-js/node';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  buildBarcodeData,
  buildDigitalLink,
  buildElementString,
  centuryOf,
  GS,
  gs1DateToIso,
  parseDigitalLink,
  parseUdi,
} from '@shared/domain/gs1/element-string';
import { formatLotNumber, lotNumberParts, lotPatternProblem } from '@shared/domain/manufacturing/lot-number';
import { gs1CheckDigit } from '@shared/domain/gs1/gtin';

const example = { gtin: '09506000134352', expiry: '261231', lot: 'ABC123', serial: '12345', productionDate: null };

describe('GS1 element strings', () => {
  it(
    '[GS1-ELEMENT-STRING] when the syntax dictionary’s example is built, then fixed-length AIs come first and ' +
      'GS follows the lot only',
    () => {
      // Source: GS1 Barcode Syntax Dictionary AI formats; vector (01)09506000134352(17)261231(10)ABC123(21)12345 as
      // worked on the reference sheet.
      expect(buildElementString(example)).toBe('(01)09506000134352(17)261231(10)ABC123(21)12345');
      expect(buildBarcodeData(example)).toBe(`0109506000134352172612311` + `0ABC123${GS}2112345`);
    },
  );
  it('when scan data, bracketed text or a Digital Link is read, then the same parts come out', () => {
    const expected = { gtin: '09506000134352', lot: 'ABC123', serial: '12345', expiry: '261231', productionDate: null };
    expect(parseUdi('(01)09506000134352(17)261231(10)ABC123(21)12345')).toEqual(expected);
    expect(parseUdi(`]d2010950600013435217261231` + `10ABC123${GS}2112345`)).toEqual(expected);
    // Source: GS1 Digital Link examples (BWIPP wiki, "GS1 Digital Link URIs").
    expect(parseUdi('https://id.gs1.org/01/09521234543213/10/ABC123/21/12345')).toMatchObject({
      gtin: '09521234543213',
      lot: 'ABC123',
      serial: '12345',
    });
    expect(parseUdi('https://id.gs1.org/01/09521234543213/10/ABC123?17=261231')).toMatchObject({
      lot: 'ABC123',
      expiry: '261231',
    });
    expect(parseUdi('https://example.com/products/01/09521234543213')).toMatchObject({
      gtin: '09521234543213',
      lot: null,
    });
  });
  it(
    '[GS1-SCANNER-PREFIX] when a scanner sends a symbology identifier or a leading GS, then the data behind it ' +
      'is read',
    () => {
      // Symbology identifiers per ISO/IEC 15424 as listed in the GS1 General Specifications (5.4.x): ]d2 GS1
      // DataMatrix, ]C1 GS1-128, ]Q3 GS1 QR Code; ]Q1 QR carrying a URL.
      const expected = {
        gtin: '09506000134352',
        lot: 'ABC123',
        serial: '12345',
        expiry: '261231',
        productionDate: null,
      };
      const raw = `010950600013435217261231` + `10ABC123${GS}2112345`;
      for (const prefix of [']d2', ']C1', ']Q3', GS, `]d2${GS}`, `${GS}${GS}`])
        expect(parseUdi(`${prefix}${raw}`), JSON.stringify(prefix)).toEqual(expected);
      expect(parseUdi(`]C1(01)09506000134352(17)261231(10)ABC123(21)12345`)).toEqual(expected);
      expect(parseUdi(']Q1https://id.gs1.org/01/09521234543213/10/ABC123')).toMatchObject({
        gtin: '09521234543213',
        lot: 'ABC123',
      });
      // Not a prefix: a lot that merely contains "]" stays an error about the data, not silently shortened.
      expect(() => parseUdi(']0109506000134352')).toThrow();
    },
  );
  it('when the input is wrong, then the reason is named', () => {
    expect(() => parseUdi('(01)09506000134353(10)A')).toThrow('AI 01 (GTIN): the check digit should be 2');
    expect(() => parseUdi('(01)09506000134352(17)261331')).toThrow('AI 17: invalid month 13');
    expect(() => parseUdi('(01)09506000134352(10)AB C')).toThrow('AI 10: “ ” is not allowed (GS1 CSET 82)');
    expect(() => parseUdi('https://id.gs1.org/01/09521234543213/10/ABC/22/X')).toThrow(
      'Key qualifiers are out of order (22, then 10, then 21)',
    );
    expect(() => parseUdi('(10)ABC')).toThrow('No GTIN (AI 01) found');
    expect(() => parseUdi('0109506000134352(10)x')).toThrow();
  });
  it(
    '[GS1-BWIPP] when bwip-js (BWIPP’s GS1 linter) checks what we build, then it accepts it; a bad check digit ' +
      'it refuses like we do',
    async () => {
      // Reference library from the registry as the outside oracle.
      await expect(
        bwipjs.toBuffer({ bcid: 'gs1datamatrix', text: buildElementString(example) }),
      ).resolves.toBeInstanceOf(Buffer);
      await expect(bwipjs.toBuffer({ bcid: 'gs1dlqrcode', text: buildDigitalLink(example) })).resolves.toBeInstanceOf(
        Buffer,
      );
      await expect(
        bwipjs.toBuffer({ bcid: 'gs1dlqrcode', text: 'https://id.gs1.org/01/09521234543214/10/ABC123' }),
      ).rejects.toThrow(/GS1badChecksum/);
    },
  );
  it(
    'when random valid parts are built and read back, then they survive both forms, and bwip-js accepts each ' +
      'element string (property)',
    async () => {
      const lotCharacter = fc.constantFrom(...'ABCXYZ0189-./_:'.split(''));
      const arbitrary = fc.record({
        body: fc
          .array(fc.integer({ min: 0, max: 9 }), { minLength: 13, maxLength: 13 })
          .map((digits) => digits.join('')),
        lot: fc.array(lotCharacter, { minLength: 1, maxLength: 20 }).map((characters) => characters.join('')),
        serial: fc.option(
          fc.array(lotCharacter, { minLength: 1, maxLength: 20 }).map((characters) => characters.join('')),
          { nil: null },
        ),
        expiry: fc.option(
          fc
            .tuple(fc.integer({ min: 0, max: 99 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 28 }))
            .map(([y, m, d]) => [y, m, d].map((n) => String(n).padStart(2, '0')).join('')),
          { nil: null },
        ),
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
    },
  );
});

describe('GS1 dates', () => {
  it('when a two-digit year is read, then GS1’s sliding window picks the century', () => {
    // Source: GS1 syntax dictionary yymmd0 linter: YY − current YY ≥ 51 → last century; > −50 → this century; else
    // next.
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

describe('lots the product itself makes', () => {
  // GS1 CSET 82 (GS1 syntax dictionary's linter, domain sheet §4.2) minus the brace characters our patterns use as
  // tokens.
  const cset82 = `!"%&'()*+,-./0123456789:;<=>?ABCDEFGHIJKLMNOPQRSTUVWXYZ_abcdefghijklmnopqrstuvwxyz`;

  it(
    '[GS1-LOT-PATTERN] when any pattern passes validation, then every lot it makes round-trips through our ' +
      'build → parse and bwip-js accepts it',
    async () => {
      const literal = fc.string({ unit: fc.constantFrom(...cset82), maxLength: 6 });
      const token = fc.constantFrom('{YYYY}', '{YY}', '{MM}', '{DD}', '{PART}', '');
      const pattern = fc
        .tuple(literal, token, literal, fc.constantFrom('{SEQ}', '{SEQ:3}', '{SEQ:5}'), literal)
        .map((pieces) => pieces.join(''));
      const accepted: string[] = [];
      fc.assert(
        fc.property(pattern, fc.integer({ min: 1, max: 99_999 }), (candidate, sequence) => {
          if (lotPatternProblem(candidate, 'BS-3.5x40') !== null) return;
          const { width } = lotNumberParts(candidate, { partNumber: 'BS-3.5x40', openedOn: new Date() });
          const lot = formatLotNumber(
            candidate,
            { partNumber: 'BS-3.5x40', openedOn: new Date(Date.UTC(2026, 11, 5)) },
            sequence % 10 ** Math.max(width, 1) || 1,
          );
          const parts = { gtin: '09521234543213', lot, serial: null, expiry: null, productionDate: null };
          expect(parseUdi(buildElementString(parts)).lot).toBe(lot);
          expect(parseUdi(buildBarcodeData(parts)).lot).toBe(lot);
          expect(parseUdi(buildDigitalLink(parts)).lot).toBe(lot);
          accepted.push(buildElementString(parts));
        }),
        { numRuns: 400 },
      );
      expect(accepted.length).toBeGreaterThan(50);
      for (const text of accepted.slice(0, 60))
        await expect(bwipjs.toBuffer({ bcid: 'gs1datamatrix', text }), text).resolves.toBeInstanceOf(Buffer);
    },
  );

  it(
    'when a pattern would make a lot with parentheses, then it is refused when saved (bwip-js cannot read it ' +
      'back either)',
    async () => {
      expect(lotPatternProblem('LOT({SEQ:3})', 'P-1')).toMatch(/cannot be read back|Parentheses/);
      await expect(
        bwipjs.toBuffer({ bcid: 'gs1datamatrix', text: '(01)09521234543213(10)LOT(001)' }),
      ).rejects.toThrow();
    },
  );

  it(
    'when the lot itself is "01", then the Digital Link parser still takes the GTIN at the primary key’s place ' +
      '(GS1 Digital Link: /01/{gtin}/10/{lot})',
    () => {
      expect(parseDigitalLink('https://id.gs1.org/01/09521234543213/10/01')).toMatchObject({
        gtin: '09521234543213',
        lot: '01',
      });
      expect(parseDigitalLink('https://example.com/products/01/09521234543213/10/01/21/01')).toMatchObject({
        gtin: '09521234543213',
        lot: '01',
        serial: '01',
      });
    },
  );

  it(
    "when a lot holds ! ' * characters, then the Digital Link percent-encodes them like everything outside RFC " +
      '3986 unreserved',
    () => {
      const link = buildDigitalLink({
        gtin: '09521234543213',
        lot: "A!B'C*D",
        serial: null,
        expiry: null,
        productionDate: null,
      });
      expect(link).toBe('https://id.gs1.org/01/09521234543213/10/A%21B%27C%2AD');
      expect(parseDigitalLink(link).lot).toBe("A!B'C*D");
    },
  );
});
