import type { EntityManager } from 'typeorm';

/**
 * The heats each lot is made of (table lot_heat), kept in the transaction that changes them: an
 * issue of bar adds its heat to the lot and to every lot already split or merged from it; a split
 * or merge gives the new lot every heat of its parents. Forward traces from a heat or a supplier
 * read this table instead of walking the genealogy.
 */

/** Every (heat, lot) pair the genealogy implies, derived by walking it: what lot_heat must hold. */
export const derivedLotHeatsSql = `WITH RECURSIVE made_of (heat_id, lot_id) AS (
    SELECT b.heat_id, m.lot_id FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id WHERE m.kind = 'issue'
    UNION SELECT made_of.heat_id, k.child_lot_id FROM lot_link k JOIN made_of ON k.parent_lot_id = made_of.lot_id)
  SELECT heat_id, lot_id FROM made_of`;

/** Bar of this heat was issued to the lot: the lot and the lots made from it are now made of the heat too. */
export async function addHeatToLot(manager: EntityManager, lotId: number, heatId: number): Promise<void> {
  await manager.query(
    `INSERT INTO lot_heat (heat_id, lot_id)
     SELECT ?, below.id FROM (
       WITH RECURSIVE below (id) AS (SELECT ? UNION SELECT k.child_lot_id FROM lot_link k JOIN below ON
         k.parent_lot_id = below.id) SELECT id FROM below) AS below
      WHERE NOT EXISTS (SELECT 1 FROM lot_heat x WHERE x.heat_id = ? AND x.lot_id = below.id)`,
    [heatId, lotId, heatId],
  );
}

/** A lot split or merged from these parents is made of every heat they are made of. */
export async function inheritHeats(manager: EntityManager, lotId: number, parentIds: number[]): Promise<void> {
  await manager.query(
    `INSERT INTO lot_heat (heat_id, lot_id) SELECT DISTINCT heat_id, ? FROM lot_heat WHERE lot_id IN ` +
      `(${parentIds.map(() => '?').join(',')})`,
    [lotId, ...parentIds],
  );
}
