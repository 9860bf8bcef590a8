import { stringify } from 'csv-stringify/sync';
import type { DataSource } from 'typeorm';
import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces';
import type { RecallSnapshotContent, RecallSnapshotMeta } from '@shared/schemas/recall';
import { cautionBox, documentStyles, hashBlock, heading, pageFooter, table } from '../../documents/pdf-blocks';
import { renderPdf } from '../../documents/pdf-printer';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { findOrganisation } from '../organisation/organisation.repository';
import { snapshotContent } from './recall.service';
import { findRecallRow } from './recall.repository';
import { plantDateTimeSeconds, timeZoneNote } from '@shared/domain/plant-time';

export const recallCaution =
  'Decisions on field actions, customer notification and regulatory reporting rest with the firm’s quality ' +
  'system. This export states what Ingotrace traced at the moment shown; it is not a decision.';

/**
 * One CSV: each affected lot, then each consignee, with the snapshot they come from on every row so that a cut-out part
 * still says where it came from.
 */
export function recallCsv(meta: RecallSnapshotMeta, content: RecallSnapshotContent): string {
  const source = [content.recallNumber, content.mode, meta.kind, content.takenAt, content.takenBy, meta.sha256];
  const rows: Array<Array<string | number | null>> = [
    ...content.trace.lots.map((lot) => [
      ...source,
      'lot',
      lot.lotNumber,
      lot.partNumber,
      lot.status,
      lot.parents.join(' '),
      lot.made,
      lot.released,
      lot.shipped,
      lot.onHand,
      '',
      '',
      '',
      '',
    ]),
    ...content.trace.consignees.map((consignee) => [
      ...source,
      'consignee',
      '',
      '',
      '',
      '',
      '',
      '',
      consignee.units,
      '',
      consignee.name,
      consignee.kind,
      consignee.country,
      consignee.lots,
    ]),
  ];
  const header = [
    'investigation',
    'mode',
    'snapshot',
    'traced_at_utc',
    'traced_by',
    'snapshot_sha256',
    'row',
    'lot',
    'part',
    'lot_status',
    'came_from_lots',
    'units_started',
    'units_released',
    'units_shipped',
    'units_in_plant',
    'consignee',
    'consignee_kind',
    'country',
    'affected_lots_received',
  ];
  return stringify(rows, { header: true, columns: header });
}

/** The consignees an affected set reached, as every recall document prints them. */
export function consigneeSection(consignees: RecallSnapshotContent['trace']['consignees']): Content[] {
  return [
    heading('Consignees who received affected units'),
    table(
      ['Consignee', 'Kind', 'Country', 'Units', 'Lots'],
      consignees.map((consignee) => [
        consignee.name,
        consignee.kind,
        consignee.country,
        String(consignee.units),
        String(consignee.lots),
      ]),
      ['*', 80, 50, 50, 40],
    ),
  ];
}

