import { Gs1Error, parseUdi } from '../gs1/element-string';
import { lotNumberProblem } from '../gs1/gtin';

/** The most lines one bulk trace reads. */
export const bulkTraceMaxLines = 100_000;

export type BulkLine = { line: number; input: string } & (
  { kind: 'udi'; gtin: string; lot: string } | { kind: 'lot'; lot: string } | { kind: 'malformed'; reason: string }
);

const headers = new Set(['udi', 'lot', 'lot number', 'udi or lot', 'udi or lot number']);

/** The first field of a CSV line (quotes removed), or the whole line when it is one value. */
function firstField(line: string): string {
  const text = line.trim();
  if (text.startsWith('"')) {
    const end = text.indexOf('"', 1);
    return (end > 0 ? text.slice(1, end) : text.slice(1)).trim();
  }
  // A Digital Link may hold ";" or "," only percent-encoded, an element string never.
  return text.split(/[,;\t]/)[0]!.trim();
}

/** Reads one value: a UDI as scanned or typed (with the scanner prefixes the single trace accepts), or a lot number. */
export function readBulkValue(
  input: string,
): { kind: 'udi'; gtin: string; lot: string } | { kind: 'lot'; lot: string } | { kind: 'malformed'; reason: string } {
  const looksLikeUdi = /^(\]|\(|https?:\/\/|\u001d|01\d{14})/i.test(input);
  if (looksLikeUdi) {
    try {
      const parts = parseUdi(input);
      if (!parts.lot) return { kind: 'malformed', reason: 'The UDI names no lot (AI 10)' };
      return { kind: 'udi', gtin: parts.gtin, lot: parts.lot };
    } catch (error) {
      return { kind: 'malformed', reason: error instanceof Gs1Error ? error.message : 'Not a UDI' };
    }
  }
  const problem = lotNumberProblem(input);
  return problem ? { kind: 'malformed', reason: problem } : { kind: 'lot', lot: input };
}

/**
 * The lines of a pasted list or an uploaded file (CSV: the first column; a header row naming a UDI
 * or lot column is skipped), numbered as the person sees them; blank lines are left out. At most
 * `bulkTraceMaxLines` values are read; `tooMany` says when there were more.
 */
export function readBulkLines(text: string, max = bulkTraceMaxLines): { lines: BulkLine[]; tooMany: boolean } {
  const lines: BulkLine[] = [];
  const rows = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  for (let index = 0; index < rows.length; index++) {
    const input = firstField(rows[index]!);
    if (!input) continue;
    if (!lines.length && headers.has(input.toLowerCase())) continue;
    if (lines.length === max) return { lines, tooMany: true };
    lines.push({ line: index + 1, input, ...readBulkValue(input) });
  }
  return { lines, tooMany: false };
}
