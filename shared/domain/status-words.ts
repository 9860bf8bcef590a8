import type { dispositions, lotStatuses } from '../schemas/manufacturing';
import { wordsOfCode } from './words-of-code';

/**
 * The words people read for stored states (WORDS.md): a label never shows a code such as
 * `use-as-is` or `out-of-window`. Terms of the trade keep their usual form.
 */
export const lotStatusWords: Record<(typeof lotStatuses)[number], string> = {
  open: 'Open',
  consumed: 'Consumed',
  submitted: 'Submitted for release',
  reviewed: 'Reviewed',
  released: 'Released',
  rejected: 'Rejected',
};

export const nonconformanceStatusWords = {
  open: 'Open',
  dispositioned: 'Disposition signed',
  closed: 'Closed',
} as const;

/** Review-board dispositions, capitalised and never hyphen-joined (common practice; ISO 13485:2016 §8.3). */
export const dispositionWords: Record<(typeof dispositions)[number], string> = {
  'use-as-is': 'Use as is',
  rework: 'Rework',
  scrap: 'Scrap',
  'return-to-supplier': 'Return to supplier',
};

export const windowWords = { 'in-window': 'Within window', 'out-of-window': 'Outside window' } as const;
export const inspectionVerdictWords = { accept: 'Accepted', reject: 'Not accepted' } as const;
export const checkVerdictWords = { pass: 'Pass', fail: 'Fail' } as const;
export const heatStatusWords = {
  received: 'Received',
  accepted: 'Accepted',
  rejected: 'Rejected',
  quarantined: 'Quarantined',
} as const;
export const barPieceStatusWords = { 'in-stock': 'In stock', cut: 'Cut into pieces' } as const;
export const draftStatusWords = { draft: 'Draft', approved: 'Approved' } as const;
export const nonconformanceSubjectWords = {
  heat: 'Heat',
  'bar-piece': 'Bar',
  lot: 'Lot',
  'process-run': 'Process run',
} as const;

const everyWord: Record<string, string> = {
  ...barPieceStatusWords,
  ...draftStatusWords,
  ...windowWords,
  ...inspectionVerdictWords,
  ...checkVerdictWords,
  ...heatStatusWords,
  ...nonconformanceStatusWords,
  ...dispositionWords,
  ...lotStatusWords,
};

/** The word for any stored state above; an unknown code reads as its words, capitalised. */
export function statusWord(code: string): string {
  const known = everyWord[code];
  if (known) return known;
  return wordsOfCode(code);
}
