import type { EntityManager } from 'typeorm';
import { MaterialMovement } from '../materials/entities/material-movement.entity';

export async function insertMovement(
  manager: EntityManager,
  movement: Pick<MaterialMovement, 'lotId' | 'barPieceId' | 'kind' | 'lengthMm' | 'recordedBy'>,
): Promise<void> {
  await manager.getRepository(MaterialMovement).insert(movement);
}

/** The heats whose bar was issued to the lot. */
export async function heatIdsIssuedTo(manager: EntityManager, lotId: number): Promise<number[]> {
  const rows: Array<{ heat_id: number }> = await manager.query(
    `SELECT DISTINCT b.heat_id FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id
      WHERE m.lot_id = ? AND m.kind = 'issue'`,
    [lotId],
  );
  return rows.map((row) => row.heat_id);
}

/** The numbers of the heats whose bar was issued to the lot, in order. */
export async function heatNumbersIssuedTo(manager: EntityManager, lotId: number): Promise<string[]> {
  const rows: Array<{ heat_number: string }> = await manager.query(
    `SELECT DISTINCT h.heat_number FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id
       JOIN heat h ON h.id = b.heat_id
      WHERE m.lot_id = ? AND m.kind = 'issue' ORDER BY h.heat_number`,
    [lotId],
  );
  return rows.map((row) => row.heat_number);
}

/**
 * Bar length issued to the lot less what came back, in mm (exact decimal text), of one piece or
 * of all; `lock` holds the movements until the transaction ends.
 */
export async function netLengthOut(
  manager: EntityManager,
  lotId: number,
  pieceId?: number,
  lock = false,
): Promise<string> {
  const [row]: Array<{ net: string | null }> = await manager.query(
    `SELECT SUM(CASE kind WHEN 'issue' THEN length_mm ELSE -length_mm END) AS net FROM material_movement
      WHERE lot_id = ?${pieceId === undefined ? '' : ' AND bar_piece_id = ?'}${lock ? ' FOR UPDATE' : ''}`,
    pieceId === undefined ? [lotId] : [lotId, pieceId],
  );
  return row?.net ?? '0';
}
