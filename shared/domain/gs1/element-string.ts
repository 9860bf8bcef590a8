import { cset82, gtinProblem } from './gtin';

/**
 * GS1 element strings and Digital Link URIs for the AIs a device label carries.
 * Sources: GS1 Barcode Syntax Dictionary (AI formats; fixed-length AIs need no separator; a
 * variable-length AI is followed by GS when another element follows) and the GS1 Digital Link
 * URI syntax (primary key 01 and qualifiers 22, 10, 21 in the path, in that order; data
 * attributes such as 17 in the query string).
 */
export interface UdiParts {
  gtin: string;
  lot: string | null;
  serial: string | null;
  /** YYMMDD as encoded (DD may be 00). */
  expiry: string | null;
  productionDate: string | null;
}

export class Gs1Error extends Error {}

export const GS = '\u001d';
const fixed: Record<string, number> = { '01': 14, '11': 6, '17': 6 };
const variable: Record<string, number> = { '10': 20, '21': 20 };
const aiNames: Record<string, keyof UdiParts> = {
  '01': 'gtin',
  '10': 'lot',
  '21': 'serial',
  '17': 'expiry',
  '11': 'productionDate',
};

function checkValue(ai: string, value: string): void {
  if (ai === '01') {
    if (!/^\d{14}$/.test(value)) throw new Gs1Error('AI 01 (GTIN) needs 14 digits');
    const problem = gtinProblem(value);
    if (problem) throw new Gs1Error(`AI 01 (GTIN): ${problem.toLowerCase()}`);
  } else if (ai === '11' || ai === '17') {
    if (!/^\d{6}$/.test(value)) throw new Gs1Error(`AI ${ai} needs a date as YYMMDD`);
    const month = Number(value.slice(2, 4));
    const day = Number(value.slice(4, 6));
    if (month < 1 || month > 12) throw new Gs1Error(`AI ${ai}: invalid month ${value.slice(2, 4)}`);
    const year = centuryOf(value.slice(0, 2));
    if (day > new Date(Date.UTC(year, month, 0)).getUTCDate())
      throw new Gs1Error(`AI ${ai}: invalid day ${value.slice(4, 6)}`);
  } else {
    if (value.length < 1 || value.length > variable[ai]!)
      throw new Gs1Error(`AI ${ai} holds 1 to ${variable[ai]} characters`);
    const bad = [...value].find((character) => !cset82.includes(character));
    if (bad !== undefined) throw new Gs1Error(`AI ${ai}: “${bad}” is not allowed (GS1 CSET 82)`);
  }
}

/**
 * The four-digit year of a two-digit GS1 date year, by GS1's sliding window: 51 or more years
 * ahead means the last century, up to 49 behind this century (GS1 syntax dictionary, yymmd0 linter).
 */
export function centuryOf(yy: string, now = new Date()): number {
  const current = now.getUTCFullYear();
  const currentYy = current % 100;
  const difference = Number(yy) - currentYy;
  const century = Math.floor(current / 100) * 100;
  if (difference >= 51) return century - 100 + Number(yy);
  if (difference > -50) return century + Number(yy);
  return century + 100 + Number(yy);
}

/**
 * YYMMDD as a calendar date. DD = 00 means the month without a day; it is read as the month's
 * last day, which is GS1 General Specifications wording not confirmed from the source consulted.
 */
