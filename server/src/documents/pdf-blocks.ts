import type { Content, Style } from 'pdfmake/interfaces';

/** Building blocks every generated document uses, so packets and reports read alike. */
export const documentStyles: Record<string, Style> = {
  title: { fontSize: 18, bold: true, margin: [0, 0, 0, 4] },
  heading: { fontSize: 12, bold: true, margin: [0, 12, 0, 6], color: '#12434f' },
  caution: { fontSize: 10, bold: true, color: '#7a4b00', fillColor: '#fff6dd', margin: [0, 8, 0, 8] },
  mono: { fontSize: 7 },
};

export const heading = (text: string): Content => ({ text, style: 'heading' });

/** A SHA-256 on two lines, so that it fits a table column (PDF text does not break inside a word). */
export const hashBlock = (hex: string): Content => ({ text: `${hex.slice(0, 32)}\n${hex.slice(32)}`, style: 'mono' });

/** A boxed caution that cannot be missed. */
export const cautionBox = (text: string): Content => ({
  table: { widths: ['*'], body: [[{ text, style: 'caution', margin: [8, 6, 8, 6] }]] },
  layout: 'noBorders',
});

export const table = (headers: string[], rows: string[][], widths?: Array<string | number>): Content =>
  rows.length
    ? {
        table: {
          headerRows: 1,
          widths: widths ?? headers.map(() => '*'),
          body: [headers.map((text) => ({ text, bold: true, fillColor: '#e8eef0' })), ...rows],
        },
        layout: 'lightHorizontalLines',
        margin: [0, 0, 0, 8],
      }
    : { text: 'None.', italics: true, margin: [0, 0, 0, 8] };

export const pageFooter =
  (left: string) =>
  (page: number, pages: number): Content => ({
    columns: [
      { text: left, fontSize: 7, color: '#555' },
      { text: `Page ${page} of ${pages}`, alignment: 'right', fontSize: 7, color: '#555' },
    ],
    margin: [40, 16, 40, 0],
  });
