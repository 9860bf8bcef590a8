import type { DataSource } from 'typeorm';
import bwipjs from 'bwip-js/node';
import type { Content } from 'pdfmake/interfaces';
import { buildBarcodeData, buildElementString } from '@shared/domain/gs1/element-string';
import { AppError } from '../../errors';
import { findLotWithPart } from '../manufacturing/production-lot.repository';
import { renderPdf } from '../../documents/pdf-printer';

const MM = 72 / 25.4;

/**
 * Lot labels as a PDF, one label per page at the label's own size: the GS1 DataMatrix with the
 * human-readable interpretation of its AIs, part and lot. Printing is counted separately
 * (label_print), so that labels reconcile with the units released.
 */
export async function lotLabelsPdf(
  dataSource: DataSource,
  lotId: number,
  options: { count: number; widthMm: number; heightMm: number },
): Promise<{ lotNumber: string; pdf: Buffer }> {
  const lot = await findLotWithPart(dataSource.manager, lotId);
  if (!lot?.part) throw AppError.notFound('Lot');
  const { part } = lot;
  const udi = { gtin: part.gtin, lot: lot.lotNumber, serial: null, expiry: null, productionDate: null };
  const symbol = await bwipjs.toBuffer({ bcid: 'gs1datamatrix', text: buildElementString(udi), scale: 3, padding: 2 });
  const size = Math.min(options.heightMm - 8, options.widthMm * 0.4) * MM;
  // pdfmake annotates the nodes it lays out, so every page gets its own copy.
  const label = (): Content[] => [
    {
      columns: [
        { image: `data:image/png;base64,${symbol.toString('base64')}`, width: size },
        {
          width: '*',
          stack: [
            { text: part.description, bold: true, fontSize: 7 },
            { text: `${part.partNumber} rev ${part.revision}`, fontSize: 7 },
            { text: `LOT ${lot.lotNumber}`, bold: true, fontSize: 9, margin: [0, 2, 0, 2] },
            { text: buildElementString(udi), fontSize: 6 },
          ],
        },
      ],
      columnGap: 6,
    },
  ];
  const pages: Content[] = Array.from(
    { length: options.count },
    (_unused, index) => ({ stack: label(), pageBreak: index > 0 ? 'before' : undefined }) as Content,
  );
  const pdf = await renderPdf({
    info: {
      title: `Labels, lot ${lot.lotNumber}`,
      creator: 'Ingotrace',
      producer: 'Ingotrace',
      creationDate: lot.openedAt,
      subject: buildBarcodeData(udi),
    },
    pageSize: { width: options.widthMm * MM, height: options.heightMm * MM },
    pageMargins: [4 * MM, 4 * MM, 4 * MM, 3 * MM],
    content: pages,
  });
  return { lotNumber: lot.lotNumber, pdf };
}
