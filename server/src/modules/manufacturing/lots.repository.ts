import type { EntityManager } from 'typeorm';
import { lockLot } from './production-lot.repository';
import { insertReturningId } from '../../db/insert-returning-id';
import { LotLink } from './entities/lot-link.entity';
import { LotOperation } from './entities/lot-operation.entity';
import { ProductionLot } from './entities/production-lot.entity';
import type { LotListQuery, LotSummary } from '@shared/schemas/manufacturing';

export interface LotRow {
  id: number;
  lot_number: string;
  part_id: number;
  part_number: string;
  revision: string;
  description: string;
  planned_qty: number;
  start_qty: number | null;
  origin: LotSummary['origin'];
  resumes_after_step: number;
  status: LotSummary['status'];
  released_qty: number;
  opened_at: Date;
  opened_by: number;
  opened_by_name: string;
  next_step: string | null;
  open_ncs: string | number;
}

const lotSelect = `
  SELECT l.*, p.part_number, p.revision, p.description, person.name AS opened_by_name,
         (SELECT s.name FROM routing_step s WHERE s.part_id = l.part_id AND s.step_no > l.resumes_after_step
             AND NOT EXISTS (SELECT 1 FROM lot_operation o WHERE o.lot_id = l.id AND
               o.routing_step_id = s.id) ORDER BY s.step_no LIMIT 1) AS next_step,
         (SELECT COUNT(*) FROM nonconformance n WHERE n.lot_id = l.id AND n.status <> 'closed') AS open_ncs
  FROM production_lot l JOIN part p ON p.id = l.part_id JOIN person ON person.id = l.opened_by`;

export function toLotSummary(row: LotRow, onHand: number | null, heats: string[]): LotSummary {
  return {
    id: row.id,
    lotNumber: row.lot_number,
    part: { id: row.part_id, partNumber: row.part_number, revision: row.revision, description: row.description },
    plannedQty: row.planned_qty,
    status: row.status,
    origin: row.origin,
    onHand,
    heats,
    nextStep: row.next_step,
    openNonconformances: Number(row.open_ncs),
    openedAt: new Date(row.opened_at).toISOString(),
    openedBy: row.opened_by_name,
  };
}

export async function findLotRow(manager: EntityManager, id: number, lock = false): Promise<LotRow | null> {
  if (lock) await lockLot(manager, id);
  const [row]: LotRow[] = await manager.query(`${lotSelect} WHERE l.id = ?`, [id]);
  return row ?? null;
}

export async function findLotIdByNumber(manager: EntityManager, lotNumber: string): Promise<number | null> {
  const [row]: Array<{ id: number }> = await manager.query('SELECT id FROM production_lot WHERE lot_number = ?', [
    lotNumber,
  ]);
  return row?.id ?? null;
}

const sortColumns = { lotNumber: 'l.lot_number', openedAt: 'l.opened_at', status: 'l.status' } as const;

