import { effectivenessSource, levelDescriptions } from '@shared/domain/recall/effectiveness';
import { appendLedgerEvent } from '../ledger/ledger.repository';
import type { SignableRecordType } from '../signatures/signable-records';
import { queueRecallClosedMail } from './recall-mails';
import { snapshotContent } from './recall.service';
import { closeRecall, findRecallRow, rerunSnapshots } from './recall.repository';
import { effectivenessOf, latestScope } from './field-action.service';
import { findStrategy } from './field-action.repository';

/**
 * Closing an investigation is an electronic signature with a reason, by someone other than who
 * opened it, over what it found (the opening snapshot's hash and every re-run's). A recall's
 * holds must all be lifted or dispositioned first; a drill has none. A recall whose affected
 * units reached consignees (and a drill that exercises notices) closes plainly only when its
 * effectiveness check level is met; otherwise only with a signed justification.
 */
export const recallInvestigationRecordType: SignableRecordType<{
  status: string;
  activeHolds: number;
  effectivenessChecked: boolean;
  met: boolean;
  shortfalls: string[];
}> = {
  type: 'recall-investigation',
  label: 'recall investigation',
  action: 'recall.close',
  readAction: 'recall.read',
  meanings: ['closed', 'closed-justified'],
  async load(manager, recordId) {
    if (!/^\d{1,10}$/.test(recordId)) return null;
    const row = await findRecallRow(manager, Number(recordId));
    if (!row) return null;
    const opening = await snapshotContent(manager, row.id);
    const reruns = await rerunSnapshots(manager, row.id);
    const consigneesInScope = (await latestScope(manager, row.id)).consignees.length;
    const strategy = await findStrategy(manager, row.id);
    const effectivenessChecked = (row.mode === 'recall' && consigneesInScope > 0) || strategy !== null;
    const effectiveness = effectivenessChecked
      ? await effectivenessOf(manager, row.id, { strategy, consigneesInScope })
      : null;
    const shortfalls = effectiveness?.shortfalls ?? (effectivenessChecked ? ['No effectiveness check level set'] : []);
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
        effectiveness: effectiveness && {
          level:
            `${levelDescriptions[effectiveness.level]}` +
            `${effectiveness.level === 'B' ? ` (${effectiveness.percent} %)` : ''} (${effectivenessSource})`,
          consignees: effectiveness.consignees,
          notified: effectiveness.notified,
          replied: effectiveness.replied,
          repliesNeeded: effectiveness.needed,
          unitsShipped: effectiveness.unitsShipped,
          unitsAccounted: effectiveness.unitsAccounted,
          met: effectiveness.met,
        },
      },
      authorIds: [row.opened_by_id],
      status: row.status,
      activeHolds: Number(row.active_holds),
      effectivenessChecked,
      met: shortfalls.length === 0,
      shortfalls,
    };
  },
  refusal({ record, meaning }) {
    const facts = record;
    if (facts.status !== 'open') return 'The investigation is already closed';
    if (facts.activeHolds > 0)
      return (
        `${facts.activeHolds} lot(s) are still held by this investigation; a QA approver lifts each hold (after ` +
        `its disposition) before it closes`
      );
    if (meaning === 'closed' && !facts.met)
      return (
        `The effectiveness check is not met (${facts.shortfalls.join('; ')}); close it with a signed ` +
        `justification instead`
      );
    if (meaning === 'closed-justified' && facts.met)
      return 'The effectiveness check is met; close the investigation without a justification';
    return null;
  },
  async afterSign(manager, { recordId, signer, reason, meaning }) {
    const id = Number(recordId);
    const row = await findRecallRow(manager, id, true);
    await closeRecall(manager, id);
    await appendLedgerEvent(manager, {
      actor: { id: signer.id, name: signer.name, role: signer.role },
      action: 'recall.closed',
      entity: { type: 'recall', id },
      before: { status: 'open' },
      after: { status: 'closed', ...(meaning === 'closed-justified' ? { belowEffectivenessLevel: true } : {}) },
      reason,
    });
    if (row?.mode === 'recall')
      await queueRecallClosedMail(manager, { id, recallNumber: row.recall_number }, signer.name, reason);
  },
};
