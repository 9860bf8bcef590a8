import { In, type EntityManager } from 'typeorm';
import type { NonconformanceSummary } from '@shared/schemas/lot-detail';
import type { NonconformanceListQuery } from '@shared/schemas/manufacturing';
import { nextSequence } from './numbering.repository';
import { Nonconformance as NonconformanceEntity } from './entities/nonconformance.entity';

interface NcRow {
  id: number;
  nc_number: string;
  subject_type: NonconformanceSummary['subjectType'];
  subject_id: number;
  lot_id: number | null;
  lot_number: string | null;
  process_run_id: number | null;
  run_number: string | null;
  source: NonconformanceSummary['source'];
  description: string;
  containment: string;
  status: NonconformanceSummary['status'];
  disposition: NonconformanceSummary['disposition'];
  disposition_note: string | null;
  raised_by: number;
  raised_by_name: string;
  raised_at: Date;
  subject_label: string | null;
}

const ncSelect = `
  SELECT n.*, l.lot_number, r.run_number, p.name AS raised_by_name,
         CASE n.subject_type
           WHEN 'heat' THEN (SELECT CONCAT('Heat ', heat_number) FROM heat WHERE id = n.subject_id)
           WHEN 'bar-piece' THEN (SELECT CONCAT('Bar ', tag) FROM bar_piece WHERE id = n.subject_id)
           WHEN 'lot' THEN (SELECT CONCAT('Lot ', lot_number) FROM production_lot WHERE id = n.subject_id)
           ELSE (SELECT CONCAT('Run ', run_number) FROM process_run WHERE id = n.subject_id)
         END AS subject_label
  FROM nonconformance n LEFT JOIN production_lot l ON l.id = n.lot_id LEFT JOIN process_run r ON r.id =
    n.process_run_id JOIN person p ON p.id = n.raised_by`;

export function toNonconformance(row: NcRow): NonconformanceSummary & { raisedById: number } {
  return {
    id: row.id,
    ncNumber: row.nc_number,
    subjectType: row.subject_type,
    subjectId: row.subject_id,
    subjectLabel: row.subject_label ?? `${row.subject_type} ${row.subject_id}`,
    lotNumber: row.lot_number,
    runNumber: row.run_number,
    source: row.source,
    description: row.description,
    containment: row.containment,
    status: row.status,
    disposition: row.disposition,
    dispositionNote: row.disposition_note,
    raisedBy: row.raised_by_name,
    raisedById: row.raised_by,
    raisedAt: new Date(row.raised_at).toISOString(),
  };
}

export async function findNonconformance(manager: EntityManager, id: number, lock = false) {
  if (lock) await manager.query('SELECT id FROM nonconformance WHERE id = ? FOR UPDATE', [id]);
  const [row]: NcRow[] = await manager.query(`${ncSelect} WHERE n.id = ?`, [id]);
  return row ? toNonconformance(row) : null;
}

export async function nonconformancesWhere(manager: EntityManager, clause: string, parameters: unknown[]) {
  const rows: NcRow[] = await manager.query(
    `${ncSelect} WHERE ${clause} ORDER BY n.raised_at DESC, n.id DESC`,
    parameters,
  );
  return rows.map(toNonconformance);
}

export async function listNonconformanceRows(manager: EntityManager, query: NonconformanceListQuery) {
  const where: string[] = [];
  const parameters: unknown[] = [];
  if (query.status) {
    where.push('n.status = ?');
    parameters.push(query.status);
  }
  if (query.subjectType) {
    where.push('n.subject_type = ?');
    parameters.push(query.subjectType);
  }
  if (query.lotId) {
    where.push('n.lot_id = ?');
    parameters.push(query.lotId);
  }
  const clause = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [count]: Array<{ total: string }> = await manager.query(
    `SELECT COUNT(*) AS total FROM nonconformance n ${clause}`,
    parameters,
  );
  const rows: NcRow[] = await manager.query(
    `${ncSelect} ${clause} ORDER BY n.raised_at DESC, n.id DESC LIMIT ? OFFSET ?`,
    [...parameters, query.pageSize, (query.page - 1) * query.pageSize],
  );
  return { items: rows.map(toNonconformance), total: Number(count?.total ?? 0) };
}

export async function insertNonconformance(
  manager: EntityManager,
  nc: {
    subjectType: NonconformanceSummary['subjectType'];
    subjectId: number;
    lotId: number | null;
    runId: number | null;
    source: NonconformanceSummary['source'];
    description: string;
    containment: string;
    raisedBy: number;
    raisedAt?: Date;
  },
): Promise<{ id: number; ncNumber: string }> {
  const year = (nc.raisedAt ?? new Date()).getUTCFullYear();
  const prefix = `NC-${year}-`;
  const ncNumber = `${prefix}${String(await nextSequence(manager, 'nonconformance', prefix)).padStart(4, '0')}`;
  const result: { insertId: number } = await manager.query(
    'INSERT INTO nonconformance (nc_number, subject_type, subject_id, lot_id, process_run_id, source, ' +
      'description, containment, raised_by, raised_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)',
    [
      ncNumber,
      nc.subjectType,
      nc.subjectId,
      nc.lotId,
      nc.runId,
      nc.source,
      nc.description,
      nc.containment,
      nc.raisedBy,
      nc.raisedAt ?? new Date(),
    ],
  );
  return { id: Number(result.insertId), ncNumber };
}

/** The ids of the nonconformances with these numbers, oldest first. */
export async function nonconformanceIdsNumbered(
  manager: EntityManager,
  ncNumbers: string[],
): Promise<Array<{ id: number }>> {
  if (!ncNumbers.length) return [];
  return manager
    .getRepository(NonconformanceEntity)
    .find({ select: { id: true }, where: { ncNumber: In(ncNumbers) }, order: { id: 'ASC' } });
}

const subjectTables = {
  heat: 'heat',
  'bar-piece': 'bar_piece',
  lot: 'production_lot',
  'process-run': 'process_run',
} as const;

/** Whether the record a nonconformance would be raised against exists. */
export async function subjectExists(
  manager: EntityManager,
  subjectType: keyof typeof subjectTables,
  subjectId: number,
): Promise<boolean> {
  const rows: unknown[] = await manager.query(`SELECT id FROM ${subjectTables[subjectType]} WHERE id = ?`, [subjectId]);
  return rows.length > 0;
}

/** The disposition proposed (not yet signed) and its note. */
export async function setDisposition(
  manager: EntityManager,
  id: number,
  disposition: NonconformanceEntity['disposition'],
  note: string | null,
): Promise<void> {
  await manager.getRepository(NonconformanceEntity).update({ id }, { disposition, dispositionNote: note });
}

export async function setNonconformanceStatus(
  manager: EntityManager,
  id: number,
  status: NonconformanceEntity['status'],
): Promise<void> {
  await manager.getRepository(NonconformanceEntity).update({ id }, { status });
}
