import { inflateSync } from 'node:zlib';
import { AppError } from '../errors';

/** What a PDF may carry that acts when it is opened, and how it is named in the file. */
const activeContent: Array<[RegExp, string]> = [
  [/\/(JavaScript|JS)(?![A-Za-z])/, 'JavaScript'],
  [/\/(EmbeddedFiles?|EmbeddedFile)(?![A-Za-z])/, 'embedded files'],
  [/\/Launch(?![A-Za-z])/, 'an action that launches programs'],
  [/\/RichMedia(?![A-Za-z])/, 'rich media'],
  [/\/XFA(?![A-Za-z])/, 'an XFA form (which may run scripts)'],
];

/** Largest size one compressed stream may expand to while it is read (a guard against zip bombs). */
const MAX_EXPANDED_BYTES = 64 * 1024 * 1024;

/** PDF names may spell characters as #xx (/J#61vaScript is /JavaScript); spell them out. */
const plainNames = (text: string) => text.replace(/#([0-9A-Fa-f]{2})/g, (_match, hex: string) => String.fromCharCode(parseInt(hex, 16)));

/**
 * The active content a PDF carries: its text and every Flate-compressed stream in it (object
 * streams included, where a dictionary can hide) are searched for the names that introduce
 * JavaScript, embedded files, launch actions, rich media and XFA forms. A small reader of our
 * own: the PDF libraries on the registry either render (and are large) or are no longer
 * maintained; finding these names needs neither.
 */
export function pdfActiveContent(bytes: Buffer): string[] {
  const raw = bytes.toString('latin1');
  const texts = [raw];
  let at = raw.indexOf('stream');
  while (at !== -1) {
    if (raw.slice(at - 3, at) === 'end') {
      at = raw.indexOf('stream', at + 6);
      continue;
    }
    let start = at + 6;
    if (raw[start] === '\r') start += 1;
    if (raw[start] === '\n') start += 1;
    const end = raw.indexOf('endstream', start);
    if (end === -1) break;
    try {
      texts.push(inflateSync(bytes.subarray(start, end), { maxOutputLength: MAX_EXPANDED_BYTES }).toString('latin1'));
    } catch (error) {
      if ((error as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') return [`a compressed stream that expands beyond ${MAX_EXPANDED_BYTES / 1024 / 1024} MB`];
      // Not Flate-compressed (or damaged): its raw bytes were searched with the rest.
    }
    at = raw.indexOf('stream', end + 9);
  }
  const found = new Set<string>();
  for (const text of texts) {
    const plain = plainNames(text);
    for (const [pattern, what] of activeContent) if (pattern.test(plain)) found.add(what);
  }
  return [...found];
}

/** Refuses a PDF that carries active content, naming what it carries and what to do instead. */
export function refusePdfWithActiveContent(bytes: Buffer, field: string): void {
  const found = pdfActiveContent(bytes);
  if (!found.length) return;
  throw AppError.rule(`The PDF carries ${found.join(' and ')}; such files are refused, not cleaned. Print it to a plain PDF (or scan it) and upload that`, {
    [field]: `PDF with ${found.join(', ')}`,
  });
}
