import type { EntityManager } from 'typeorm';

/** What a count of waiting work reads from the database: how many, and the oldest one's time. */
export interface WaitingCount {
  count: number;
  oldest: Date | null;
}

const counted = async (manager: EntityManager, sql: string, parameters: unknown[] = []): Promise<WaitingCount> => {
  const [row]: Array<{ count: string | number; oldest: Date | null }> = await manager.query(sql, parameters);
  return { count: Number(row?.count ?? 0), oldest: row?.oldest ? new Date(row.oldest) : null };
};

/** Each kind of waiting work the home screen can show, counted in the database. */
export const waitingWork = {
  heatsToDisposition: (manager: EntityManager) =>
    counted(
      manager,
      "SELECT COUNT(*) AS count, MIN(received_at) AS oldest FROM heat WHERE status IN ('received', 'quarantined')",
    ),
  lotsToReview: (manager: EntityManager) =>
    counted(
      manager,
      'SELECT COUNT(*) AS count, MIN((SELECT MAX(r.submitted_at) FROM release_submission r WHERE r.lot_id = ' +
        "l.id)) AS oldest FROM production_lot l WHERE l.status = 'submitted'",
    ),
  lotsToApprove: (manager: EntityManager) =>
    counted(
      manager,
      'SELECT COUNT(*) AS count, MIN((SELECT MAX(r.submitted_at) FROM release_submission r WHERE r.lot_id = ' +
        "l.id)) AS oldest FROM production_lot l WHERE l.status = 'reviewed'",
    ),
  lotsReturned: (manager: EntityManager) =>
    counted(
      manager,
      'SELECT COUNT(*) AS count, MIN((SELECT MAX(r.closed_at) FROM release_submission r WHERE r.lot_id = l.id ' +
        "AND r.outcome = 'returned')) AS oldest FROM production_lot l WHERE l.status = 'open' AND EXISTS " +
        "(SELECT 1 FROM release_submission r WHERE r.lot_id = l.id AND r.outcome = 'returned')",
    ),
  lotsInWork: (manager: EntityManager) =>
    counted(manager, "SELECT COUNT(*) AS count, MIN(opened_at) AS oldest FROM production_lot WHERE status = 'open'"),
  nonconformancesToDisposition: (manager: EntityManager) =>
    counted(manager, "SELECT COUNT(*) AS count, MIN(raised_at) AS oldest FROM nonconformance WHERE status = 'open'"),
  nonconformancesToClose: (manager: EntityManager) =>
    counted(
      manager,
      "SELECT COUNT(*) AS count, MIN(raised_at) AS oldest FROM nonconformance WHERE status = 'dispositioned'",
    ),
  holdsToLift: (manager: EntityManager) =>
    counted(manager, 'SELECT COUNT(*) AS count, MIN(placed_at) AS oldest FROM lot_hold WHERE lifted_at IS NULL'),
  openRecalls: (manager: EntityManager) =>
    counted(
      manager,
      "SELECT COUNT(*) AS count, MIN(opened_at) AS oldest FROM recall_investigation WHERE status = 'open' AND " +
        "mode = 'recall'",
    ),
  openDrills: (manager: EntityManager) =>
    counted(
      manager,
      "SELECT COUNT(*) AS count, MIN(opened_at) AS oldest FROM recall_investigation WHERE status = 'open' AND " +
        "mode = 'drill'",
    ),
  roleChangesToConfirm: (manager: EntityManager, personId: number) =>
    counted(
      manager,
      'SELECT COUNT(*) AS count, MIN(requested_at) AS oldest FROM role_change_request WHERE status = ' +
        "'pending' AND requested_by <> ? AND person_id <> ?",
      [personId, personId],
    ),
};

/** Lots approved for release since a day: when each was first submitted and when it was approved. */
export async function releasedSince(
  manager: EntityManager,
  since: Date,
): Promise<Array<{ submittedAt: string; releasedAt: string }>> {
  const rows: Array<{ submitted_at: Date; released_at: Date }> = await manager.query(
    `SELECT MIN(r.submitted_at) AS submitted_at, s.signed_at AS released_at
       FROM electronic_signature s JOIN release_submission r ON r.lot_id = CAST(s.record_id AS UNSIGNED)
      WHERE s.record_type = 'lot-release' AND s.meaning = 'approved-for-release' AND s.signed_at >= ?
      GROUP BY s.id, s.signed_at`,
    [since],
  );
  return rows.map((row) => ({
    submittedAt: new Date(row.submitted_at).toISOString(),
    releasedAt: new Date(row.released_at).toISOString(),
  }));
}

/** Nonconformances raised since a day, with the mill of the heat or bar they are about. */
export async function nonconformancesSince(
  manager: EntityManager,
  since: Date,
): Promise<
  Array<{
    subjectType: 'heat' | 'bar-piece' | 'lot' | 'process-run';
    source: 'raised' | 'run-window';
    supplier: string | null;
  }>
> {
  const rows: Array<{
    subject_type: 'heat' | 'bar-piece' | 'lot' | 'process-run';
    source: 'raised' | 'run-window';
    supplier: string | null;
  }> = await manager.query(
    `SELECT n.subject_type, n.source, su.name AS supplier
       FROM nonconformance n
       LEFT JOIN heat h ON n.subject_type = 'heat' AND h.id = n.subject_id
       LEFT JOIN bar_piece b ON n.subject_type = 'bar-piece' AND b.id = n.subject_id
       LEFT JOIN heat hb ON hb.id = b.heat_id
       LEFT JOIN supplier su ON su.id = COALESCE(h.supplier_id, hb.supplier_id)
      WHERE n.raised_at >= ?`,
    [since],
  );
  return rows.map((row) => ({ subjectType: row.subject_type, source: row.source, supplier: row.supplier }));
}

/**
 * Lots cut from bar, opened since a day, that finished their routing (submitted, reviewed or
 * released) and were neither split nor merged: units started and good units out of the last step.
 */
export async function finishedLotsSince(
  manager: EntityManager,
  since: Date,
): Promise<Array<{ part: string; started: number; good: number }>> {
  const rows: Array<{ part: string; started: number | null; good: number | null }> = await manager.query(
    `SELECT CONCAT(p.part_number, ' rev ', p.revision) AS part, l.start_qty AS started,
            (SELECT o.qty_good FROM lot_operation o JOIN routing_step s ON s.id = o.routing_step_id
              WHERE o.lot_id = l.id ORDER BY s.step_no DESC, o.id DESC LIMIT 1) AS good
       FROM production_lot l JOIN part p ON p.id = l.part_id
      WHERE l.origin = 'bar' AND l.status IN ('submitted', 'reviewed', 'released') AND l.opened_at >= ?
        AND NOT EXISTS (SELECT 1 FROM lot_link k WHERE k.parent_lot_id = l.id OR k.child_lot_id = l.id)`,
    [since],
  );
  return rows.map((row) => ({ part: row.part, started: Number(row.started ?? 0), good: Number(row.good ?? 0) }));
}
