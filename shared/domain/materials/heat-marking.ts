// Receipt confirmation: the heat number marked (stamped, etched or labelled) on a bar, typed or
// scanned at receipt, against the heat number of the certificate the bar is received under.

export interface MarkingComparison {
  matches: boolean;
  /** The two numbers as compared: letters and digits only, upper case. */
  marked: string;
  certificate: string;
  /** Why they differ, for the person at the receiving bench; null when they match. */
  problem: string | null;
}

/**
 * Compares letters and digits only, ignoring case, spaces and separators (mills stamp
 * "NV 24 1107" for a certificate's "NV-24-1107"). Nothing else is forgiven: O and 0, or I and 1,
 * are different characters, because a bar from another heat can differ in exactly one of them.
 */
export function compareHeatMarking(marked: string, certificateHeatNumber: string): MarkingComparison {
  const normalise = (text: string) =>
    text
      .normalize('NFKC')
      .toUpperCase()
      .replace(/[^0-9A-Z]/g, '');
  const a = normalise(marked);
  const b = normalise(certificateHeatNumber);
  if (!a)
    return {
      matches: false,
      marked: a,
      certificate: b,
      problem: 'The marking holds no letters or digits; read the heat number off the bar',
    };
  if (a === b) return { matches: true, marked: a, certificate: b, problem: null };
  const firstDifference = [...a].findIndex((character, index) => character !== b[index]);
  const at = firstDifference === -1 ? Math.min(a.length, b.length) : firstDifference;
  return {
    matches: false,
    marked: a,
    certificate: b,
    problem:
      `The bar is marked ${marked.trim()}, the certificate is for heat ${certificateHeatNumber}; they differ ` +
      `from character ${at + 1} (${a[at] ?? 'nothing'} against ${b[at] ?? 'nothing'})`,
  };
}
