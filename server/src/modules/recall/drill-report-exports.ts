import { effectivenessSource } from '@shared/domain/recall/effectiveness';
import { stringify } from 'csv-stringify/sync';
import type { DataSource } from 'typeorm';
import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces';
import { durationText } from '@shared/domain/recall/drill-report';
import type { DrillReport } from '@shared/schemas/recall';
import { cautionBox, documentStyles, hashBlock, heading, pageFooter, table } from '../../documents/pdf-blocks';
import { renderPdf } from '../../documents/pdf-printer';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { findOrganisation } from '../organisation/organisation.repository';
import { drillReport } from './drill-report.service';
import { consigneeSection, recallCaution } from './recall-exports';
import { plantDateTimeSeconds, timeZoneNote } from '@shared/domain/plant-time';

/** The timing lines, shared by the PDF and the CSV. */
function timingRows(report: DrillReport, when: (iso: string) => string): Array<[string, string]> {
  const { timing } = report.assessment;
  return [
    ['Started', `${when(report.drill.openedAt)} by ${report.drill.openedBy}`],
    [
      'First scope frozen after',
      durationText(timing.toFirstScopeMs) +
        (timing.tracedInMs !== null ? ` (trace computed in ${durationText(timing.tracedInMs)})` : ''),
    ],
    [
      'Scope confirmed complete after',
      timing.toConfirmedScopeMs !== null
        ? `${durationText(timing.toConfirmedScopeMs)} (closing signature, ${when(report.drill.closedAt!)})`
        : `not yet: open for ${durationText(timing.elapsedMs)}`,
    ],
    [
      'Trace re-runs',
      `${timing.reruns}` +
        (timing.scopeChanged
          ? ` — the scope changed since opening (added: ${report.scope.lotsAddedSinceOpening.join(', ') || 'none'}; ` +
            `removed: ${report.scope.lotsRemovedSinceOpening.join(', ') || 'none'})`
          : ', scope unchanged since opening'),
    ],
  ];
}

/** The exercised field action's figures (21 CFR 7.42(b)(3) level), one row each. */
function effectivenessRows(report: DrillReport): Array<Array<string | number>> {
  const figures = report.effectiveness;
  if (!figures) return [];
  return [
    ['effectiveness', `level ${figures.level} (${effectivenessSource})`, figures.met ? 'met' : 'not met', ''],
    ['effectiveness', 'consignees notified', figures.notified, `of ${figures.consignees}`],
    ['effectiveness', 'consignees replied', figures.replied, `${figures.needed} needed`],
    ['effectiveness', 'units accounted for', figures.unitsAccounted, `of ${figures.unitsShipped} shipped`],
    ...figures.differences.map((line) => ['difference', `${line.consignee} · ${line.lotNumber}`, '', line.problem]),
  ];
}

function effectivenessSection(report: DrillReport): Content[] {
  const figures = report.effectiveness;
  if (!figures) return [];
  return [
    heading(`Consignee notices exercised: effectiveness check level ${figures.level} (${effectivenessSource})`),
    table(
      ['Consignees', 'Notified', 'Replied', 'Replies needed', 'Units shipped', 'Units accounted for', 'Level met'],
      [
        [
          String(figures.consignees),
          String(figures.notified),
          String(figures.replied),
          String(figures.needed),
          String(figures.unitsShipped),
          String(figures.unitsAccounted),
          figures.met ? 'yes' : `no: ${figures.shortfalls.join('; ')}`,
        ],
      ],
    ),
  ];
}

/** One CSV, a section per kind of row, so that a spreadsheet filter on the first column splits it. */
export function drillReportCsv(report: DrillReport): string {
  const { totals, checks } = report.assessment;
  const rows: Array<Array<string | number>> = [
    ['drill', 'number', report.drill.recallNumber, ''],
    ['drill', 'started from', report.drill.trigger, ''],
    ['drill', 'reason', report.drill.reason, ''],
    ...timingRows(report, (iso) => iso).map(([name, value]) => ['timing', name, value, '']),
    ['timing', 'first scope ms', report.assessment.timing.toFirstScopeMs, ''],
    ['timing', 'confirmed scope ms', report.assessment.timing.toConfirmedScopeMs ?? '', ''],
    ['scope', 'snapshot sha256', report.scope.snapshot.sha256, report.scope.snapshot.kind],
    ...(
      [
        ['lots', totals.lots],
        ['started', totals.made],
        ['released', totals.released],
        ['shipped', totals.shipped],
        ['in plant', totals.onHand],
        ['consignees', totals.consignees],
      ] as const
    ).map(([name, value]) => ['totals', name, value, '']),
    ...effectivenessRows(report),
    ...checks.map((check) => [
      'check',
      check.label,
      check.passed ? 'passed' : 'failed',
      [check.detail, ...check.offenders].join('; '),
    ]),
    ...report.lots.map((lot) => [
      'lot',
      lot.lotNumber,
      lot.status,
      `part ${lot.partNumber}; heats ${lot.heats.join(' ') || 'none'}; started ${lot.made ?? ''}; released ` +
        `${lot.released}; shipped ${lot.shipped}; in plant ${lot.onHand}`,
    ]),
    ...report.consignees.map((consignee) => [
      'consignee',
      consignee.name,
      consignee.units,
      `${consignee.kind}; ${consignee.country}; ${consignee.lots} lots`,
    ]),
  ];
  return stringify(rows, { header: true, columns: ['section', 'name', 'value', 'detail'] });
}

