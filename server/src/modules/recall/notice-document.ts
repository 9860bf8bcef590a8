import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces';
import type { NoticeContent } from '@shared/schemas/field-action';
import { cautionBox, documentStyles, hashBlock, heading, pageFooter, table } from '../../documents/pdf-blocks';
import { renderPdf } from '../../documents/pdf-printer';

/** The notice a consignee gets, as a PDF: the merged text, then its lots as a table and the notice's hash. */
export async function noticePdf(content: NoticeContent, organisation: string, sha256: string): Promise<Buffer> {
  const replyLink = /https?:\/\/\S+\/reply\/[A-Za-z0-9_-]{43}/.exec(content.text)?.[0];
  const definition: TDocumentDefinitions = {
    info: {
      title: content.subject,
      author: organisation,
      creator: 'Ingotrace',
      producer: 'Ingotrace',
    },
    pageSize: 'A4',
    pageMargins: [40, 50, 40, 50],
    ...(content.drill ? { watermark: { text: 'DRILL', opacity: 0.08, bold: true } } : {}),
    footer: pageFooter(
      `${content.recallNumber} · notice to ${content.consignee.name} · SHA-256 ${sha256.slice(0, 16)}…`,
    ),
    styles: documentStyles,
    content: [
      { text: organisation, color: '#555' },
      { text: content.subject, style: 'title' },
      ...(content.drill
        ? [cautionBox('This is a recall drill, an exercise: no product is recalled. Please answer as asked.')]
        : []),
      { text: content.text, fontSize: 10, lineHeight: 1.25, margin: [0, 6, 0, 6] },
      heading('Lots in this notice'),
      table(
        ['Lot', 'Part', 'Units shipped to you', 'UDI (GTIN and lot)'],
        content.lots.map((lot) => [lot.lotNumber, lot.part, String(lot.shipped), lot.udi]),
        [70, '*', 70, 170],
      ),
      ...(replyLink
        ? [
            {
              columns: [
                { qr: replyLink, fit: 90, width: 100 },
                {
                  text: 'On paper? Scan this code with a phone to open your own reply page.',
                  fontSize: 9,
                  margin: [0, 30, 0, 0],
                },
              ],
              margin: [0, 8, 0, 0],
            } as Content,
          ]
        : []),
      { text: 'Notice SHA-256', fontSize: 8, color: '#555', margin: [0, 8, 0, 0] },
      hashBlock(sha256),
    ],
  };
  return renderPdf(definition);
}
