import type { EntityManager } from 'typeorm';
import { insertReturningId } from '../../db/insert-returning-id';
import type { ProcessRunListQuery } from '@shared/schemas/manufacturing';
import { ProcessRun } from './entities/process-run.entity';

export interface RunRow {
  id: number;
  run_number: string;
  kind: 'passivation' | 'cleaning';
  method_id: string;
  equipment: string;
  parameters_json: string;
  window_check_json: string;
  in_window: number;
  operator_name: string;
  run_at: Date;
  recorded_by_name: string;
  lots: string | number;
}

const runSelect = `
  SELECT r.*, p.name AS recorded_by_name, (SELECT COUNT(*) FROM lot_operation o WHERE o.process_run_id = r.id) AS lots
  FROM process_run r JOIN person p ON p.id = r.recorded_by`;

/** One page of runs (newest first) matching the filters, and how many match in all. */
export async function processRunRows(
  manager: EntityManager,
  query: ProcessRunListQuery,
): Promise<{ total: number; rows: RunRow[] }> {
  const where: string[] = [];
  const parameters: unknown[] = [];
  if (query.kind) {
    where.push('r.kind = ?');
    parameters.push(query.kind);
  }
  if (query.inWindow) {
    where.push('r.in_window = ?');
    parameters.push(query.inWindow === 'true' ? 1 : 0);
  }
  if (query.search) {
    where.push('(r.run_number LIKE ? OR r.equipment LIKE ?)');
    const pattern = `%${query.search.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
    parameters.push(pattern, pattern);
  }
  const clause = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [count]: Array<{ total: string }> = await manager.query(
    `SELECT COUNT(*) AS total FROM process_run r ${clause}`,
    parameters,
  );
  const rows: RunRow[] = await manager.query(
    `${runSelect} ${clause} ORDER BY r.run_at DESC, r.id DESC LIMIT ? OFFSET ?`,
    [...parameters, query.pageSize, (query.page - 1) * query.pageSize],
  );
  return { total: Number(count?.total ?? 0), rows };
}

export async function findProcessRunRow(manager: EntityManager, id: number): Promise<RunRow | null> {
  const [row]: RunRow[] = await manager.query(`${runSelect} WHERE r.id = ?`, [id]);
  return row ?? null;
}

/** The lots a run treated, with the units each brought into it. */
export function lotsInRun(
  manager: EntityManager,
  runId: number,
): Promise<Array<{ lot_id: number; lot_number: string; part_number: string; qty_in: number }>> {
  return manager.query(
    `SELECT o.lot_id, l.lot_number, p.part_number, o.qty_in
       FROM lot_operation o JOIN production_lot l ON l.id = o.lot_id JOIN part p ON p.id = l.part_id
      WHERE o.process_run_id = ? ORDER BY l.lot_number`,
    [runId],
  );
}

export async function insertProcessRun(
  manager: EntityManager,
  run: Omit<ProcessRun, 'id' | 'recordedAt' | 'recordedByPerson'>,
): Promise<number> {
  return insertReturningId(manager, ProcessRun, run);
}
