import type { EntityManager } from 'typeorm';
import { unitChain, type UnitChain } from '@shared/domain/manufacturing/unit-chain';
import { unitFacts, type LotStart } from './lots.repository';

/**
 * The unit chain of each lot, computed from its recorded steps and the splits and merges out of it.
 * `known`: the lots' start rows when the caller has already read them.
 */
export async function unitChains(
  manager: EntityManager,
  lotIds: number[],
  known?: LotStart[],
): Promise<Map<number, UnitChain>> {
  const { lots, operations, links } = await unitFacts(manager, lotIds, known);
  const chains = new Map<number, UnitChain>();
  for (const lot of lots) {
    const steps = operations
      .filter((operation) => operation.lot_id === lot.id)
      .map((operation) => ({
        stepNo: operation.step_no,
        name: operation.step_name,
        qtyIn: operation.qty_in,
        qtyGood: operation.qty_good,
        qtyScrap: operation.qty_scrap,
      }));
    const outflows = links
      .filter((link) => link.parent_lot_id === lot.id)
      .map((link) => ({ afterStep: link.after_step, qty: link.qty, toLot: link.child_number }));
    chains.set(lot.id, unitChain({ qty: lot.start_qty, afterStep: lot.resumes_after_step }, steps, outflows));
  }
  return chains;
}
