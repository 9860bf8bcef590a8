import type { EntityManager } from 'typeorm';
import { insertReturningId } from '../../db/insert-returning-id';
import type { RecallListQuery } from '@shared/schemas/recall';
import { RecallInvestigation } from './entities/recall-investigation.entity';
import { RecallSnapshot } from './entities/recall-snapshot.entity';

export interface RecallRow {
  id: number;
  recall_number: string;
  mode: 'recall' | 'drill';
  status: 'open' | 'closed';
  trigger_kind: 'heat' | 'piece' | 'run' | 'supplier' | 'part';
  trigger_id: number;
  window_from: string | null;
  window_to: string | null;
  trigger_label: string;
  reason: string;
  opened_by_id: number;
  opened_by: string;
  opened_at: Date;
  closed_at: Date | null;
  affected_lots: string | number | null;
  active_holds: string | number;
}

export interface SnapshotRow {
  id: number;
  kind: 'opening' | 'rerun';
  taken_at: Date;
  taken_by: string;
  sha256: string;
  content?: string;
}

const recallSelect = `SELECT r.id, r.recall_number, r.mode, r.status, r.trigger_kind, r.trigger_id,
    DATE_FORMAT(r.window_from, '%Y-%m-%d') AS window_from,
                             DATE_FORMAT(r.window_to, '%Y-%m-%d') AS window_to,
                               r.trigger_label, r.reason, r.opened_by AS opened_by_id, p.name AS opened_by,
                               r.opened_at, r.closed_at,
                             (SELECT JSON_LENGTH(s.content, '$.trace.lots') FROM
                               recall_snapshot s WHERE s.recall_id = r.id ORDER BY s.id DESC LIMIT 1) AS
                               affected_lots,
                             (SELECT COUNT(*) FROM lot_hold h WHERE h.recall_id =
                               r.id AND h.lifted_at IS NULL) AS active_holds
                        FROM recall_investigation r JOIN person p ON p.id = r.opened_by`;

export async function findRecallRow(manager: EntityManager, id: number, lock = false): Promise<RecallRow | null> {
  const [row]: RecallRow[] = await manager.query(`${recallSelect} WHERE r.id = ?${lock ? ' FOR UPDATE' : ''}`, [id]);
  return row ?? null;
}

/** One page of investigations (newest first) and how many match in all. */
export async function recallRows(
  manager: EntityManager,
  query: RecallListQuery,
): Promise<{ total: number; rows: RecallRow[] }> {
  const where: string[] = [];
  const parameters: unknown[] = [];
  for (const [column, value] of [
    ['r.status', query.status],
    ['r.mode', query.mode],
  ] as const) {
    if (!value) continue;
    where.push(`${column} = ?`);
    parameters.push(value);
  }
  const clause = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [count]: Array<{ total: string }> = await manager.query(
    `SELECT COUNT(*) AS total FROM recall_investigation r ${clause}`,
    parameters,
  );
  const rows: RecallRow[] = await manager.query(
    `${recallSelect} ${clause} ORDER BY r.opened_at DESC, r.id DESC LIMIT ? OFFSET ?`,
    [...parameters, query.pageSize, (query.page - 1) * query.pageSize],
  );
  return { total: Number(count?.total ?? 0), rows };
}

/** A snapshot with its content: the given one, or the opening one. */
export async function snapshotRow(
  manager: EntityManager,
  recallId: number,
  snapshotId?: number,
): Promise<SnapshotRow | null> {
  const rows: SnapshotRow[] = await manager.query(
    `SELECT s.id, s.kind, s.taken_at, p.name AS taken_by, s.sha256, s.content FROM recall_snapshot s JOIN person p
        ON p.id = s.taken_by
      WHERE s.recall_id = ? ${snapshotId ? 'AND s.id = ?' : "AND s.kind = 'opening'"} ORDER BY s.id LIMIT 1`,
    snapshotId ? [recallId, snapshotId] : [recallId],
  );
  return rows[0] ?? null;
}

/** The investigation's re-run snapshots, oldest first, without their content. */
export function rerunSnapshots(manager: EntityManager, recallId: number): Promise<SnapshotRow[]> {
  return manager.query(
    `SELECT s.id, s.kind, s.taken_at, p.name AS taken_by, s.sha256 FROM recall_snapshot s JOIN person p ON p.id =
        s.taken_by
      WHERE s.recall_id = ? AND s.kind = 'rerun' ORDER BY s.id`,
    [recallId],
  );
}

export async function insertSnapshot(
  manager: EntityManager,
  snapshot: Pick<RecallSnapshot, 'recallId' | 'kind' | 'takenBy' | 'takenAt' | 'content' | 'sha256'>,
): Promise<number> {
  return insertReturningId(manager, RecallSnapshot, snapshot);
}

export async function insertRecall(
  manager: EntityManager,
  recall: Pick<
    RecallInvestigation,
    | 'recallNumber'
    | 'mode'
    | 'triggerKind'
    | 'triggerId'
    | 'windowFrom'
    | 'windowTo'
    | 'triggerLabel'
    | 'reason'
    | 'openedBy'
  >,
): Promise<number> {
  return insertReturningId(manager, RecallInvestigation, recall);
}

export async function closeRecall(manager: EntityManager, id: number): Promise<void> {
  await manager.getRepository(RecallInvestigation).update({ id }, { status: 'closed', closedAt: new Date() });
}

const chunked = <T>(items: T[], size = 1000): T[][] =>
  Array.from({ length: Math.ceil(items.length / size) }, (_, index) => items.slice(index * size, (index + 1) * size));

/** Rows of `sql` (with one IN list) for every chunk of ids: a supplier-wide scope holds tens of thousands of lots. */
async function perLots<Row>(manager: EntityManager, sql: (marks: string) => string, ids: number[]): Promise<Row[]> {
  const rows: Row[] = [];
  for (const chunk of chunked(ids))
    rows.push(...((await manager.query(sql(chunk.map(() => '?').join(', ')), chunk)) as Row[]));
  return rows;
}

/** What a drill report needs of each lot in scope: its heats (with certificates), units shipped, lots made from it. */
export async function drillLotFacts(manager: EntityManager, ids: number[]) {
  const heats = await perLots<{ lot_id: number; heat_number: string; status: string; certificates: string }>(
    manager,
    (marks) =>
      `SELECT lh.lot_id, h.heat_number, h.status, (SELECT COUNT(*) FROM heat_certificate c WHERE c.heat_id = h.id)
          AS certificates
         FROM lot_heat lh JOIN heat h ON h.id = lh.heat_id WHERE lh.lot_id IN (${marks}) ORDER BY h.heat_number`,
    ids,
  );
  const shipped = await perLots<{ lot_id: number; units: string }>(
    manager,
    (marks) => `SELECT lot_id, SUM(qty) AS units FROM shipment WHERE lot_id IN (${marks}) GROUP BY lot_id`,
    ids,
  );
  const children = await perLots<{ parent_lot_id: number; child_lot_id: number; lot_number: string; qty: number }>(
    manager,
    (marks) =>
      `SELECT k.parent_lot_id, k.child_lot_id, c.lot_number, k.qty FROM lot_link k JOIN production_lot c ON c.id =
          k.child_lot_id
        WHERE k.parent_lot_id IN (${marks}) ORDER BY c.lot_number`,
    ids,
  );
  return { heats, shipped, children };
}
