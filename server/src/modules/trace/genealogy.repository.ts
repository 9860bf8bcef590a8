import type { EntityManager } from 'typeorm';

const marks = (values: unknown[]) => values.map(() => '?').join(',');

/** The lot and every lot its units came from through splits and merges. */
export async function ancestorLots(manager: EntityManager, lotIds: number[]): Promise<number[]> {
  if (!lotIds.length) return [];
  const rows: Array<{ id: number }> = await manager.query(
    `WITH RECURSIVE up (id) AS (SELECT id FROM production_lot WHERE id IN (${marks(lotIds)})
       UNION SELECT k.parent_lot_id FROM lot_link k JOIN up ON k.child_lot_id = up.id)
     SELECT id FROM up`,
    lotIds,
  );
  return rows.map((row) => row.id);
}

/** The lots and every lot their units went on to through splits and merges. */
export async function descendantLots(manager: EntityManager, lotIds: number[]): Promise<number[]> {
  if (!lotIds.length) return [];
  const rows: Array<{ id: number }> = await manager.query(
    `WITH RECURSIVE down (id) AS (SELECT id FROM production_lot WHERE id IN (${marks(lotIds)})
       UNION SELECT k.child_lot_id FROM lot_link k JOIN down ON k.parent_lot_id = down.id)
     SELECT id FROM down`,
    lotIds,
  );
  return rows.map((row) => row.id);
}

/** Bar pieces and every piece cut from them. */
export async function descendantPieces(manager: EntityManager, pieceIds: number[]): Promise<number[]> {
  if (!pieceIds.length) return [];
  const rows: Array<{ id: number }> = await manager.query(
    `WITH RECURSIVE cut (id) AS (SELECT id FROM bar_piece WHERE id IN (${marks(pieceIds)})
       UNION SELECT b.id FROM bar_piece b JOIN cut ON b.parent_id = cut.id)
     SELECT id FROM cut`,
    pieceIds,
  );
  return rows.map((row) => row.id);
}

/** Lots that bar from these pieces was issued to. */
export async function lotsFromPieces(manager: EntityManager, pieceIds: number[]): Promise<number[]> {
  if (!pieceIds.length) return [];
  const rows: Array<{ lot_id: number }> = await manager.query(`SELECT DISTINCT lot_id FROM material_movement WHERE kind = 'issue' AND bar_piece_id IN (${marks(pieceIds)})`, pieceIds);
  return rows.map((row) => row.lot_id);
}

export async function piecesOfHeats(manager: EntityManager, heatIds: number[]): Promise<number[]> {
  if (!heatIds.length) return [];
  const rows: Array<{ id: number }> = await manager.query(`SELECT id FROM bar_piece WHERE heat_id IN (${marks(heatIds)})`, heatIds);
  return rows.map((row) => row.id);
}

export async function lotsInRuns(manager: EntityManager, runIds: number[]): Promise<number[]> {
  if (!runIds.length) return [];
  const rows: Array<{ lot_id: number }> = await manager.query(`SELECT DISTINCT lot_id FROM lot_operation WHERE process_run_id IN (${marks(runIds)})`, runIds);
  return rows.map((row) => row.lot_id);
}
