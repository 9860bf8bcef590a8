/**
 * A stored code read as a sentence when no name is set for it: "process-run.recorded" →
 * "Process run recorded", "dispositionNote" → "Disposition note". The fallback behind every
 * name table (states, events, record types, fields), so that a code never reaches a person as code.
 */
export function wordsOfCode(code: string): string {
  const words = code
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[.\-_]+/g, ' ')
    .toLowerCase()
    .trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
}
