import type { EntityManager } from 'typeorm';

const marks = (values: unknown[]) => values.map(() => '?').join(',');

/**
 * Every row reachable from the given ids by following one link repeatedly (a recursive CTE):
 * from a lot up to its parents or down to its children, from a bar piece down to its cuts.
 */
async function reachable(
  manager: EntityManager,
  ids: number[],
  walk: { table: string; step: string },
): Promise<number[]> {
  if (!ids.length) return [];
  const rows: Array<{ id: number }> = await manager.query(
    `WITH RECURSIVE reached (id) AS (SELECT id FROM ${walk.table} WHERE id IN (${marks(ids)}) UNION ` +
      `${walk.step}) SELECT id FROM reached`,
    ids,
  );
  return rows.map((row) => row.id);
}

/** The lots and every lot their units came from through splits and merges. */
export const ancestorLots = (manager: EntityManager, lotIds: number[]) =>
  reachable(manager, lotIds, {
    table: 'production_lot',
    step: 'SELECT k.parent_lot_id FROM lot_link k JOIN reached ON k.child_lot_id = reached.id',
  });

/** Bar pieces and every piece cut from them. */
export const descendantPieces = (manager: EntityManager, pieceIds: number[]) =>
  reachable(manager, pieceIds, {
    table: 'bar_piece',
    step: 'SELECT b.id FROM bar_piece b JOIN reached ON b.parent_id = reached.id',
  });

/** Bar pieces and every piece they were cut from, up to the bar as received. */
export const ancestorPieces = (manager: EntityManager, pieceIds: number[]) =>
  reachable(manager, pieceIds, {
    table: 'bar_piece',
    step: 'SELECT b.parent_id FROM bar_piece b JOIN reached ON b.id = reached.id WHERE b.parent_id IS NOT NULL',
  });

/** Lots that bar from these pieces was issued to. */
export async function lotsFromPieces(manager: EntityManager, pieceIds: number[]): Promise<number[]> {
  if (!pieceIds.length) return [];
  const rows: Array<{ lot_id: number }> = await manager.query(
    `SELECT DISTINCT lot_id FROM material_movement WHERE kind = 'issue' AND bar_piece_id IN (${marks(pieceIds)})`,
    pieceIds,
  );
  return rows.map((row) => row.lot_id);
}
