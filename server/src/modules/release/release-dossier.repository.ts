// What a lot's release content is read from: the heats, certificates, steps, runs, bar and people
// of the lot and of the lots its units came through (its lineage). Raw SQL: DISTINCT joins over
// the lineage and the latest-verdict subquery are plainer here than in the query builder.
import type { EntityManager } from 'typeorm';
import { latestVerdictSql } from '../materials/heats.repository';

const marks = (values: unknown[]) => values.map(() => '?').join(',');

export interface IssuedHeat {
  id: number;
  heat_number: string;
  status: string;
  supplier: string;
  spec_id: string;
  spec_revision: string;
  grade: string | null;
  verdict: string | null;
}

/** The heats whose bar was issued to the lineage, with each heat's latest verdict. */
export function issuedHeats(manager: EntityManager, lineage: number[]): Promise<IssuedHeat[]> {
  return manager.query(
    `SELECT DISTINCT h.id, h.heat_number, h.status, s.name AS supplier, h.spec_id, h.spec_revision, h.grade,
            ${latestVerdictSql('h.id')} AS verdict
       FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id JOIN heat h ON h.id = b.heat_id
       JOIN supplier s ON s.id = h.supplier_id
      WHERE m.lot_id IN (${marks(lineage)}) AND m.kind = 'issue' ORDER BY h.heat_number`,
    lineage,
  );
}

/** The SHA-256 of every certificate attached to these heats. */
export async function certificateHashes(
  manager: EntityManager,
  heatIds: number[],
): Promise<Array<{ heat_id: number; sha256: string }>> {
  if (!heatIds.length) return [];
  return manager.query(
    `SELECT c.heat_id, d.sha256 FROM heat_certificate c JOIN certificate_document d ON d.id = c.document_id
      WHERE c.heat_id IN (${marks(heatIds)}) ORDER BY d.sha256`,
    heatIds,
  );
}

export interface RecordedOperation {
  lot_id: number;
  step_no: number;
  kind: string;
  name: string;
  verdict: 'accept' | 'reject' | null;
  process_run_id: number | null;
  recorded_by: number;
  lot_number: string;
}

/** Every step recorded on the lineage, in routing order. */
export function recordedOperations(manager: EntityManager, lineage: number[]): Promise<RecordedOperation[]> {
  return manager.query(
    `SELECT o.lot_id, s.step_no, s.kind, s.name, o.verdict, o.process_run_id, o.recorded_by, l.lot_number
       FROM lot_operation o JOIN routing_step s ON s.id = o.routing_step_id JOIN production_lot l ON l.id = o.lot_id
      WHERE o.lot_id IN (${marks(lineage)}) ORDER BY s.step_no, l.lot_number, o.id`,
    lineage,
  );
}

export interface ProcessRunFacts {
  id: number;
  run_number: string;
  method_id: string;
  in_window: number;
  parameters_json: string;
  recorded_by: number;
}

export async function processRunsOf(manager: EntityManager, runIds: number[]): Promise<ProcessRunFacts[]> {
  if (!runIds.length) return [];
  return manager.query(
    `SELECT id, run_number, method_id, in_window, parameters_json, recorded_by FROM process_run
      WHERE id IN (${marks(runIds)}) ORDER BY run_at, id`,
    runIds,
  );
}

/** A lot's origin and start with its part's bar allowances, for the material reconciliation. */
export async function barLotFacts(
  manager: EntityManager,
  lotId: number,
): Promise<{
  origin: string;
  lot_number: string;
  start_qty: number | null;
  unit_length_mm: string;
  cutoff_allowance_mm: string;
  reconciliation_tolerance_pct: string;
} | null> {
  const [row] = await manager.query(
    `SELECT l.origin, l.lot_number, l.start_qty, p.unit_length_mm, p.cutoff_allowance_mm, p.reconciliation_tolerance_pct
       FROM production_lot l JOIN part p ON p.id = l.part_id WHERE l.id = ?`,
    [lotId],
  );
  return row ?? null;
}

