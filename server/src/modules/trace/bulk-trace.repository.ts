import type { EntityManager } from 'typeorm';

export interface BulkLotRow {
  id: number;
  lot_number: string;
  status: string;
  gtin: string;
  part_number: string;
  held: number | string;
  heats: string | null;
}

/**
 * The lots with these numbers, their active holds and their heats, in one statement for the
 * whole list (never one per line): an IN list over the unique lot-number index, which MariaDB
 * reads as lookups whatever the list's length.
 */
export async function lotsNumbered(manager: EntityManager, lotNumbers: string[]): Promise<BulkLotRow[]> {
  if (!lotNumbers.length) return [];
  return manager.query(
    `SELECT l.id, l.lot_number, l.status, p.gtin, p.part_number,
            EXISTS (SELECT 1 FROM lot_hold h WHERE h.lot_id = l.id AND h.lifted_at IS NULL) AS held,
            (SELECT GROUP_CONCAT(DISTINCT x.heat_number ORDER BY x.heat_number SEPARATOR ' ')
               FROM lot_heat lh JOIN heat x ON x.id = lh.heat_id WHERE lh.lot_id = l.id) AS heats
       FROM production_lot l JOIN part p ON p.id = l.part_id
      WHERE l.lot_number IN (?)`,
    [lotNumbers],
  );
}

/** The lots in the latest traced scope of each open recall (not drills), with the recall's number. */
export async function openRecallScopes(
  manager: EntityManager,
): Promise<Array<{ recall_number: string; lot_ids: number[] }>> {
  const rows: Array<{ recall_number: string; lot_ids: string | number[] | null }> = await manager.query(
    `SELECT r.recall_number,
            JSON_EXTRACT(s.content, '$.trace.lots[*].id') AS lot_ids
       FROM recall_investigation r
       JOIN recall_snapshot s ON s.id = (SELECT MAX(x.id) FROM recall_snapshot x WHERE x.recall_id = r.id)
      WHERE r.status = 'open' AND r.mode = 'recall'`,
  );
  // The driver hands JSON back parsed or as text, depending on how the server labels the column.
  return rows.map((row) => ({
    recall_number: row.recall_number,
    lot_ids: typeof row.lot_ids === 'string' ? (JSON.parse(row.lot_ids) as number[]) : (row.lot_ids ?? []),
  }));
}
