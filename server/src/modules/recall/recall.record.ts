import { appendLedgerEvent } from '../ledger/ledger.repository';
import type { SignableRecordType } from '../signatures/signable-records';
import { queueRecallClosedMail } from './recall-mails';
import { snapshotContent } from './recall.service';
import { closeRecall, findRecallRow, rerunSnapshots } from './recall.repository';

/**
 * Closing an investigation is an electronic signature with a reason, by someone other than who
 * opened it, over what it found (the opening snapshot's hash and every re-run's). A recall's
 * holds must all be lifted or dispositioned first; a drill has none.
 */
export const recallInvestigationRecordType: SignableRecordType<{ status: string; activeHolds: number }> = {
  type: 'recall-investigation',
  label: 'recall investigation',
  action: 'recall.close',
  readAction: 'recall.read',
  meanings: ['closed'],
  async load(manager, recordId) {
    if (!/^\d{1,10}$/.test(recordId)) return null;
    const row = await findRecallRow(manager, Number(recordId));
    if (!row) return null;
    const opening = await snapshotContent(manager, row.id);
    const reruns = await rerunSnapshots(manager, row.id);
    return {
      title:
        `${row.mode === 'drill' ? 'Recall drill' : 'Recall investigation'} ${row.recall_number}: ` +
        `${row.trigger_label}`,
      content: {
        investigation: row.recall_number,
        mode: row.mode,
        trigger: row.trigger_label,
        reason: row.reason,
        openedBy: row.opened_by,
        openedAt: new Date(row.opened_at).toISOString(),
        affectedLots: opening.content.trace.lots.length,
        consignees: opening.content.trace.consignees.length,
        openingSnapshotSha256: opening.meta.sha256,
        rerunSnapshots: reruns.map((rerun) => ({
          takenAt: new Date(rerun.taken_at).toISOString(),
          sha256: rerun.sha256,
        })),
      },
      authorIds: [row.opened_by_id],
      status: row.status,
      activeHolds: Number(row.active_holds),
    };
  },
  refusal({ record }) {
    const facts = record;
    if (facts.status !== 'open') return 'The investigation is already closed';
    if (facts.activeHolds > 0)
      return (
        `${facts.activeHolds} lot(s) are still held by this investigation; a QA approver lifts each hold (after ` +
        `its disposition) before it closes`
      );
    return null;
  },
  async afterSign(manager, { recordId, signer, reason }) {
    const id = Number(recordId);
    const row = await findRecallRow(manager, id, true);
    await closeRecall(manager, id);
    await appendLedgerEvent(manager, {
      actor: { id: signer.id, name: signer.name, role: signer.role },
      action: 'recall.closed',
      entity: { type: 'recall', id },
      before: { status: 'open' },
      after: { status: 'closed' },
      reason,
    });
    if (row?.mode === 'recall')
      await queueRecallClosedMail(manager, { id, recallNumber: row.recall_number }, signer.name, reason);
  },
};