/** The printable account of an affected set: totals, lots, consignees and the snapshot's hash. */
export async function recallPdf(
  meta: RecallSnapshotMeta,
  content: RecallSnapshotContent,
  organisation: string,
  reason: string,
  timeZone = 'UTC',
): Promise<Buffer> {
  const { trace } = content;
  const drill = content.mode === 'drill';
  const definition: TDocumentDefinitions = {
    info: {
      title: `${content.recallNumber} affected lots and consignees`,
      author: organisation,
      creator: 'Ingotrace',
      producer: 'Ingotrace',
      creationDate: new Date(meta.takenAt),
    },
    pageSize: 'A4',
    pageMargins: [40, 50, 40, 50],
    ...(drill ? { watermark: { text: 'DRILL', opacity: 0.08, bold: true } } : {}),
    footer: pageFooter(
      `${content.recallNumber} · ${meta.kind === 'opening' ? 'opening snapshot' : 're-run'} · SHA-256 ` +
        `${meta.sha256.slice(0, 16)}…`,
    ),
    styles: documentStyles,
    content: [
      { text: organisation, color: '#555' },
      { text: `${drill ? 'Recall drill' : 'Recall investigation'} ${content.recallNumber}`, style: 'title' },
      { text: `Started from ${trace.start}`, fontSize: 11, margin: [0, 0, 0, 6] },
      cautionBox(drill ? `${recallCaution} This is a drill: no lot was held and no one was notified.` : recallCaution),
      {
        table: {
          widths: [130, '*'],
          body: [
            ['Reason', reason],
            ['Traced at', `${plantDateTimeSeconds(content.takenAt, timeZone)} (${timeZoneNote(timeZone)})`],
            ['Traced by', content.takenBy],
            ['Snapshot', meta.kind === 'opening' ? 'frozen when the investigation was opened' : 're-run of the trace'],
            ['Snapshot SHA-256', hashBlock(meta.sha256)],
          ],
        },
        layout: 'noBorders',
        margin: [0, 8, 0, 4],
      },
      heading('Totals'),
      table(
        ['Affected lots', 'Started', 'Released', 'Shipped', 'In plant', 'Consignees'],
        [
          [
            String(trace.lots.length),
            String(trace.totals.made),
            String(trace.totals.released),
            String(trace.totals.shipped),
            String(trace.totals.onHand),
            String(trace.consignees.length),
          ],
        ],
      ),
      {
        text: 'Units made counts each unit once: units a lot passed on to a split or merged lot count in that lot.',
        fontSize: 8,
        color: '#555',
        margin: [0, 4, 0, 0],
      },
      ...consigneeSection(trace.consignees),
      heading('Affected lots'),
      table(
        ['Lot', 'Part', 'Status', 'Came from', 'Started', 'Released', 'Shipped', 'In plant'],
        trace.lots.map((lot) => [
          lot.lotNumber,
          lot.partNumber,
          lot.status,
          lot.parents.join(', ') || '—',
          String(lot.made ?? '—'),
          String(lot.released),
          String(lot.shipped),
          String(lot.onHand),
        ]),
        [60, '*', 50, 56, 30, 46, 42, 30],
      ),
    ],
  };
  return renderPdf(definition);
}

/** One snapshot (the opening one unless another is named) as CSV or PDF; each export is recorded in the ledger. */
export async function recallExport(
  dataSource: DataSource,
  id: number,
  format: 'csv' | 'pdf',
  snapshotId: number | undefined,
  actor: Actor,
  origin: RequestOrigin,
) {
  const recall = await findRecallRow(dataSource.manager, id);
  if (!recall) throw AppError.notFound('Recall investigation');
  const frozen = await snapshotContent(dataSource.manager, id, snapshotId);
  const body =
    format === 'csv'
      ? Buffer.from(recallCsv(frozen.meta, frozen.content), 'utf8')
      : await recallPdfFor(dataSource, frozen, recall.reason);
  await inTransaction(dataSource, (manager) =>
    appendLedgerEvent(manager, {
      actor,
      action: 'recall.exported',
      entity: { type: 'recall', id },
      after: { format, snapshotId: frozen.meta.id, snapshotSha256: frozen.meta.sha256 },
      origin,
    }),
  );
  return {
    body,
    sha256: frozen.meta.sha256,
    contentType: format === 'csv' ? 'text/csv; charset=utf-8' : 'application/pdf',
    fileName:
      `${recall.recall_number}-${frozen.meta.kind === 'opening' ? 'opening' : `rerun-${frozen.meta.id}`}` +
      `.${format}`,
  };
}

async function recallPdfFor(
  dataSource: DataSource,
  frozen: { meta: RecallSnapshotMeta; content: RecallSnapshotContent },
  reason: string,
): Promise<Buffer> {
  const organisation = await findOrganisation(dataSource);
  return recallPdf(frozen.meta, frozen.content, organisation?.name ?? '', reason, organisation?.timeZone ?? 'UTC');
}
