import type { EntityManager } from 'typeorm';

/**
 * Why a heat's bar may not go into a lot now, besides the heat's own status: an open recall (not a
 * drill) started from the heat, the bar piece or the heat's supplier (within its received-date window), or a
 * nonconformance
 * on the heat or the piece that is not closed. Each reason names its record number. For a lot
 * already made from the bar (liftedFor: the lot and the lots it came from), a recall whose hold on
 * one of those lots a QA approver has lifted by signature no longer counts: that is the decision.
 */
// Holds a QA approver lifted on these very lots no longer count.
const liftedHere =
  'AND NOT EXISTS (SELECT 1 FROM lot_hold lh ' +
  'WHERE lh.recall_id = r.id AND lh.lot_id IN (?) AND lh.lifted_at IS NOT NULL)';

export async function materialHolds(
  manager: EntityManager,
  material: { heatId: number; pieceId: number; supplierId: number },
  liftedFor: number[] = [],
): Promise<string[]> {
  // A piece cut from a recalled or nonconforming piece is held with it: the piece and every piece it was cut from.
  const lineage: Array<{ id: number }> = await manager.query(
    `WITH RECURSIVE up (id, parent_id) AS (SELECT id, parent_id FROM bar_piece WHERE id = ? UNION ALL SELECT b.id,
        b.parent_id FROM bar_piece b JOIN up ON b.id = up.parent_id)
     SELECT id FROM up`,
    [material.pieceId],
  );
  const pieces = lineage.map((row) => Number(row.id));
  const recalls: Array<{ recall_number: string; trigger_label: string }> = await manager.query(
    `SELECT r.recall_number, r.trigger_label FROM recall_investigation r JOIN heat h ON h.id = ?
      WHERE r.status = 'open' AND r.mode = 'recall'
        AND ((r.trigger_kind = 'heat' AND r.trigger_id = h.id) OR (r.trigger_kind = 'piece' AND r.trigger_id IN (?))
          OR (r.trigger_kind = 'supplier' AND r.trigger_id = ? AND (r.window_from IS NULL OR
            DATE(h.received_at) >= r.window_from) AND (r.window_to IS NULL OR DATE(h.received_at) <= r.window_to)))
          ${liftedFor.length ? liftedHere : ''}
      ORDER BY r.recall_number`,
    [material.heatId, pieces, material.supplierId, ...(liftedFor.length ? [liftedFor] : [])],
  );
  const nonconformances: Array<{ nc_number: string; subject_type: string; status: string }> = await manager.query(
    `SELECT nc_number, subject_type, status FROM nonconformance
      WHERE status <> 'closed' AND ((subject_type = 'heat' AND subject_id = ?) OR (subject_type =
        'bar-piece' AND subject_id IN (?)))
      ORDER BY nc_number`,
    [material.heatId, pieces],
  );
  return [
    ...recalls.map((recall) => `recall investigation ${recall.recall_number} is open (${recall.trigger_label})`),
    ...nonconformances.map(
      (nc) =>
        `nonconformance ${nc.nc_number} on the ${nc.subject_type === 'heat' ? 'heat' : 'bar piece'} is ` +
        `${nc.status === 'open' ? 'open' : 'not yet closed'}`,
    ),
  ];
}
