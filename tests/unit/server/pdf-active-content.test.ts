import { deflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { pdfActiveContent, refusePdfWithActiveContent } from '../../../server/src/documents/pdf-active-content';
import { renderPdf } from '../../../server/src/documents/pdf-printer';

// PDF structure after ISO 32000-1:2008: JavaScript actions (12.6.4.16, /S /JavaScript /JS), the
// /EmbeddedFiles name tree (7.11.4), /Launch actions (12.6.4.5), /RichMedia annotations, /XFA forms
// (12.7.8), additional actions /AA (12.6.3), names spelled with #xx escapes (7.3.5), object streams
// (7.5.7) and the standard filters (7.4: ASCIIHexDecode, ASCII85Decode, LZWDecode, FlateDecode).
function pdf(...objects: Array<string | Buffer>): Buffer {
  const parts: Buffer[] = [Buffer.from('%PDF-1.7\n%\xe2\xe3\xcf\xd3\n', 'latin1')];
  objects.forEach((object, index) => {
    parts.push(
      Buffer.from(`${index + 1} 0 obj\n`, 'latin1'),
      typeof object === 'string' ? Buffer.from(object, 'latin1') : object,
      Buffer.from('\nendobj\n', 'latin1'),
    );
  });
  parts.push(Buffer.from('trailer\n<< /Root 1 0 R >>\n%%EOF\n', 'latin1'));
  return Buffer.concat(parts);
}
const streamOf = (content: Buffer, dictionary: string) =>
  Buffer.concat([
    Buffer.from(`<< /Length ${content.length} ${dictionary} >>\nstream\n`, 'latin1'),
    content,
    Buffer.from('\nendstream', 'latin1'),
  ]);
const catalog = '<< /Type /Catalog /Pages 2 0 R >>';
const pages = '<< /Type /Pages /Kids [] /Count 0 >>';

// Encoders for the filters, written here from 7.4 so that each bypass is built in the test.
const asciiHex = (data: Buffer) => Buffer.from(`${data.toString('hex').toUpperCase()}>`, 'latin1');
function ascii85(data: Buffer): Buffer {
  let out = '';
  for (let at = 0; at < data.length; at += 4) {
    const chunk = Buffer.alloc(4);
    data.copy(chunk, 0, at, at + 4);
    let value = chunk.readUInt32BE(0);
    const digits: string[] = [];
    for (let index = 0; index < 5; index += 1) {
      digits.unshift(String.fromCharCode(33 + (value % 85)));
      value = Math.floor(value / 85);
    }
    out += digits.slice(0, Math.min(4, data.length - at) + 1).join('');
  }
  return Buffer.from(`${out}~>`, 'latin1');
}
/**
 * LZW with literal codes only (a valid stream while the table stays under 511 entries): clear, one 9-bit code per byte,
 * end.
 */
function lzw(data: Buffer): Buffer {
  if (data.length > 250) throw new Error('keep LZW test data short');
  const codes = [256, ...data, 257];
  let bits = '';
  for (const code of codes) bits += code.toString(2).padStart(9, '0');
  bits = bits.padEnd(Math.ceil(bits.length / 8) * 8, '0');
  return Buffer.from(bits.match(/.{8}/g)!.map((byte) => parseInt(byte, 2)));
}
/**
 * An object stream holding one object, number `number`, written as the filters' chain asks (last filter applied first).
 */
function objectStream(number: number, object: string, filters: Array<'hex' | 'a85' | 'lzw' | 'flate'>): Buffer {
  const header = `${number} 0 `;
  let data: Buffer = Buffer.from(`${header}${object}`, 'latin1');
  for (const filter of [...filters].reverse())
    data =
      filter === 'hex'
        ? asciiHex(data)
        : filter === 'a85'
          ? ascii85(data)
          : filter === 'lzw'
            ? lzw(data)
            : deflateSync(data);
  const names = { hex: '/ASCIIHexDecode', a85: '/ASCII85Decode', lzw: '/LZWDecode', flate: '/FlateDecode' };
  return streamOf(
    data,
    `/Type /ObjStm /N 1 /First ${header.length} /Filter [${filters.map((filter) => names[filter]).join(' ')}]`,
  );
}
const script = '<< /S /JavaScript /JS (app.alert\\(1\\)) >>';

describe('active content in PDFs, read with a PDF parser', () => {
  it(
    'when a PDF is plain (one printed by the app itself, ' + 'or a minimal certificate), then nothing is found',
    async () => {
      const printed = await renderPdf({ content: ['Certificate of analysis', { text: 'Heat 123456', bold: true }] });
      expect(await pdfActiveContent(printed)).toEqual([]);
      expect(await pdfActiveContent(pdf(catalog, pages))).toEqual([]);
      expect(
        await pdfActiveContent(
          Buffer.from(
            '%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\n% heat certificate\ntrailer << /Root 1 0 R >>\n%%EOF\n',
            'latin1',
          ),
        ),
      ).toEqual([]);
      // Plain objects inside an object stream pass too: the stream is read, not refused for being one.
      expect(await pdfActiveContent(pdf(catalog, pages, objectStream(4, '<< /Producer (mill) >>', ['hex'])))).toEqual(
        [],
      );
    },
  );

  it(
    '[UPLOAD-PDF-SCRIPT] when JavaScript opens with the document or is spelled with #xx escapes, then it is ' + 'found',
    async () => {
      expect(await pdfActiveContent(pdf('<< /Type /Catalog /Pages 2 0 R /OpenAction 3 0 R >>', pages, script))).toEqual(
        ['JavaScript'],
      );
      expect(
        await pdfActiveContent(
          pdf('<< /Type /Catalog /Pages 2 0 R /OpenAction << /S /J#61vaScript /J#53 (x) >> >>', pages),
        ),
      ).toEqual(['JavaScript']);
      expect(
        await pdfActiveContent(
          pdf(
            '<< /Type /Catalog /Pages 2 0 R /AA << /WC << /S /JavaScript /JS 3 0 R >> >> >>',
            pages,
            streamOf(Buffer.from('this.print()'), ''),
          ),
        ),
      ).toEqual(['JavaScript']);
      expect(
        await pdfActiveContent(
          pdf(
            '<< /Type /Catalog /Pages 2 0 R /Names << /JavaScript 3 0 R >> >>',
            pages,
            '<< /Names [(init) 4 0 R] >>',
            script,
          ),
        ),
      ).toEqual(['JavaScript']);
    },
  );

  it(
    '[UPLOAD-PDF-BYPASS] when a script hides in an object stream encoded with ASCIIHex, ASCII85, LZW, Flate or ' +
      'a chain of them, or reuses the stream’s own number, then it is found',
    async () => {
      for (const filters of [
        ['hex'],
        ['a85'],
        ['lzw'],
        ['flate'],
        ['hex', 'flate'],
        ['a85', 'lzw'],
        ['hex', 'a85'],
      ] as const) {
        expect(
          await pdfActiveContent(pdf(catalog, pages, objectStream(4, script, [...filters]))),
          filters.join('+'),
        ).toEqual(['JavaScript']);
      }
      // The object inside claims the number of the object stream itself.
      expect(await pdfActiveContent(pdf(catalog, pages, objectStream(3, script, ['hex'])))).toEqual(['JavaScript']);
      // Escaped names inside an encoded object stream.
      expect(
        await pdfActiveContent(pdf(catalog, pages, objectStream(4, '<< /S /#4Aava#53cript /#4A#53 (x) >>', ['a85']))),
      ).toEqual(['JavaScript']);
    },
  );

  it(
    'when a PDF carries embedded files, a launch action, an XFA form or rich media, then each is named, and the ' +
      'refusal says what to do',
    async () => {
      const found = await pdfActiveContent(
        pdf(
          '<< /Type /Catalog /Pages 2 0 R /Names << /EmbeddedFiles 3 0 R >> >>',
          pages,
          '<< /Names [(a.exe) 4 0 R] >>',
          '<< /Type /Action /S /Launch /F (cmd.exe) >>',
        ),
      );
      expect(found.sort()).toEqual(['an action that launches programs', 'embedded files']);
      expect(
        await pdfActiveContent(
          pdf(
            '<< /Type /Catalog /Pages 2 0 R /AcroForm << /Fields [] /XFA 3 0 R >> >>',
            pages,
            streamOf(Buffer.from('<xdp/>'), ''),
          ),
        ),
      ).toEqual(['an XFA form (which may run scripts)']);
      expect(
        await pdfActiveContent(pdf(catalog, pages, '<< /Type /Annot /Subtype /RichMedia /Rect [0 0 1 1] >>')),
      ).toEqual(['rich media']);
      expect(
        await pdfActiveContent(
          pdf(catalog, pages, '<< /Type /Annot /Subtype /FileAttachment /FS << /Type /Filespec /F (x.bin) >> >>'),
        ),
      ).toEqual(['embedded files']);
      await expect(
        refusePdfWithActiveContent(
          pdf('<< /Type /Catalog /Pages 2 0 R /Names << /EmbeddedFiles 3 0 R >> >>', pages, '<< /Names [] >>'),
          'certificate',
        ),
      ).rejects.toThrow(
        'The PDF carries embedded files; such files are refused, not cleaned. Print it to a plain PDF (or scan ' +
          'it) and upload that',
      );
    },
  );

  it(
    '[UPLOAD-PDF-UNREADABLE] when the parser cannot read the whole file (unknown filter, broken object stream, ' +
      'encryption, damage), then it is refused as unreadable',
    async () => {
      const unknownFilter = await pdfActiveContent(
        pdf(catalog, pages, streamOf(Buffer.from('abc'), '/Type /ObjStm /N 1 /First 4 /Filter /Rot13Decode')),
      );
      expect(unknownFilter[0]).toMatch(/^content that cannot be read completely \(/);
      expect(
        (await pdfActiveContent(pdf(catalog, pages, streamOf(Buffer.from('zz'), '/Filter /NoSuchDecode'))))[0],
      ).toMatch(/^a stream it cannot decode \(NoSuchDecode/);
      expect(
        await pdfActiveContent(
          Buffer.from(
            '%PDF-1.7\n1 0 obj << /Type /Catalog /Pages 2 0 R /Encrypt 3 0 R >> endobj\n2 0 obj << /Type /Pages ' +
              '/Kids [] /Count 0 >> endobj\n3 0 obj << /Filter /Standard /V 2 /R 3 /O <00> /U <00> /P -4 >> ' +
              'endobj\ntrailer << /Root 1 0 R /Encrypt 3 0 R >>\n%%EOF\n',
            'latin1',
          ),
        ),
      ).toEqual(['encryption, so it cannot be read completely']);
      expect((await pdfActiveContent(Buffer.from('%PDF-1.7\n1 0 obj << /Type /Catalog /Pages', 'latin1')))[0]).toMatch(
        /^content that cannot be read completely/,
      );
    },
  );

  it(
    'when a compressed stream would expand beyond 64 MB, ' + 'then the PDF is refused without expanding it all',
    async () => {
      const bomb = deflateSync(Buffer.alloc(65 * 1024 * 1024));
      expect(bomb.length).toBeLessThan(200_000);
      expect(await pdfActiveContent(pdf(catalog, pages, streamOf(bomb, '/Filter /FlateDecode')))).toEqual([
        'a compressed stream that expands beyond 64 MB',
      ]);
    },
  );

  it(
    'when a name merely begins like one of them, or JavaScript is only text on the page, then it is not ' +
      'mistaken for it',
    async () => {
      expect(
        await pdfActiveContent(pdf('<< /Type /Catalog /Pages 2 0 R /JSONData (x) /LaunchDate (2026) >>', pages)),
      ).toEqual([]);
      expect(
        await pdfActiveContent(
          pdf(
            catalog,
            pages,
            streamOf(deflateSync(Buffer.from('BT (/JavaScript /Launch) Tj ET')), '/Filter /FlateDecode'),
          ),
        ),
      ).toEqual([]);
    },
  );
});
