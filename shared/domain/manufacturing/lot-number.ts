import { lotNumberProblem } from '../gs1/gtin';
import { lotRoundTripProblem } from '../gs1/element-string';

/**
 * Lot numbers come from a pattern per part. Tokens: {YYYY}, {YY}, {MM}, {DD} (the lot's opening
 * date), {PART} (the part number, characters outside GS1 CSET 82 dropped) and {SEQ} or {SEQ:n}
 * (the running number within the lot numbers that share everything before it, zero-padded to
 * n digits). Everything else is copied as written.
 */
const tokenPattern = /\{(YYYY|YY|MM|DD|PART|SEQ(?::(\d))?)\}/g;

export interface LotNumberContext {
  partNumber: string;
  openedOn: Date;
}

/** What a pattern expands to before its sequence: the prefix whose existing lots are counted. */
export function lotNumberParts(
  pattern: string,
  context: LotNumberContext,
): { prefix: string; suffix: string; width: number } {
  const day = context.openedOn;
  const values: Record<string, string> = {
    YYYY: String(day.getUTCFullYear()),
    YY: String(day.getUTCFullYear()).slice(-2),
    MM: String(day.getUTCMonth() + 1).padStart(2, '0'),
    DD: String(day.getUTCDate()).padStart(2, '0'),
    PART: context.partNumber.replace(/[^A-Za-z0-9-]/g, ''),
  };
  const sequenceAt = pattern.search(/\{SEQ(?::\d)?\}/);
  if (sequenceAt < 0) throw new Error('A lot number pattern needs {SEQ} or {SEQ:n}');
  const sequenceToken = /\{SEQ(?::(\d))?\}/.exec(pattern)!;
  const expand = (text: string) => text.replace(tokenPattern, (_all, token: string) => values[token] ?? '');
  return {
    prefix: expand(pattern.slice(0, sequenceAt)),
    suffix: expand(pattern.slice(sequenceAt + sequenceToken[0].length)),
    width: Number(sequenceToken[1] ?? 1),
  };
}

export function formatLotNumber(pattern: string, context: LotNumberContext, sequence: number): string {
  const { prefix, suffix, width } = lotNumberParts(pattern, context);
  return `${prefix}${String(sequence).padStart(width, '0')}${suffix}`;
}

/** Why a pattern cannot make GS1 lot numbers, or null (checked with a worst-case sequence number). */
export function lotPatternProblem(pattern: string, partNumber: string): string | null {
  if ((pattern.match(/\{SEQ(?::\d)?\}/g) ?? []).length !== 1) return 'Use {SEQ} or {SEQ:n} exactly once';
  const unknown = pattern.replace(tokenPattern, '').match(/[{}]/);
  if (unknown) return 'Only {YYYY}, {YY}, {MM}, {DD}, {PART} and {SEQ:n} may appear in braces';
  const { width } = lotNumberParts(pattern, { partNumber, openedOn: new Date(Date.UTC(2099, 11, 31)) });
  const longest = formatLotNumber(
    pattern,
    { partNumber, openedOn: new Date(Date.UTC(2099, 11, 31)) },
    10 ** Math.max(width, 1) - 1,
  );
  const lengthProblem = lotNumberProblem(longest);
  if (lengthProblem) return lengthProblem;
  // Every lot it makes must read back unchanged from the label's codes; the literal text is what
  // varies least, so the first and the longest lot numbers stand for the rest.
  for (const sequence of [1, 10 ** Math.max(width, 1) - 1]) {
    const problem = lotRoundTripProblem(
      formatLotNumber(pattern, { partNumber, openedOn: new Date(Date.UTC(2026, 0, 1)) }, sequence),
    );
    if (problem) return problem;
  }
  return null;
}
