import { deflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { pdfActiveContent, refusePdfWithActiveContent } from '../../../server/src/documents/pdf-active-content';
import { renderPdf } from '../../../server/src/documents/pdf-printer';

// PDF structure after ISO 32000-1:2008 (from memory of the standard): JavaScript actions
// (/S /JavaScript /JS), the /EmbeddedFiles name tree, /Launch actions, /RichMedia annotations,
// /XFA forms, names spelled with #xx escapes (7.3.5) and objects kept in compressed object streams (7.5.7).
function pdf(...objects: Array<string | Buffer>): Buffer {
  const parts: Buffer[] = [Buffer.from('%PDF-1.7\n%\xe2\xe3\xcf\xd3\n', 'latin1')];
  objects.forEach((object, index) => {
    parts.push(Buffer.from(`${index + 1} 0 obj\n`, 'latin1'), typeof object === 'string' ? Buffer.from(object, 'latin1') : object, Buffer.from('\nendobj\n', 'latin1'));
  });
  parts.push(Buffer.from('trailer\n<< /Root 1 0 R >>\n%%EOF\n', 'latin1'));
  return Buffer.concat(parts);
}
const stream = (content: Buffer, extra = '') => Buffer.concat([Buffer.from(`<< /Length ${content.length} /Filter /FlateDecode${extra} >>\nstream\n`, 'latin1'), content, Buffer.from('\nendstream', 'latin1')]);
const catalog = '<< /Type /Catalog /Pages 2 0 R >>';
const pages = '<< /Type /Pages /Kids [] /Count 0 >>';

describe('active content in PDFs', () => {
  it('when a PDF is plain (one printed by the app itself), then nothing is found', async () => {
    const printed = await renderPdf({ content: ['Certificate of analysis', { text: 'Heat 123456', bold: true }] });
    expect(pdfActiveContent(printed)).toEqual([]);
    expect(pdfActiveContent(pdf(catalog, pages))).toEqual([]);
  });

  it('[UPLOAD-PDF-SCRIPT] when JavaScript opens with the document, is spelled with #xx escapes, or hides in a compressed object stream, then it is found', () => {
    expect(pdfActiveContent(pdf('<< /Type /Catalog /Pages 2 0 R /OpenAction 3 0 R >>', pages, '<< /S /JavaScript /JS (app.alert\\(1\\)) >>'))).toEqual(['JavaScript']);
    expect(pdfActiveContent(pdf('<< /Type /Catalog /Pages 2 0 R /OpenAction << /S /J#61vaScript /J#53 (x) >> >>', pages))).toEqual(['JavaScript']);
    const hidden = deflateSync(Buffer.from('3 0 << /S /JavaScript /JS (this.exportDataObject\\(\\)) >>', 'latin1'));
    expect(pdfActiveContent(pdf(catalog, pages, stream(hidden, ' /Type /ObjStm /N 1 /First 4')))).toEqual(['JavaScript']);
  });

  it('when a PDF carries embedded files or a launch action, then each is named, and the refusal says what to do', () => {
    const found = pdfActiveContent(pdf('<< /Type /Catalog /Pages 2 0 R /Names << /EmbeddedFiles 3 0 R >> >>', pages, '<< /Names [(a.exe) 4 0 R] >>', '<< /Type /Action /S /Launch /F (cmd.exe) >>'));
    expect(found.sort()).toEqual(['an action that launches programs', 'embedded files']);
    expect(() => refusePdfWithActiveContent(pdf('<< /Type /Catalog /Pages 2 0 R /Names << /EmbeddedFiles 3 0 R >> >>', pages), 'certificate')).toThrow(
      'The PDF carries embedded files; such files are refused, not cleaned. Print it to a plain PDF (or scan it) and upload that',
    );
  });

  it('when a compressed stream would expand beyond 64 MB, then the PDF is refused without expanding it all', () => {
    const bomb = deflateSync(Buffer.alloc(65 * 1024 * 1024));
    expect(bomb.length).toBeLessThan(200_000);
    expect(pdfActiveContent(pdf(catalog, pages, stream(bomb)))).toEqual(['a compressed stream that expands beyond 64 MB']);
  });

  it('when a name merely begins like one of them, then it is not mistaken for it', () => {
    expect(pdfActiveContent(pdf('<< /Type /Catalog /Pages 2 0 R /JSONData (x) /LaunchDate (2026) >>', pages))).toEqual([]);
  });
});
