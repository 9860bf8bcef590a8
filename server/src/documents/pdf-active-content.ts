import { inflateSync } from 'node:zlib';
import {
  decodePDFRawStream,
  PDFArray,
  PDFContext,
  PDFDict,
  PDFDocument,
  PDFName,
  PDFObjectStreamParser,
  PDFRawStream,
  PDFStream,
  type PDFObject,
} from '@cantoo/pdf-lib';
import { AppError } from '../errors';

/**
 * What a PDF may carry that acts when it is opened, found by reading every object with a real PDF
 * parser (@cantoo/pdf-lib, a maintained fork of pdf-lib): dictionaries in the file body and in
 * every object stream whatever its filters (Flate, LZW, ASCIIHex, ASCII85, RunLength, chained),
 * names with #xx escapes read as the names they spell (ISO 32000-1 7.3.5, 7.4, 7.5.7, 12.6, 7.11).
 */
const activeKeys = new Map<string, string>([
  ['JS', 'JavaScript'],
  ['JavaScript', 'JavaScript'],
  ['EmbeddedFiles', 'embedded files'],
  ['EmbeddedFile', 'embedded files'],
  ['EF', 'embedded files'],
  ['XFA', 'an XFA form (which may run scripts)'],
  ['RichMediaContent', 'rich media'],
  ['RichMediaSettings', 'rich media'],
]);
/** Values of /S (action type), /Type and /Subtype that act. */
const activeNames = new Map<string, string>([
  ['JavaScript', 'JavaScript'],
  ['Launch', 'an action that launches programs'],
  ['EmbeddedFile', 'embedded files'],
  ['FileAttachment', 'embedded files'],
  ['GoToE', 'embedded files'],
  ['RichMedia', 'rich media'],
  ['RichMediaExecute', 'rich media'],
]);
const namedBy = new Set(['S', 'Type', 'Subtype']);
const objectStream = PDFName.of('ObjStm');

/** Largest size one Flate stream may expand to (a guard against zip bombs, checked before the parser expands it). */
const MAX_EXPANDED_BYTES = 64 * 1024 * 1024;
/** Filters of image data: their bytes are pictures, never read as objects. */
const imageFilters = new Set(['DCTDecode', 'JPXDecode', 'CCITTFaxDecode', 'JBIG2Decode']);

class Unreadable extends Error {}

function flateBomb(bytes: Buffer): boolean {
  const raw = bytes.toString('latin1');
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
      inflateSync(bytes.subarray(start, end), { maxOutputLength: MAX_EXPANDED_BYTES });
    } catch (error) {
      if ((error as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') return true;
    }
    at = raw.indexOf('stream', end + 9);
  }
  return false;
}

function filtersOf(stream: PDFStream): string[] {
  const filter = stream.dict.get(PDFName.of('Filter'));
  if (filter instanceof PDFName) return [filter.decodeText()];
  if (filter instanceof PDFArray)
    return filter.asArray().map((entry) => (entry instanceof PDFName ? entry.decodeText() : String(entry)));
  return [];
}

/** Every object an object stream holds, parsed into a context of its own (so a number it reuses hides nothing). */
async function objectsInside(stream: PDFRawStream): Promise<PDFObject[]> {
  const scratch = PDFContext.create();
  try {
    await PDFObjectStreamParser.forStream(
      PDFRawStream.of(stream.dict.clone(scratch), stream.contents),
    ).parseIntoContext();
  } catch (error) {
    throw new Unreadable(
      `an object stream it cannot read (${filtersOf(stream).join(', ') || 'no filter'}: ${(error as Error).message})`,
    );
  }
  return scratch.enumerateIndirectObjects().map(([, object]) => object);
}

function inspect(object: PDFObject, found: Set<string>, streams: PDFRawStream[]): void {
  if (object instanceof PDFStream) {
    if (object instanceof PDFRawStream) streams.push(object);
    inspect(object.dict, found, streams);
    return;
  }
  if (object instanceof PDFDict) {
    for (const [key, value] of object.entries()) {
      const name = key.decodeText();
      const active = activeKeys.get(name);
      if (active) found.add(active);
      if (namedBy.has(name) && value instanceof PDFName) {
        const acting = activeNames.get(value.decodeText());
        if (acting) found.add(acting);
      }
      inspect(value, found, streams);
    }
    return;
  }
  if (object instanceof PDFArray) for (const entry of object.asArray()) inspect(entry, found, streams);
}

/**
 * The active content a PDF carries (JavaScript, embedded files, launch actions, XFA forms, rich
 * media). A file the parser cannot fully read — damaged, encrypted, a stream in a filter it does
 * not know, a Flate stream that would expand beyond 64 MB — is reported as such and refused too.
 */
export async function pdfActiveContent(bytes: Buffer): Promise<string[]> {
  if (flateBomb(bytes)) return [`a compressed stream that expands beyond ${MAX_EXPANDED_BYTES / 1024 / 1024} MB`];
  let document: PDFDocument;
  try {
    document = await PDFDocument.load(bytes, {
      throwOnInvalidObject: true,
      updateMetadata: false,
      ignoreEncryption: true,
    });
  } catch (error) {
    return [`content that cannot be read completely (${(error as Error).message.split('\n')[0]})`];
  }
  if (document.isEncrypted) return ['encryption, so it cannot be read completely'];
  const found = new Set<string>();
  const streams: PDFRawStream[] = [];
  try {
    for (const [, object] of document.context.enumerateIndirectObjects()) inspect(object, found, streams);
    for (let index = 0; index < streams.length; index += 1) {
      const stream = streams[index]!;
      if (stream.dict.get(PDFName.of('Type')) === objectStream) {
        for (const inner of await objectsInside(stream)) inspect(inner, found, streams);
        continue;
      }
      // Every other stream must decode with the standard filters (images excepted), or the file is not fully readable.
      const filters = filtersOf(stream);
      if (filters.length && !filters.some((filter) => imageFilters.has(filter))) {
        try {
          decodePDFRawStream(stream).decode();
        } catch (error) {
          throw new Unreadable(`a stream it cannot decode (${filters.join(', ')}: ${(error as Error).message})`);
        }
      }
    }
  } catch (error) {
    if (error instanceof Unreadable) return [`${error.message}`];
    throw error;
  }
  return [...found];
}

/** Refuses a PDF that carries active content (or cannot be read completely), naming what and what to do instead. */
export async function refusePdfWithActiveContent(bytes: Buffer, field: string): Promise<void> {
  const found = await pdfActiveContent(bytes);
  if (!found.length) return;
  throw AppError.rule(
    `The PDF carries ${found.join(' and ')}; such files are refused, not cleaned. Print it to a plain PDF (or ` +
      `scan it) and upload that`,
    {
      [field]: `PDF with ${found.join(', ')}`,
    },
  );
}
