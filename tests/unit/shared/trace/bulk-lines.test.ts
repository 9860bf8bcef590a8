import { describe, expect, it } from 'vitest';
import { readBulkLines, readBulkValue } from '../../../../shared/domain/trace/bulk-lines';

// UDI forms: GS1 General Specifications (element strings with and without brackets, FNC1/GS), GS1
// Digital Link URI syntax, ISO/IEC 15424 symbology identifiers as scanners send them (]d2, ]C1, ]Q3).
describe('reading a bulk trace list', () => {
  it('reads each form a scanner or a person gives, with or without the scanner prefix', () => {
    const lot = { kind: 'udi', gtin: '09521230000154', lot: 'F0001' };
    expect(readBulkValue('(01)09521230000154(17)271231(10)F0001')).toEqual(lot);
    expect(readBulkValue(']d201095212300001541727123110F0001')).toEqual(lot);
    expect(readBulkValue(']C1010952123000015410F0001')).toEqual(lot);
    expect(readBulkValue('https://id.gs1.org/01/09521230000154/10/F0001')).toEqual(lot);
    expect(readBulkValue('F0001')).toEqual({ kind: 'lot', lot: 'F0001' });
  });

  it('gives the reason for what it cannot read: a bad check digit, no lot, a character AI 10 refuses', () => {
    expect(readBulkValue('(01)09521230000155(10)F0001')).toMatchObject({
      kind: 'malformed',
      reason: expect.stringMatching(/check digit/i),
    });
    expect(readBulkValue('(01)09521230000154')).toEqual({ kind: 'malformed', reason: 'The UDI names no lot (AI 10)' });
    expect(readBulkValue('LOT 7')).toMatchObject({
      kind: 'malformed',
      reason: expect.stringMatching(/cannot be used/),
    });
    expect(readBulkValue('L'.repeat(21))).toMatchObject({
      kind: 'malformed',
      reason: expect.stringMatching(/1 to 20/),
    });
  });

  it('numbers lines as the file has them, skips blanks and a header, and takes the first CSV column', () => {
    const { lines, tooMany } = readBulkLines(
      '\uFEFFudi,received\r\n"(01)09521230000154(10)F0001",2026-11-01\r\n\r\nF0002;x\n',
    );
    expect(tooMany).toBe(false);
    expect(lines.map((line) => [line.line, line.input, line.kind])).toEqual([
      [2, '(01)09521230000154(10)F0001', 'udi'],
      [4, 'F0002', 'lot'],
    ]);
  });

  it('stops at the limit and says there were more, not one line over', () => {
    const text = Array.from({ length: 6 }, (_, index) => `L${index}`).join('\n');
    expect(readBulkLines(text, 6).tooMany).toBe(false);
    const over = readBulkLines(text, 5);
    expect(over.tooMany).toBe(true);
    expect(over.lines).toHaveLength(5);
  });
});
