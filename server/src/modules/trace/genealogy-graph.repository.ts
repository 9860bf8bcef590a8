import type { EntityManager } from 'typeorm';
import type { GenealogyRelations } from '@shared/domain/trace/genealogy-graph';
import { ancestorPieces } from './genealogy.repository';

const marks = (values: unknown[]) => values.map(() => '?').join(',');

/** Runs a query whose every `IN (?)` takes the same list of ids. */
async function rows<T>(manager: EntityManager, sql: string, ids: number[]): Promise<T[]> {
  if (!ids.length) return [];
  const lists = sql.split('(?)').length - 1;
  return manager.query(sql.replaceAll('(?)', `(${marks(ids)})`), Array.from({ length: lists }, () => ids).flat());
}

/** Every relation between the given lots and what they came from, went through and went to. */
export async function relationsOfLots(manager: EntityManager, lotIds: number[]): Promise<GenealogyRelations> {
  const issues = await rows<{ pieceId: number; lotId: number }>(
    manager,
    "SELECT DISTINCT bar_piece_id AS pieceId, lot_id AS lotId FROM material_movement WHERE kind = 'issue' AND " +
      'lot_id IN (?)',
    lotIds,
  );
  const pieceIds = await ancestorPieces(manager, [...new Set(issues.map((issue) => issue.pieceId))]);
  const pieces = await rows<{ id: number; tag: string; heatId: number; parentId: number | null }>(
    manager,
    'SELECT id, tag, heat_id AS heatId, parent_id AS parentId FROM bar_piece WHERE id IN (?)',
    pieceIds,
  );
  const heats = await rows<{ id: number; heatNumber: string; supplierId: number; status: string; specId: string }>(
    manager,
    'SELECT id, heat_number AS heatNumber, supplier_id AS supplierId, status, spec_id AS specId FROM heat ' +
      'WHERE id IN (?)',
    [...new Set(pieces.map((piece) => piece.heatId))],
  );
  const suppliers = await rows<{ id: number; name: string }>(manager, 'SELECT id, name FROM supplier WHERE id IN (?)', [
    ...new Set(heats.map((heat) => heat.supplierId)),
  ]);
  const lots = await rows<{ id: number; lotNumber: string; partNumber: string; status: string; held: number }>(
    manager,
    `SELECT l.id, l.lot_number AS lotNumber, p.part_number AS partNumber, l.status,
            EXISTS (SELECT 1 FROM lot_hold h WHERE h.lot_id = l.id AND h.lifted_at IS NULL) AS held
       FROM production_lot l JOIN part p ON p.id = l.part_id WHERE l.id IN (?)`,
    lotIds,
  );
  const lotLinks = await rows<{ parentId: number; childId: number; kind: 'split' | 'merge'; qty: number }>(
    manager,
    'SELECT parent_lot_id AS parentId, child_lot_id AS childId, kind, qty FROM lot_link WHERE parent_lot_id ' +
      'IN (?) AND child_lot_id IN (?)',
    lotIds,
  );
  const runLots = await rows<{ runId: number; lotId: number }>(
    manager,
    'SELECT DISTINCT process_run_id AS runId, lot_id AS lotId FROM lot_operation WHERE process_run_id IS NOT ' +
      'NULL AND lot_id IN (?)',
    lotIds,
  );
  const runs = await rows<{ id: number; runNumber: string; kind: string; inWindow: number }>(
    manager,
    'SELECT id, run_number AS runNumber, kind, in_window AS inWindow FROM process_run WHERE id IN (?)',
    [...new Set(runLots.map((runLot) => runLot.runId))],
  );
  const shipments = await rows<{ lotId: number; consigneeId: number; units: string }>(
    manager,
    'SELECT lot_id AS lotId, consignee_id AS consigneeId, SUM(qty) AS units FROM shipment WHERE lot_id IN (?) ' +
      'GROUP BY lot_id, consignee_id',
    lotIds,
  );
  const consignees = await rows<{ id: number; name: string; country: string }>(
    manager,
    'SELECT id, name, country FROM consignee WHERE id IN (?)',
    [...new Set(shipments.map((shipment) => shipment.consigneeId))],
  );
  return {
    suppliers,
    heats,
    pieces,
    lots: lots.map((lot) => ({ ...lot, held: Boolean(Number(lot.held)) })),
    lotLinks: lotLinks.map((entry) => ({ ...entry, qty: Number(entry.qty) })),
    issues,
    runs: runs.map((run) => ({ ...run, inWindow: Boolean(Number(run.inWindow)) })),
    runLots,
    consignees,
    shipments: shipments.map((shipment) => ({ ...shipment, units: Number(shipment.units) })),
  };
}