export async function listLotRows(
  manager: EntityManager,
  query: LotListQuery,
): Promise<{ rows: LotRow[]; total: number }> {
  const where: string[] = [];
  const parameters: unknown[] = [];
  if (query.search) {
    const pattern = `%${query.search.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
    where.push('(l.lot_number LIKE ? OR p.part_number LIKE ?)');
    parameters.push(pattern, pattern);
  }
  if (query.status) {
    where.push('l.status = ?');
    parameters.push(query.status);
  }
  if (query.partId) {
    where.push('l.part_id = ?');
    parameters.push(query.partId);
  }
  if (query.dueFor) {
    where.push(`l.status = 'open' AND (SELECT s.kind FROM routing_step s
                  WHERE s.part_id = l.part_id AND s.step_no > l.resumes_after_step
                    AND NOT EXISTS (SELECT 1 FROM lot_operation o WHERE o.lot_id = l.id AND o.routing_step_id = s.id)
                  ORDER BY s.step_no LIMIT 1) = ?`);
    parameters.push(query.dueFor);
  }
  const clause = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [count]: Array<{ total: string }> = await manager.query(
    `SELECT COUNT(*) AS total FROM production_lot l JOIN part p ON p.id = l.part_id ${clause}`,
    parameters,
  );
  const order =
    `${sortColumns[query.sort]} ${query.order === 'asc' ? 'ASC' : 'DESC'}, l.id ` +
    `${query.order === 'asc' ? 'ASC' : 'DESC'}`;
  // The page's ids first, so that the per-lot subqueries run for one page of lots, not all of them.
  const rows: LotRow[] = await manager.query(
    `${lotSelect} JOIN (SELECT l.id FROM production_lot l JOIN part p ON p.id = l.part_id ${clause} ORDER BY ` +
      `${order} LIMIT ? OFFSET ?) page ON page.id = l.id ORDER BY ${order}`,
    [...parameters, query.pageSize, (query.page - 1) * query.pageSize],
  );
  return { rows, total: Number(count?.total ?? 0) };
}

export interface OperationRow {
  id: number;
  lot_id: number;
  routing_step_id: number;
  step_no: number;
  step_name: string;
  kind: string;
  operator_name: string;
  work_centre: string;
  program_revision: string | null;
  started_at: Date;
  ended_at: Date;
  qty_in: number;
  qty_good: number;
  qty_scrap: number;
  scrap_reasons: string;
  sample_size: number | null;
  defects_found: number | null;
  verdict: 'accept' | 'reject' | null;
  process_run_id: number | null;
  run_number: string | null;
  in_window: number | null;
  notes: string | null;
  recorded_by_name: string;
  recorded_by: number;
  recorded_at: Date;
}

export async function operationRows(manager: EntityManager, lotIds: number[]): Promise<OperationRow[]> {
  if (!lotIds.length) return [];
  return manager.query(
    `SELECT o.*, s.step_no, s.name AS step_name, s.kind, r.run_number, r.in_window, p.name AS recorded_by_name
       FROM lot_operation o JOIN routing_step s ON s.id = o.routing_step_id
       LEFT JOIN process_run r ON r.id = o.process_run_id JOIN person p ON p.id = o.recorded_by
      WHERE o.lot_id IN (${lotIds.map(() => '?').join(',')}) ORDER BY o.lot_id, s.step_no, o.id`,
    lotIds,
  );
}

export interface LinkRow {
  parent_lot_id: number;
  child_lot_id: number;
  kind: 'split' | 'merge';
  qty: number;
  after_step: number;
  parent_number: string;
  child_number: string;
  recorded_at: Date;
  recorded_by_name: string;
}

export async function linkRows(manager: EntityManager, lotIds: number[]): Promise<LinkRow[]> {
  if (!lotIds.length) return [];
  const marks = lotIds.map(() => '?').join(',');
  return manager.query(
    `SELECT k.*, pl.lot_number AS parent_number, cl.lot_number AS child_number, p.name AS recorded_by_name
       FROM lot_link k JOIN production_lot pl ON pl.id = k.parent_lot_id JOIN production_lot cl ON cl.id =
         k.child_lot_id JOIN person p ON p.id = k.recorded_by
      WHERE k.parent_lot_id IN (${marks}) OR k.child_lot_id IN (${marks})`,
    [...lotIds, ...lotIds],
  );
}

export interface LotStart {
  id: number;
  start_qty: number | null;
  resumes_after_step: number;
}

/** What unit-chain needs for a set of lots: start, recorded steps and outflows (only those columns). */
export async function unitFacts(manager: EntityManager, lotIds: number[], known?: LotStart[]) {
  if (!lotIds.length) return { lots: [], operations: [], links: [] };
  const marks = lotIds.map(() => '?').join(',');
  const [lots, operations, links] = await Promise.all([
    known ??
      (manager.query(
        `SELECT id, start_qty, resumes_after_step FROM production_lot WHERE id IN (${marks})`,
        lotIds,
      ) as Promise<LotStart[]>),
    manager.query(
      `SELECT o.lot_id, s.step_no, s.name AS step_name, o.qty_in, o.qty_good, o.qty_scrap
         FROM lot_operation o JOIN routing_step s ON s.id = o.routing_step_id
        WHERE o.lot_id IN (${marks}) ORDER BY o.lot_id, s.step_no, o.id`,
      lotIds,
    ) as Promise<Array<Pick<OperationRow, 'lot_id' | 'step_no' | 'step_name' | 'qty_in' | 'qty_good' | 'qty_scrap'>>>,
    manager.query(
      `SELECT k.parent_lot_id, k.after_step, k.qty, cl.lot_number AS child_number
         FROM lot_link k JOIN production_lot cl ON cl.id = k.child_lot_id
        WHERE k.parent_lot_id IN (${marks}) ORDER BY k.parent_lot_id, k.child_lot_id`,
      lotIds,
    ) as Promise<Array<Pick<LinkRow, 'parent_lot_id' | 'after_step' | 'qty' | 'child_number'>>>,
  ]);
  return { lots, operations, links };
}

/** The heats each lot's units came from: its own bar, or its ancestors' through splits and merges (lot_heat). */
export async function heatsByLot(manager: EntityManager, lotIds: number[]): Promise<Map<number, string[]>> {
  const result = new Map<number, string[]>(lotIds.map((id) => [id, []]));
  if (!lotIds.length) return result;
  const rows: Array<{ root: number; heat_number: string }> = await manager.query(
    `SELECT lh.lot_id AS root, h.heat_number FROM lot_heat lh JOIN heat h ON h.id = lh.heat_id WHERE ` +
      `lh.lot_id IN (${lotIds.map(() => '?').join(',')}) ORDER BY h.heat_number`,
    lotIds,
  );
  for (const row of rows) result.get(row.root)?.push(row.heat_number);
  return result;
}

/** The last routing step a lot has completed (its own, or the one it resumed after). */
export async function lastStepOf(manager: EntityManager, lotId: number): Promise<number> {
  const [row]: Array<{ last: number | null; resumes: number }> = await manager.query(
    `SELECT (SELECT MAX(s.step_no) FROM lot_operation o JOIN routing_step s ON s.id = o.routing_step_id WHERE
        o.lot_id = l.id) AS last, l.resumes_after_step AS resumes
       FROM production_lot l WHERE l.id = ?`,
    [lotId],
  );
  return Math.max(row?.last ?? 0, row?.resumes ?? 0);
}

export async function insertLotRow(
  manager: EntityManager,
  lot: Pick<
    ProductionLot,
    'lotNumber' | 'partId' | 'plannedQty' | 'startQty' | 'origin' | 'resumesAfterStep' | 'openedBy' | 'openedAt'
  >,
): Promise<number> {
  return insertReturningId(manager, ProductionLot, lot);
}

export async function insertLotLink(
  manager: EntityManager,
  link: Pick<LotLink, 'parentLotId' | 'childLotId' | 'kind' | 'qty' | 'afterStep' | 'recordedBy'>,
): Promise<void> {
  await manager.getRepository(LotLink).insert(link);
}

/** The routing step numbers recorded on the lot. */
export async function recordedStepNos(manager: EntityManager, lotId: number): Promise<number[]> {
  const rows = await manager
    .getRepository(LotOperation)
    .find({ select: { id: true, routingStep: { stepNo: true } }, where: { lotId }, relations: { routingStep: true } });
  return rows.map((row) => row.routingStep!.stepNo);
}

export async function insertOperation(
  manager: EntityManager,
  operation: Omit<LotOperation, 'id' | 'processRunId' | 'recordedAt' | 'lot' | 'recordedByPerson' | 'routingStep'> & {
    processRunId?: number | null;
  },
): Promise<number> {
  return insertReturningId(manager, LotOperation, operation);
}

/** The units a bar lot started with, set by its first recorded step. */
export async function setStartQty(manager: EntityManager, lotId: number, startQty: number): Promise<void> {
  await manager.getRepository(ProductionLot).update({ id: lotId }, { startQty });
}
