import type { EntityManager } from 'typeorm';

export interface BulkLotRow {
  idx: number;
  id: number;
  lot_number: string;
  status: string;
  gtin: string;
  part_number: string;
  held: number | string;
  heats: string | null;
}

/**
 * Every asked key (index, GTIN or null, lot number) that names a lot, in one statement: the keys
 * go in as a JSON array read by JSON_TABLE and are joined to the lots, their active holds and their
 * heats — one query for the whole list, never one per line.
 */
export async function lotsOfKeys(
  manager: EntityManager,
  keys: Array<[number, string | null, string]>,
): Promise<BulkLotRow[]> {
  if (!keys.length) return [];
  return manager.query(
    `SELECT k.idx, l.id, l.lot_number, l.status, p.gtin, p.part_number,
            EXISTS (SELECT 1 FROM lot_hold h WHERE h.lot_id = l.id AND h.lifted_at IS NULL) AS held,
            (SELECT GROUP_CONCAT(DISTINCT x.heat_number ORDER BY x.heat_number SEPARATOR ' ')
               FROM lot_heat lh JOIN heat x ON x.id = lh.heat_id WHERE lh.lot_id = l.id) AS heats
       FROM JSON_TABLE(?, '$[*]' COLUMNS (
              idx INT PATH '$[0]', gtin VARCHAR(14) PATH '$[1]', lot VARCHAR(20) PATH '$[2]')) k
       JOIN production_lot l ON l.lot_number = k.lot
       JOIN part p ON p.id = l.part_id
      WHERE k.gtin IS NULL OR p.gtin = k.gtin`,
    [JSON.stringify(keys)],
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