export function gs1DateToIso(yymmdd: string, now = new Date()): string {
  const year = centuryOf(yymmdd.slice(0, 2), now);
  const month = Number(yymmdd.slice(2, 4));
  const day = Number(yymmdd.slice(4, 6)) || new Date(Date.UTC(year, month, 0)).getUTCDate();
  return `${year}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}

function elements(parts: UdiParts): Array<[string, string]> {
  const list: Array<[string, string]> = [['01', parts.gtin]];
  if (parts.productionDate) list.push(['11', parts.productionDate]);
  if (parts.expiry) list.push(['17', parts.expiry]);
  if (parts.lot) list.push(['10', parts.lot]);
  if (parts.serial) list.push(['21', parts.serial]);
  for (const [ai, value] of list) checkValue(ai, value);
  return list;
}

/** Human-readable form: (01)…(11)…(17)…(10)…(21)…, fixed-length AIs first. */
export function buildElementString(parts: UdiParts): string {
  return elements(parts)
    .map(([ai, value]) => `(${ai})${value}`)
    .join('');
}

/** What the barcode carries: AIs and values run together, GS after a variable-length value that is not last. */
export function buildBarcodeData(parts: UdiParts): string {
  const list = elements(parts);
  return list
    .map(([ai, value], index) => `${ai}${value}${ai in variable && index < list.length - 1 ? GS : ''}`)
    .join('');
}

/**
 * A path segment as GS1 Digital Link writes it: everything outside RFC 3986's unreserved set
 * (A–Z a–z 0–9 - . _ ~) percent-encoded, including the ! ' ( ) * that encodeURIComponent leaves;
 * dots encoded too when the value is only dots (browsers would drop it).
 */
export const digitalLinkSegment = (value: string) =>
  /^\.+$/.test(value)
    ? value.replace(/\./g, '%2E')
    : encodeURIComponent(value).replace(
        /[!'()*]/g,
        (character) => `%${character.charCodeAt(0).toString(16).toUpperCase()}`,
      );
const segment = digitalLinkSegment;

export function buildDigitalLink(parts: UdiParts, base = 'https://id.gs1.org'): string {
  elements(parts);
  let path = `${base.replace(/\/+$/, '')}/01/${parts.gtin}`;
  if (parts.lot) path += `/10/${segment(parts.lot)}`;
  if (parts.serial) path += `/21/${segment(parts.serial)}`;
  const query = [
    parts.expiry ? `17=${parts.expiry}` : null,
    parts.productionDate ? `11=${parts.productionDate}` : null,
  ].filter(Boolean);
  return query.length ? `${path}?${query.join('&')}` : path;
}

function assign(parts: Partial<UdiParts>, ai: string, value: string): void {
  const name = aiNames[ai];
  if (!name) throw new Gs1Error(`AI ${ai} is not one this product reads (01, 10, 11, 17, 21)`);
  if (parts[name] !== undefined && parts[name] !== null) throw new Gs1Error(`AI ${ai} appears twice`);
  checkValue(ai, value);
  parts[name] = value;
}

function finish(parts: Partial<UdiParts>): UdiParts {
  if (!parts.gtin) throw new Gs1Error('No GTIN (AI 01) found');
  return {
    gtin: parts.gtin,
    lot: parts.lot ?? null,
    serial: parts.serial ?? null,
    expiry: parts.expiry ?? null,
    productionDate: parts.productionDate ?? null,
  };
}

function parseBracketed(input: string): UdiParts {
  const parts: Partial<UdiParts> = {};
  const pattern = /\((\d{2,4})\)([^(]*)/g;
  let consumed = 0;
  for (const match of input.matchAll(pattern)) {
    if (match.index !== consumed) throw new Gs1Error('Malformed element string: text outside (AI)value pairs');
    assign(parts, match[1]!, match[2]!);
    consumed = match.index + match[0].length;
  }
  if (consumed !== input.length) throw new Gs1Error('Malformed element string');
  return finish(parts);
}

function parseUnbracketed(input: string): UdiParts {
  const data = input.replace(/^\]([A-Za-z]\d)/, '');
  const parts: Partial<UdiParts> = {};
  let position = 0;
  while (position < data.length) {
    const ai = data.slice(position, position + 2);
    position += 2;
    if (ai in fixed) {
      const value = data.slice(position, position + fixed[ai]!);
      if (value.length !== fixed[ai]) throw new Gs1Error(`AI ${ai} is cut short`);
      assign(parts, ai, value);
      position += fixed[ai]!;
      if (data[position] === GS) position++;
    } else if (ai in variable) {
      const end = data.indexOf(GS, position);
      const value = data.slice(position, end < 0 ? undefined : end);
      assign(parts, ai, value);
      position = end < 0 ? data.length : end + 1;
    } else {
      throw new Gs1Error(`AI ${ai} is not one this product reads (01, 10, 11, 17, 21)`);
    }
  }
  return finish(parts);
}

export function parseDigitalLink(input: string): UdiParts {
  // Read the path as written: a URL parser would drop "." and ".." segments, which are valid lot numbers.
  const match = /^https?:\/\/[^/?#\s]+([^?#\s]*)(?:\?([^#\s]*))?(?:#.*)?$/i.exec(input);
  if (!match) throw new Gs1Error('Not a URI');
  const segments = (match[1] ?? '').split('/').filter(Boolean);
  const query = new URLSearchParams(match[2] ?? '');
  // The primary key is the first /01/ followed by a GTIN and by nothing but key-qualifier pairs:
  // a lot or serial that is itself "01" must not be taken for it, nor a path prefix.
  const start = segments.findIndex(
    (name, index) =>
      name === '01' && /^\d{8,14}$/.test(segments[index + 1] ?? '') && (segments.length - index) % 2 === 0,
  );
  if (start < 0) throw new Gs1Error('No /01/{GTIN} in the Digital Link path');
  const parts: Partial<UdiParts> = {};
  const gtin = segments[start + 1]!;
  assign(parts, '01', /^\d{8,14}$/.test(gtin) ? gtin.padStart(14, '0') : gtin);
  const order = ['22', '10', '21'];
  let last = -1;
  for (let index = start + 2; index < segments.length; index += 2) {
    const ai = segments[index]!;
    const value = segments[index + 1];
    const rank = order.indexOf(ai);
    if (rank < 0 || value === undefined)
      throw new Gs1Error(`/${ai}/ is not a key qualifier of a GTIN (22, 10, 21 in that order)`);
    if (rank <= last) throw new Gs1Error('Key qualifiers are out of order (22, then 10, then 21)');
    last = rank;
    if (ai === '22') continue;
    let decoded: string;
    try {
      decoded = decodeURIComponent(value);
    } catch {
      throw new Gs1Error(`AI ${ai}: malformed percent-encoding`);
    }
    assign(parts, ai, decoded);
  }
  for (const [ai, value] of query) if (ai === '17' || ai === '11') assign(parts, ai, value);
  return finish(parts);
}

/**
 * What a scanner may put before the data: a symbology identifier (ISO/IEC 15424: "]d2" GS1
 * DataMatrix, "]C1" GS1-128, "]Q3" GS1 QR, "]Q1" QR with a URL, …) and a leading GS standing for the
 * FNC1 that starts GS1 data. Removed before reading.
 */
export function withoutScannerPrefix(input: string): string {
  return input
    .trim()
    .replace(/^\][A-Za-z][0-9A-Za-z]/, '')
    .replace(new RegExp(`^${GS}+`), '');
}

/**
 * Reads a UDI as scanned or typed: a Digital Link URI, an element string with parentheses, or raw scan data, with or
 * without a scanner's prefix.
 */
export function parseUdi(input: string): UdiParts {
  const text = withoutScannerPrefix(input);
  if (!text) throw new Gs1Error('Nothing to read');
  if (/^https?:\/\//i.test(text)) return parseDigitalLink(text);
  if (text.startsWith('(')) return parseBracketed(text);
  return parseUnbracketed(text);
}

/**
 * Why a lot number could not be read back the way it was written: through a bracketed element
 * string, raw scan data and a Digital Link, or null when all three give it back unchanged.
 */
export function lotRoundTripProblem(lot: string): string | null {
  const parts: UdiParts = { gtin: '09521234543213', lot, serial: null, expiry: null, productionDate: null };
  try {
    for (const [form, read] of [
      ['a bracketed element string', parseUdi(buildElementString(parts))],
      ['scan data', parseUdi(buildBarcodeData(parts))],
      ['a GS1 Digital Link', parseUdi(buildDigitalLink(parts))],
    ] as const) {
      if (read.lot !== lot) return `${lot} reads back from ${form} as ${read.lot ?? 'nothing'}`;
    }
  } catch (error) {
    return `${lot} cannot be read back: ${error instanceof Error ? error.message : String(error)}`;
  }
  if (/[()]/.test(lot))
    return 'Parentheses in a lot number cannot be told apart from the (AI) brackets of an element string';
  return null;
}
