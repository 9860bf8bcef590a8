import type { EntityManager } from 'typeorm';
import type { LotHoldView } from '@shared/schemas/recall';
import { AppError } from '../../errors';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import type { SignableRecordType } from '../signatures/signable-records';

const marks = (values: unknown[]) => values.map(() => '?').join(',');

interface HoldRow {
  id: number;
  lot_id: number;
  lot_number: string;
  lot_status: string;
  recall_id: number | null;
  recall_number: string | null;
  reason: string;
  placed_by_id: number;
  placed_by: string;
  placed_at: Date;
  lifted_at: Date | null;
  lifted_by: string | null;
}

const holdSelect = `SELECT h.id, h.lot_id, l.lot_number, l.status AS lot_status, h.recall_id, r.recall_number, h.reason, h.placed_by AS placed_by_id, pp.name AS placed_by,
                           h.placed_at, h.lifted_at, pl.name AS lifted_by
                      FROM lot_hold h JOIN production_lot l ON l.id = h.lot_id JOIN person pp ON pp.id = h.placed_by
                      LEFT JOIN person pl ON pl.id = h.lifted_by LEFT JOIN recall_investigation r ON r.id = h.recall_id`;

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
  const rows: HoldRow[] = await manager.query(`${holdSelect} WHERE h.recall_id = ? ORDER BY l.lot_number`, [recallId]);
  return rows.map(toHoldView);
}

/** Holds not yet lifted on these lots, each named by what placed it. */
export async function activeHolds(
  manager: EntityManager,
  lotIds: number[],
): Promise<Array<{ id: number; lotId: number; lotNumber: string; reference: string }>> {
  if (!lotIds.length) return [];
  const rows: HoldRow[] = await manager.query(
    `${holdSelect} WHERE h.lot_id IN (${marks(lotIds)}) AND h.lifted_at IS NULL ORDER BY h.id`,
    lotIds,
  );
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

/** Places a hold on each lot (one per lot and recall) and writes each lot's ledger event; returns the lot numbers held. */
export async function placeHolds(
  manager: EntityManager,
  lots: Array<{ id: number; lotNumber: string }>,
  hold: { recallId: number; recallNumber: string; reason: string; placedBy: number },
  actor: Actor,
  origin?: RequestOrigin,
): Promise<string[]> {
  if (!lots.length) return [];
  const ids = lots.map((lot) => lot.id);
  const existing: Array<{ lot_id: number }> = await manager.query(
    `SELECT lot_id FROM lot_hold WHERE recall_id = ? AND lot_id IN (${marks(ids)})`,
    [hold.recallId, ...ids],
  );
  const already = new Set(existing.map((row) => row.lot_id));
  const fresh = lots.filter((lot) => !already.has(lot.id));
  for (const lot of fresh) {
    const result: { insertId: number } = await manager.query(
      'INSERT INTO lot_hold (lot_id, recall_id, reason, placed_by) VALUES (?, ?, ?, ?)',
      [lot.id, hold.recallId, hold.reason.slice(0, 2000), hold.placedBy],
    );
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.held',
      entity: { type: 'lot', id: lot.id },
      after: { holdId: Number(result.insertId), recall: hold.recallNumber },
      reason: hold.reason,
      origin,
    });
  }
  return fresh.map((lot) => lot.lotNumber);
}

/** A hold is lifted only by a QA approver's signature, with a reason, by someone other than who placed it. */
export const lotHoldRecordType: SignableRecordType = {
  type: 'lot-hold',
  label: 'lot hold',
  action: 'holds.lift',
  readAction: 'lots.read',
  meanings: ['lifted'],
  async load(manager, recordId) {
    if (!/^\d{1,10}$/.test(recordId)) return null;
    const [row]: HoldRow[] = await manager.query(`${holdSelect} WHERE h.id = ?`, [Number(recordId)]);
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
    return (record as unknown as { lifted: boolean }).lifted ? 'The hold is already lifted' : null;
  },
  async afterSign(manager, { recordId, signerId, signerName, reason }) {
    const [row]: Array<{ lot_id: number }> = await manager.query(
      'SELECT lot_id FROM lot_hold WHERE id = ? FOR UPDATE',
      [Number(recordId)],
    );
    await manager.query('UPDATE lot_hold SET lifted_at = ?, lifted_by = ? WHERE id = ? AND lifted_at IS NULL', [
      new Date(),
      signerId,
      Number(recordId),
    ]);
    await appendLedgerEvent(manager, {
      actor: { id: signerId, name: signerName, role: 'qa-approver' },
      action: 'lot.hold-lifted',
      entity: { type: 'lot', id: row?.lot_id ?? 0 },
      after: { holdId: Number(recordId) },
      reason,
    });
  },
};