/** Bar length issued to and returned from a lot, in mm (as exact decimal text). */
export async function barLengthsMoved(
  manager: EntityManager,
  lotId: number,
): Promise<{ issued: string; returned: string }> {
  const [row]: Array<{ issued: string | null; returned: string | null }> = await manager.query(
    `SELECT SUM(CASE kind WHEN 'issue' THEN length_mm ELSE 0 END) AS issued,
            SUM(CASE kind WHEN 'return' THEN length_mm ELSE 0 END) AS returned
       FROM material_movement WHERE lot_id = ?`,
    [lotId],
  );
  return { issued: row?.issued ?? '0', returned: row?.returned ?? '0' };
}

/** Every bar piece issued to the lineage, with its heat and supplier. */
export function issuedBarPieces(
  manager: EntityManager,
  lineage: number[],
): Promise<Array<{ piece_id: number; tag: string; heat_id: number; supplier_id: number }>> {
  return manager.query(
    `SELECT DISTINCT b.id AS piece_id, b.tag, h.id AS heat_id, h.supplier_id
       FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id JOIN heat h ON h.id = b.heat_id
      WHERE m.lot_id IN (${marks(lineage)}) AND m.kind = 'issue' ORDER BY b.tag`,
    lineage,
  );
}

/** The tag and heat number of every bar piece issued to the lineage, by tag. */
export function issuedBarTags(
  manager: EntityManager,
  lineage: number[],
): Promise<Array<{ tag: string; heat: string }>> {
  return manager.query(
    `SELECT DISTINCT b.tag, h.heat_number AS heat
       FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id JOIN heat h ON h.id = b.heat_id
      WHERE m.lot_id IN (${marks(lineage)}) AND m.kind = 'issue' ORDER BY b.tag`,
    lineage,
  );
}

/**
 * Everyone who recorded part of the lot's record: opened a lot of the lineage, issued bar, recorded a step, submitted
 * it.
 */
export async function recordAuthorIds(manager: EntityManager, lineage: number[], lotId: number): Promise<number[]> {
  const [row]: Array<{ ids: string | null }> = await manager.query(
    `SELECT GROUP_CONCAT(DISTINCT person_id) AS ids FROM (
       SELECT opened_by AS person_id FROM production_lot WHERE id IN (${marks(lineage)})
       UNION SELECT recorded_by FROM material_movement WHERE lot_id IN (${marks(lineage)})
       UNION SELECT recorded_by FROM lot_operation WHERE lot_id IN (${marks(lineage)})
       UNION SELECT submitted_by FROM release_submission WHERE lot_id = ?) AS authors`,
    [...lineage, ...lineage, ...lineage, lotId],
  );
  return (row?.ids ?? '').split(',').filter(Boolean).map(Number);
}

export interface TrailRow {
  seq: string;
  entity_id: string;
  occurred_at: Date;
  actor_name: string;
  action: string;
  lot_number: string;
  reason: string | null;
}

/** The audit trail events of the lineage's lots, oldest first, leaving out one action. */
export function lotTrailRows(manager: EntityManager, lineage: number[], leavingOut: string): Promise<TrailRow[]> {
  return manager.query(
    `SELECT e.seq, e.entity_id, e.occurred_at, e.actor_name, e.action, l.lot_number, e.reason
       FROM audit_event e JOIN production_lot l ON CAST(l.id AS CHAR) = e.entity_id
      WHERE e.entity_type = 'lot' AND e.entity_id IN (${marks(lineage)}) AND e.action <> ?
      ORDER BY e.seq`,
    [...lineage.map(String), leavingOut],
  );
}

/** The lot's latest event of this action, with what it recorded after. */
export async function latestLotEvent(
  manager: EntityManager,
  lotId: number,
  action: string,
): Promise<{ seq: string; after_json: string | null } | null> {
  const [row] = await manager.query(
    `SELECT seq, after_json FROM audit_event WHERE entity_type = 'lot' AND entity_id = ? AND action = ?
      ORDER BY seq DESC LIMIT 1`,
    [String(lotId), action],
  );
  return row ?? null;
}
