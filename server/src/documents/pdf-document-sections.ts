import type { Content, TableCell } from 'pdfmake/interfaces';
import type { DocumentCell, DocumentSection } from '@shared/domain/signed-content-document';
import { heading } from './pdf-blocks';

/** A SHA-256 on two lines in small type, so that a table column needs no more than half its width. */
function hashLines(text: string): string {
  return text
    .split('\n')
    .map((hex) => (hex.length === 64 ? `${hex.slice(0, 32)}\n${hex.slice(32)}` : hex))
    .join('\n');
}

function pdfCell(value: DocumentCell): TableCell {
  return value.kind === 'hash' ? { text: hashLines(value.text), style: 'mono' } : { text: value.text };
}

/**
 * Column widths that keep words and numbers whole: a column whose longest entry is short takes
 * the width of that entry ('auto'); the longer ones share what is left ('*'). A hash column is
 * sized for its two-line form.
 */
function widthsFor(columns: string[], rows: DocumentCell[][]): Array<'auto' | '*'> {
  return columns.map((column, index) => {
    const longest = Math.max(
      ...rows.map((row) =>
        row[index]?.kind === 'hash' ? 32 : Math.max(...(row[index]?.text ?? '').split('\n').map((line) => line.length)),
      ),
    );
    return longest <= 28 && column.length <= 28 ? 'auto' : '*';
  });
}

/** The document of signed content in a PDF: the same sections, titles and words as on screen. */
export function pdfSections(sections: DocumentSection[]): Content[] {
  return sections.flatMap((section): Content[] => {
    const title = section.title ? [heading(section.title)] : [];
    if (section.kind === 'facts') {
      return [
        ...title,
        {
          table: {
            widths: ['auto', '*'],
            body: section.rows.map(([label, value]) => [{ text: label, bold: true }, pdfCell(value)]),
          },
          layout: 'lightHorizontalLines',
          margin: [0, 0, 0, 8],
        },
      ];
    }
    if (section.kind === 'list')
      return [
        ...title,
        section.items.length
          ? { ul: section.items.map((item) => item.text), margin: [0, 0, 0, 8] }
          : { text: 'None.', italics: true, margin: [0, 0, 0, 8] },
      ];
    const widths = widthsFor(section.columns, section.rows);
    if (!widths.includes('*')) widths[widths.length - 1] = '*';
    return [
      ...title,
      {
        table: {
          headerRows: 1,
          widths,
          body: [
            section.columns.map((text) => ({ text, bold: true, fillColor: '#e8eef0' })),
            ...section.rows.map((row) => row.map(pdfCell)),
          ],
        },
        layout: 'lightHorizontalLines',
        margin: [0, 0, 0, 8],
      },
    ];
  });
}
