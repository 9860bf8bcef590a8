import { createHash } from 'node:crypto';
import { stringify } from 'csv-stringify/sync';
import type { DataSource } from 'typeorm';
import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces';
import { effectivenessSource, levelDescriptions } from '@shared/domain/recall/effectiveness';
import { plantDateTime, timeZoneNote } from '@shared/domain/plant-time';
import type { FieldActionView } from '@shared/schemas/field-action';
import { cautionBox, documentStyles, heading, pageFooter, table } from '../../documents/pdf-blocks';
import { renderPdf } from '../../documents/pdf-printer';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { findOrganisation } from '../organisation/organisation.repository';
import { fieldActionView } from './field-action.service';
import { recallCaution } from './recall-exports';

/**
 * A heading with its table; a short one is kept on one page so that its heading never ends a page
 * alone (a long one breaks across pages, its header row repeated).
 */
const section = (text: string, body: Content, rows: number): Content =>
  rows <= 20 ? { stack: [heading(text), body], unbreakable: true } : { stack: [heading(text), body] };

type Figures = NonNullable<FieldActionView['effectiveness']>;

const levelText = (view: FieldActionView, figures: Figures) =>
  `${levelDescriptions[figures.level]}${figures.level === 'B' ? ` (${view.strategy?.levelBPercent} %)` : ''} ` +
  `(${effectivenessSource})`;

/** Where the field action stands, one CSV: a section per kind of row, named in the first column. */
export function fieldActionCsv(view: FieldActionView, madeAt: string): string {
  const figures = view.effectiveness;
  const rows: Array<Array<string | number | null>> = [
    ['section', 'name', 'value', 'detail'],
    ['report', 'recall', view.recallNumber, view.mode],
    ['report', 'made at (UTC)', madeAt, ''],
    ...(figures
      ? [
          ['figure', 'effectiveness check level', figures.level, levelText(view, figures)],
          ['figure', 'level met', figures.met ? 'yes' : 'no', figures.shortfalls.join('; ')],
          ['figure', 'consignees', figures.consignees, ''],
          ['figure', 'consignees notified', figures.notified, ''],
          ['figure', 'consignees replied', figures.replied, `${figures.needed} needed`],
          ['figure', 'units shipped', figures.unitsShipped, ''],
          ['figure', 'units accounted for', figures.unitsAccounted, ''],
        ]
      : [['figure', 'effectiveness check level', 'not set', '']]),
    ...view.notices.map((notice) => [
      'notice',
      notice.consignee,
      notice.issuedAt ?? 'not issued',
      `to ${notice.recipient ?? 'no address'}; answers ${notice.replies}` +
        `${notice.lastReplyAt ? `, last ${notice.lastReplyAt} by ${notice.lastContact}` : ''}; reminders ` +
        `${notice.remindersSent}${notice.escalatedAt ? `; escalated ${notice.escalatedAt}` : ''}`,
    ]),
    ...(figures?.lines ?? []).map((line) => [
      'balance',
      `${line.consignee} · ${line.lotNumber}`,
      line.answered ? line.unaccounted : 'no answer',
      `shipped ${line.shipped}; on hand ${line.onHand}; returned ${line.returned}; destroyed ${line.destroyed}; ` +
        `used ${line.used}; received back ${line.received}`,
    ]),
    ...(figures?.differences ?? []).map((line) => [
      'difference',
      `${line.consignee} · ${line.lotNumber}`,
      '',
      line.problem,
    ]),
    ...view.returnedGoods.map((receipt) => [
      'returned',
      `${receipt.consignee} · ${receipt.lotNumber}`,
      receipt.units,
      `${receipt.receivedAt} by ${receipt.receivedBy}${receipt.note ? `; ${receipt.note}` : ''}`,
    ]),
  ];
  return stringify(rows);
}