export async function drillReportPdf(report: DrillReport, organisation: string, timeZone = 'UTC'): Promise<Buffer> {
  const { assessment } = report;
  const checkRows: Content[] = assessment.checks.map((check) => ({
    table: {
      widths: [52, '*'],
      body: [
        [
          { text: check.passed ? 'PASSED' : 'FAILED', bold: true, color: check.passed ? '#1e6b3a' : '#a4262c' },
          {
            stack: [
              { text: check.label, bold: true },
              { text: check.detail },
              ...check.offenders.slice(0, 25).map((offender) => ({ text: `• ${offender}`, fontSize: 8 })),
              ...(check.offenders.length > 25
                ? [{ text: `… and ${check.offenders.length - 25} more (all in the CSV)`, fontSize: 8 }]
                : []),
            ],
          },
        ],
      ],
    },
    layout: 'noBorders',
    margin: [0, 2, 0, 4],
  }));
  const definition: TDocumentDefinitions = {
    info: {
      title: `${report.drill.recallNumber} recall drill report`,
      author: organisation,
      creator: 'Ingotrace',
      producer: 'Ingotrace',
      creationDate: new Date(report.madeAt),
    },
    pageSize: 'A4',
    pageMargins: [40, 50, 40, 50],
    watermark: { text: 'DRILL', opacity: 0.08, bold: true },
    footer: pageFooter(
      `${report.drill.recallNumber} drill report · made ${plantDateTimeSeconds(report.madeAt, timeZone)} ` +
        `(${timeZoneNote(timeZone)})`,
    ),
    styles: documentStyles,
    content: [
      { text: organisation, color: '#555' },
      { text: `Recall drill report ${report.drill.recallNumber}`, style: 'title' },
      { text: `Started from ${report.drill.trigger}`, fontSize: 11, margin: [0, 0, 0, 6] },
      cautionBox(`${recallCaution} This is a drill: no lot was held and no one was notified.`),
      {
        text: assessment.complete
          ? 'Scope complete: every check passed.'
          : `Scope NOT complete: ${assessment.checks.filter((check) => !check.passed).length} of ` +
            `${assessment.checks.length} checks failed.`,
        bold: true,
        fontSize: 12,
        color: assessment.complete ? '#1e6b3a' : '#a4262c',
        margin: [0, 8, 0, 4],
      },
      {
        table: {
          widths: [150, '*'],
          body: [['Reason', report.drill.reason], ...timingRows(report, (iso) => plantDateTimeSeconds(iso, timeZone))],
        },
        layout: 'noBorders',
        margin: [0, 4, 0, 4],
      },
      heading('Totals (latest traced scope)'),
      table(
        ['Lots', 'Started', 'Released', 'Shipped', 'In plant', 'Consignees'],
        [
          [
            assessment.totals.lots,
            assessment.totals.made,
            assessment.totals.released,
            assessment.totals.shipped,
            assessment.totals.onHand,
            assessment.totals.consignees,
          ].map(String),
        ],
      ),
      {
        text:
          'Units made: what each lot started with, less what it passed on to lots split or merged from it ' +
          '(counted there, not twice).',
        fontSize: 8,
        color: '#555',
        margin: [0, 2, 0, 0],
      },
      heading('Completeness checks'),
      ...checkRows,
      ...effectivenessSection(report),
      ...consigneeSection(report.consignees),
      heading('Affected lots'),
      table(
        ['Lot', 'Part', 'Status', 'Heats', 'Started', 'Released', 'Shipped', 'In plant'],
        report.lots.map((lot) => [
          lot.lotNumber,
          lot.partNumber,
          lot.status,
          lot.heats.join(', ') || '—',
          String(lot.made ?? '—'),
          String(lot.released),
          String(lot.shipped),
          String(lot.onHand),
        ]),
        [60, '*', 50, 70, 30, 42, 40, 30],
      ),
      heading('Scope traced'),
      {
        table: {
          widths: [150, '*'],
          body: [
            [
              'Snapshot',
              `${report.scope.snapshot.kind === 'opening' ? 'opening' : 'latest re-run'}, ` +
                `${plantDateTimeSeconds(report.scope.snapshot.takenAt, timeZone)} by ` +
                `${report.scope.snapshot.takenBy}`,
            ],
            ['Snapshot SHA-256', hashBlock(report.scope.snapshot.sha256)],
          ],
        },
        layout: 'noBorders',
      },
    ],
  };
  return renderPdf(definition);
}

/** The report as JSON, or as CSV or PDF (recorded in the ledger: who took the drill's evidence away, when). */
export async function drillReportExport(
  dataSource: DataSource,
  id: number,
  format: 'json' | 'csv' | 'pdf',
  actor: Actor,
  origin: RequestOrigin,
) {
  const report = await drillReport(dataSource, id);
  if (format === 'json') return { report };
  const organisation = format === 'csv' ? null : await findOrganisation(dataSource);
  const body =
    format === 'csv'
      ? Buffer.from(drillReportCsv(report), 'utf8')
      : await drillReportPdf(report, organisation?.name ?? '', organisation?.timeZone);
  await inTransaction(dataSource, (manager) =>
    appendLedgerEvent(manager, {
      actor,
      action: 'recall.drill-report-exported',
      entity: { type: 'recall', id },
      after: { format, complete: report.assessment.complete, snapshotSha256: report.scope.snapshot.sha256 },
      origin,
    }),
  );
  return {
    report,
    file: {
      body,
      contentType: format === 'csv' ? 'text/csv; charset=utf-8' : 'application/pdf',
      fileName: `${report.drill.recallNumber}-drill-report.${format}`,
    },
  };
}
