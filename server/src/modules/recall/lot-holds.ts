import type { EntityManager } from 'typeorm';
import type { LotHoldView } from '@shared/schemas/recall';
import { AppError } from '../../errors';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import type { SignableRecordType } from '../signatures/signable-records';
import {
  activeHoldRows,
  findHoldRow,
  holdRowsOfRecall,
  insertHold,
  lotsHeldByRecall,
  liftHold,
  type HoldRow,
} from './lot-holds.repository';

export function toHoldView(row: HoldRow): LotHoldView {
  return {
    id: row.id,
    lotId: row.lot_id,
    lotNumber: row.lot_number,
    lotStatus: row.lot_status,
    recallId: row.recall_id,
    reason: row.reason,
    placedBy: row.placed_by,
    placedAt: new Date(row.placed_at).toISOString(),
    liftedAt: row.lifted_at ? new Date(row.lifted_at).toISOString() : null,
    liftedBy: row.lifted_by,
  };
}

export async function holdsOfRecall(manager: EntityManager, recallId: number): Promise<LotHoldView[]> {
  return (await holdRowsOfRecall(manager, recallId)).map(toHoldView);
}

/** Holds not yet lifted on these lots, each named by what placed it. */
export async function activeHolds(
  manager: EntityManager,
  lotIds: number[],
): Promise<Array<{ id: number; lotId: number; lotNumber: string; reference: string }>> {
  const rows = await activeHoldRows(manager, lotIds);
  return rows.map((row) => ({
    id: row.id,
    lotId: row.lot_id,
    lotNumber: row.lot_number,
    reference: row.recall_number ? `recall investigation ${row.recall_number}` : `hold ${row.id}`,
  }));
}

/** Refuses a shipment, split or merge of a held lot with the hold that stops it. */
export async function refuseIfHeld(
  manager: EntityManager,
  lotIds: number[],
  doing: string,
  field: string,
): Promise<void> {
  const [hold] = await activeHolds(manager, lotIds);
  if (hold)
    throw AppError.rule(
      `Lot ${hold.lotNumber} is on hold by ${hold.reference}; it cannot be ${doing} until a QA approver lifts the hold`,
      { [field]: 'Lot on hold' },
    );
}

/**
 * Places a hold on each lot (one per lot and recall) and writes each lot's ledger event; returns the lot numbers held.
 */
export async function placeHolds(
  manager: EntityManager,
  lots: Array<{ id: number; lotNumber: string }>,
  hold: { recallId: number; recallNumber: string; reason: string; placedBy: number },
  actor: Actor,
  origin?: RequestOrigin,
  /** Hold again a lot whose earlier hold by this recall was lifted (returned units arriving later). */
  again = false,
): Promise<string[]> {
  if (!lots.length) return [];
  const already = await lotsHeldByRecall(
    manager,
    hold.recallId,
    lots.map((lot) => lot.id),
    again,
  );
  const fresh = lots.filter((lot) => !already.has(lot.id));
  for (const lot of fresh) {
    const holdId = await insertHold(manager, {
      lotId: lot.id,
      recallId: hold.recallId,
      reason: hold.reason.slice(0, 2000),
      placedBy: hold.placedBy,
    });
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.held',
      entity: { type: 'lot', id: lot.id },
      after: { holdId, recall: hold.recallNumber },
      reason: hold.reason,
      origin,
    });
  }
  return fresh.map((lot) => lot.lotNumber);
}

/** A hold is lifted only by a QA approver's signature, with a reason, by someone other than who placed it. */
export const lotHoldRecordType: SignableRecordType<{ lifted: boolean }> = {
  type: 'lot-hold',
  label: 'lot hold',
  action: 'holds.lift',
  readAction: 'lots.read',
  meanings: ['lifted'],
  async load(manager, recordId) {
    if (!/^\d{1,10}$/.test(recordId)) return null;
    const row = await findHoldRow(manager, Number(recordId));
    if (!row) return null;
    return {
      title: `Hold on lot ${row.lot_number}${row.recall_number ? ` (${row.recall_number})` : ''}`,
      content: {
        lot: row.lot_number,
        recall: row.recall_number,
        reason: row.reason,
        placedBy: row.placed_by,
        placedAt: new Date(row.placed_at).toISOString(),
      },
      authorIds: [row.placed_by_id],
      lifted: row.lifted_at !== null,
    };
  },
  refusal({ record }) {
    return record.lifted ? 'The hold is already lifted' : null;
  },
  async afterSign(manager, { recordId, signer, reason }) {
    const lifted = await liftHold(manager, Number(recordId), signer.id);
    await appendLedgerEvent(manager, {
      actor: { id: signer.id, name: signer.name, role: signer.role },
      action: 'lot.hold-lifted',
      entity: { type: 'lot', id: lifted?.lotId ?? 0 },
      after: { holdId: Number(recordId) },
      reason,
    });
  },
};