/** The same, printable: what a status report to the firm's regulator draws its figures from. */
export async function fieldActionPdf(
  view: FieldActionView,
  organisation: string,
  timeZone: string,
  madeAt: string,
): Promise<Buffer> {
  const figures = view.effectiveness;
  const when = (iso: string | null) => (iso ? plantDateTime(iso, timeZone) : '—');
  const definition: TDocumentDefinitions = {
    info: {
      title: `${view.recallNumber} field action`,
      author: organisation,
      creator: 'Ingotrace',
      producer: 'Ingotrace',
    },
    pageSize: 'A4',
    pageOrientation: 'landscape',
    pageMargins: [40, 50, 40, 50],
    ...(view.mode === 'drill' ? { watermark: { text: 'DRILL', opacity: 0.08, bold: true } } : {}),
    footer: pageFooter(`${view.recallNumber} · field action · made ${when(madeAt)} (${timeZoneNote(timeZone)})`),
    styles: documentStyles,
    content: [
      { text: organisation, color: '#555' },
      { text: `Field action of ${view.mode === 'drill' ? 'drill' : 'recall'} ${view.recallNumber}`, style: 'title' },
      cautionBox(recallCaution),
      section(
        'Effectiveness',
        figures
          ? table(
              ['Level', 'Consignees', 'Notified', 'Replied', 'Replies needed', 'Units shipped', 'Accounted for', 'Met'],
              [
                [
                  levelText(view, figures),
                  String(figures.consignees),
                  String(figures.notified),
                  String(figures.replied),
                  String(figures.needed),
                  String(figures.unitsShipped),
                  String(figures.unitsAccounted),
                  figures.met ? 'yes' : `no: ${figures.shortfalls.join('; ')}`,
                ],
              ],
              [150, 55, 50, 45, 55, 55, 60, '*'],
            )
          : { text: 'No effectiveness check level has been set.', italics: true },
        1,
      ),
      section(
        'Notices',
        table(
          ['Consignee', 'Sent to', 'Issued', 'Last answer', 'Reminders'],
          view.notices.map((notice) => [
            notice.consignee,
            notice.recipient ?? 'no address on record',
            when(notice.issuedAt),
            notice.lastReplyAt ? `${when(notice.lastReplyAt)} · ${notice.lastContact}` : 'none',
            `${notice.remindersSent}${notice.escalatedAt ? ` (escalated ${when(notice.escalatedAt)})` : ''}`,
          ]),
          ['*', '*', 80, 140, 90],
        ),
        view.notices.length,
      ),
      section(
        'Balance by consignee and lot: shipped = on hand + returned + destroyed + used',
        table(
          ['Consignee', 'Lot', 'Shipped', 'On hand', 'Returned', 'Destroyed', 'Used', 'Not accounted', 'Received back'],
          (figures?.lines ?? []).map((line) => [
            line.consignee,
            line.lotNumber,
            String(line.shipped),
            ...(line.answered
              ? [line.onHand, line.returned, line.destroyed, line.used, line.unaccounted].map(String)
              : ['no answer', '', '', '', '']),
            String(line.received),
          ]),
          ['*', 80, 45, 45, 50, 50, 40, 60, 60],
        ),
        figures?.lines.length ?? 0,
      ),
      section(
        'Differences',
        table(
          ['Consignee', 'Lot', 'Difference'],
          (figures?.differences ?? []).map((line) => [line.consignee, line.lotNumber, line.problem]),
          [160, 90, '*'],
        ),
        figures?.differences.length ?? 0,
      ),
      section(
        'Returned goods received',
        table(
          ['Received', 'From', 'Lot', 'Units', 'Note'],
          view.returnedGoods.map((receipt) => [
            `${when(receipt.receivedAt)} · ${receipt.receivedBy}`,
            receipt.consignee,
            receipt.lotNumber,
            String(receipt.units),
            receipt.note ?? '',
          ]),
          [150, '*', 90, 45, '*'],
        ),
        view.returnedGoods.length,
      ),
    ],
  };
  return renderPdf(definition);
}

/** The field action as CSV or PDF; each report is recorded in the audit trail. */
export async function fieldActionReport(
  dataSource: DataSource,
  recallId: number,
  format: 'csv' | 'pdf',
  actor: Actor,
  origin: RequestOrigin,
) {
  const view = await fieldActionView(dataSource, recallId);
  const organisation = await findOrganisation(dataSource);
  const madeAt = new Date().toISOString();
  const body =
    format === 'csv'
      ? Buffer.from(fieldActionCsv(view, madeAt), 'utf8')
      : await fieldActionPdf(view, organisation?.name ?? '', organisation?.timeZone ?? 'UTC', madeAt);
  await inTransaction(dataSource, (manager) =>
    appendLedgerEvent(manager, {
      actor,
      action: 'recall.field-action-reported',
      entity: { type: 'recall', id: recallId },
      after: { format, sha256: createHash('sha256').update(body).digest('hex') },
      origin,
    }),
  );
  return {
    body,
    contentType: format === 'csv' ? 'text/csv; charset=utf-8' : 'application/pdf',
    fileName: `${view.recallNumber}-field-action.${format}`,
  };
}
