import type { EntityManager } from 'typeorm';
import type { SnapshotDiff } from '@shared/domain/recall/snapshot-diff';
import type { ForwardTrace } from '@shared/schemas/trace';
import { addressesOfRole, queueMail } from '../mail/mail-outbox';
import { linkTo } from '../mail/links';

/** The recall team: recall coordinators and QA approvers (who lift holds and close investigations). */
async function recallTeam(manager: EntityManager): Promise<string[]> {
  return [
    ...(await addressesOfRole(manager, 'recall-coordinator')),
    ...(await addressesOfRole(manager, 'qa-approver')),
  ];
}

const caution =
  'Decisions on field actions, customer notification and regulatory reporting rest with your quality system; ' +
  'Ingotrace keeps the records and computes the trace.';

function summary(trace: ForwardTrace): string[] {
  return [
    `Affected lots: ${trace.lots.length}`,
    `Units started: ${trace.totals.made}; released: ${trace.totals.released}; shipped: ` +
      `${trace.totals.shipped}; in plant: ${trace.totals.onHand}`,
    `Consignees who received affected units: ${trace.consignees.length}`,
    ...trace.consignees
      .slice(0, 50)
      .map(
        (consignee) =>
          `  - ${consignee.name} (${consignee.country}): ${consignee.units} units from ${consignee.lots} lot(s)`,
      ),
    ...(trace.consignees.length > 50 ? [`  … and ${trace.consignees.length - 50} more in the export`] : []),
  ];
}

export async function queueRecallOpenedMail(
  manager: EntityManager,
  recall: { id: number; recallNumber: string; triggerLabel: string; reason: string; openedBy: string; held: string[] },
  trace: ForwardTrace,
) {
  const body = [
    `${recall.openedBy} opened recall investigation ${recall.recallNumber} from ${recall.triggerLabel}.`,
    `Reason: ${recall.reason}`,
    '',
    ...summary(trace),
    `Lots placed on hold (not yet shipped): ${recall.held.length ? recall.held.join(', ') : 'none'}`,
    '',
    `Open the investigation: ${linkTo(`/recalls/${recall.id}`)}`,
    '',
    caution,
  ];
  await queueMail(manager, {
    to: await recallTeam(manager),
    subject: `Recall investigation ${recall.recallNumber} opened: ${recall.triggerLabel}`,
    text: body.join('\n'),
    event: 'recall.opened',
    entity: { type: 'recall', id: recall.id },
  });
}

export async function queueRecallWidenedMail(
  manager: EntityManager,
  recall: { id: number; recallNumber: string; rerunBy: string },
  diff: SnapshotDiff,
  held: string[],
) {
  const body = [
    `${recall.rerunBy} re-ran the trace of recall investigation ${recall.recallNumber}; the affected set ` +
      `differs from the one frozen when it was opened.`,
    '',
    `Lots now affected that were not then: ${diff.lotsAdded.map((lot) => lot.lotNumber).join(', ') || 'none'}`,
    `Lots no longer affected: ${diff.lotsRemoved.map((lot) => lot.lotNumber).join(', ') || 'none'}`,
    `Lots whose status or counts changed: ` +
      `${diff.lotsChanged.map((change) => change.lot.lotNumber).join(', ') || 'none'}`,
    `New consignees: ${diff.consigneesAdded.map((consignee) => consignee.name).join(', ') || 'none'}`,
    `Consignees who received more or fewer units: ` +
      `${diff.consigneesChanged.map((change) => change.consignee.name).join(', ') || 'none'}`,
    `Lots placed on hold now: ${held.join(', ') || 'none'}`,
    '',
    `Open the investigation: ${linkTo(`/recalls/${recall.id}`)}`,
    '',
    caution,
  ];
  await queueMail(manager, {
    to: await recallTeam(manager),
    subject: `Recall investigation ${recall.recallNumber}: the affected set changed`,
    text: body.join('\n'),
    event: 'recall.widened',
    entity: { type: 'recall', id: recall.id },
  });
}

export async function queueRecallClosedMail(
  manager: EntityManager,
  recall: { id: number; recallNumber: string },
  closedBy: string,
  reason: string | null,
) {
  const body = [
    `${closedBy} closed recall investigation ${recall.recallNumber} with an electronic signature.`,
    `Reason: ${reason ?? '—'}`,
    '',
    `Open the investigation: ${linkTo(`/recalls/${recall.id}`)}`,
    '',
    caution,
  ];
  await queueMail(manager, {
    to: await recallTeam(manager),
    subject: `Recall investigation ${recall.recallNumber} closed`,
    text: body.join('\n'),
    event: 'recall.closed',
    entity: { type: 'recall', id: recall.id },
  });
}
