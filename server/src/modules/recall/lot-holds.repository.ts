import type { EntityManager } from 'typeorm';
import { insertReturningId } from '../../db/insert-returning-id';
import { LotHold } from './entities/lot-hold.entity';

const marks = (values: unknown[]) => values.map(() => '?').join(',');

export interface HoldRow {
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

const holdSelect = `SELECT h.id, h.lot_id, l.lot_number, l.status AS lot_status, h.recall_id, r.recall_number,
    h.reason, h.placed_by AS placed_by_id, pp.name AS placed_by,
                           h.placed_at, h.lifted_at, pl.name AS lifted_by
                      FROM lot_hold h JOIN production_lot l ON l.id = h.lot_id JOIN person pp ON pp.id = h.placed_by
                      LEFT JOIN person pl ON pl.id = h.lifted_by LEFT JOIN
                        recall_investigation r ON r.id = h.recall_id`;

export function holdRowsOfRecall(manager: EntityManager, recallId: number): Promise<HoldRow[]> {
  return manager.query(`${holdSelect} WHERE h.recall_id = ? ORDER BY l.lot_number`, [recallId]);
}

/** Holds not yet lifted on these lots, oldest first. */
export function activeHoldRows(manager: EntityManager, lotIds: number[]): Promise<HoldRow[]> {
  if (!lotIds.length) return Promise.resolve([]);
  return manager.query(
    `${holdSelect} WHERE h.lot_id IN (${marks(lotIds)}) AND h.lifted_at IS NULL ORDER BY h.id`,
    lotIds,
  );
}

export async function findHoldRow(manager: EntityManager, id: number): Promise<HoldRow | null> {
  const [row]: HoldRow[] = await manager.query(`${holdSelect} WHERE h.id = ?`, [id]);
  return row ?? null;
}

/** The lots among these that the recall holds already (lifted or not). */
export async function lotsHeldByRecall(
  manager: EntityManager,
  recallId: number,
  lotIds: number[],
  activeOnly = false,
): Promise<Set<number>> {
  if (!lotIds.length) return new Set();
  const rows = await manager
    .getRepository(LotHold)
    .createQueryBuilder('hold')
    .select('hold.lotId', 'lotId')
    .where('hold.recallId = :recallId AND hold.lotId IN (:...lotIds)', { recallId, lotIds })
    .andWhere(activeOnly ? 'hold.liftedAt IS NULL' : '1 = 1')
    .getRawMany<{ lotId: number }>();
  return new Set(rows.map((row) => Number(row.lotId)));
}

export async function insertHold(
  manager: EntityManager,
  hold: { lotId: number; recallId: number; reason: string; placedBy: number },
): Promise<number> {
  return insertReturningId(manager, LotHold, hold);
}

/** Lifts the hold (once) and says which lot it was on. */
export async function liftHold(
  manager: EntityManager,
  id: number,
  liftedBy: number,
): Promise<{ lotId: number } | null> {
  const holds = manager.getRepository(LotHold);
  const hold = await holds.findOne({
    select: { id: true, lotId: true, liftedAt: true },
    where: { id },
    lock: { mode: 'pessimistic_write' },
  });
  if (!hold) return null;
  if (hold.liftedAt === null) await holds.update({ id }, { liftedAt: new Date(), liftedBy });
  return { lotId: hold.lotId };
}
