import type { EntityManager } from 'typeorm';
import {
  lotStatusChangeProblem,
  lotStatusChanges,
  type LotStatus,
  type LotStatusChange,
} from '@shared/domain/manufacturing/lot-status';
import { AppError } from '../../errors';
import { ProductionLot } from './entities/production-lot.entity';

/** The lot, or null when there is none. */
export function findLot(manager: EntityManager, lotId: number): Promise<ProductionLot | null> {
  return manager.getRepository(ProductionLot).findOneBy({ id: lotId });
}

/** The lot with its part, or null when there is none. */
export function findLotWithPart(manager: EntityManager, lotId: number): Promise<ProductionLot | null> {
  return manager.getRepository(ProductionLot).findOne({ where: { id: lotId }, relations: { part: true } });
}

/** The lot, locked for the rest of the transaction, or null when there is none. */
export function lockLot(manager: EntityManager, lotId: number): Promise<ProductionLot | null> {
  return manager.getRepository(ProductionLot).findOne({ where: { id: lotId }, lock: { mode: 'pessimistic_write' } });
}

/**
 * The one place a lot's status changes: locks the lot, refuses a change the lot status rule does
 * not allow from where the lot stands, and writes the new status (and, on approval, the units
 * released). Runs inside the caller's transaction.
 */
export async function changeLotStatus(
  manager: EntityManager,
  lotId: number,
  change: LotStatusChange,
  released?: { qty: number },
): Promise<{ lotNumber: string; from: LotStatus; to: LotStatus }> {
  const lot = await lockLot(manager, lotId);
  if (!lot) throw AppError.notFound('Lot');
  const problem = lotStatusChangeProblem(lot.status, change);
  if (problem) throw AppError.rule(`Lot ${lot.lotNumber}: ${problem}`, { status: problem });
  const to = lotStatusChanges[change].to;
  if (change === 'approve-for-release' && !released)
    throw new Error('Approving a lot for release needs the units released');
  await manager
    .getRepository(ProductionLot)
    .update(
      { id: lotId },
      change === 'approve-for-release' ? { status: to, releasedQty: released!.qty } : { status: to },
    );
  return { lotNumber: lot.lotNumber, from: lot.status, to };
}
