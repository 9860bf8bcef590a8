// The genealogy's reads: the walks up and down splits and merges, and the facts read side by
// side from the set of lots they reach. Raw SQL: recursive CTEs and IN-lists over the walked set,
// measured against their alternatives (see trace.service.ts and npm run bench:trace).
import type { EntityManager } from 'typeorm';
import type { BackwardTrace } from '@shared/schemas/trace';
import { latestVerdictSql } from '../materials/heats.repository';

const marks = (values: unknown[]) => values.map(() => '?').join(',');

// Each lot with its part, quantities made and released, units shipped and the lots it came from.
// Only a lot split or merged from others has parents; asking only those saves a lookup per lot.
export const parentsColumn =
  `CASE WHEN l.origin <> 'bar' THEN (SELECT GROUP_CONCAT(pl.lot_number ORDER BY pl.lot_number SEPARATOR ',') ` +
  `FROM lot_link k JOIN production_lot pl ON pl.id = k.parent_lot_id WHERE k.child_lot_id = l.id) END AS ` +
  `parents`;
const lotFactColumns = `l.id, l.lot_number, p.part_number, l.status, l.origin, l.start_qty, l.released_qty,
  (SELECT SUM(qty) FROM shipment s WHERE s.lot_id = l.id) AS shipped,
  ${parentsColumn}`;

export interface LotFactRow {
  id: number;
  lot_number: string;
  part_number: string;
  status: string;
  origin: string;
  start_qty: number | null;
  released_qty: number;
  shipped: string | null;
  parents: string | null;
}

/** The ids of the bar pieces with this tag. */
export async function pieceIdsTagged(manager: EntityManager, tag: string): Promise<number[]> {
  const rows: Array<{ id: number }> = await manager.query('SELECT id FROM bar_piece WHERE tag = ?', [tag]);
  return rows.map((row) => row.id);
}

/** The seed's lots and every lot their units came through (a recursive walk up splits and merges). */
export async function lineageOf(manager: EntityManager, seed: string, parameters: unknown[]): Promise<number[]> {
  const rows: Array<{ id: number }> = await manager.query(
    `WITH RECURSIVE lineage (id) AS (${seed} UNION SELECT k.parent_lot_id FROM lot_link k JOIN lineage ON
        k.child_lot_id = lineage.id)
     SELECT id FROM lineage`,
    parameters,
  );
  return rows.map((row) => row.id);
}

export type RunFact = { id: number; runNumber: string; kind: string; methodId: string; inWindow: number; runAt: Date };

/**
 * What a backward trace reports of a lineage: lots, bar pieces, heats, certificates, runs, nonconformances, signatures.
 */
export function backwardFacts(
  manager: EntityManager,
  lineage: number[],
): Promise<
  [
    LotFactRow[],
    BackwardTrace['barPieces'],
    BackwardTrace['heats'],
    BackwardTrace['certificates'],
    RunFact[],
    BackwardTrace['nonconformances'],
    BackwardTrace['signatures'],
  ]
> {
  const lots = marks(lineage);
  const heats = `SELECT lh.heat_id FROM lot_heat lh WHERE lh.lot_id IN (${lots})`;
  const runs =
    `SELECT o.process_run_id FROM lot_operation o WHERE ` + `o.lot_id IN (${lots}) AND o.process_run_id IS NOT NULL`;
  // Independent reads, sent side by side on separate pooled connections.
  return Promise.all([
    manager.query(
      `SELECT ${lotFactColumns} FROM production_lot l JOIN part p ON p.id = l.part_id WHERE l.id IN (${lots}) ` +
        `ORDER BY l.lot_number`,
      lineage,
    ) as Promise<LotFactRow[]>,
    manager.query(
      `WITH RECURSIVE issued (id) AS (SELECT bar_piece_id FROM material_movement WHERE kind = 'issue' AND lot_id IN
          (${lots})
         UNION SELECT b.parent_id FROM bar_piece b JOIN issued ON b.id = issued.id WHERE b.parent_id IS NOT NULL)
       SELECT b.id, b.tag, b.heat_id AS heatId, parent.tag AS parentTag FROM issued JOIN bar_piece b ON
          b.id = issued.id LEFT JOIN bar_piece parent ON parent.id = b.parent_id ORDER BY b.tag`,
      lineage,
    ) as Promise<BackwardTrace['barPieces']>,
    manager.query(
      `SELECT h.id, h.heat_number AS heatNumber, h.status, h.spec_id AS specId, su.id AS supplierId, su.name AS
          supplier, su.approval,
              ${latestVerdictSql('h.id')} AS verdict
         FROM heat h JOIN supplier su ON su.id = h.supplier_id WHERE h.id IN (${heats}) ORDER BY h.heat_number`,
      lineage,
    ) as Promise<BackwardTrace['heats']>,
    manager.query(
      `SELECT c.heat_id AS heatId, d.id AS documentId, d.original_name AS name, d.sha256 FROM ` +
        `heat_certificate c JOIN certificate_document d ON d.id = c.document_id WHERE c.heat_id IN (${heats}) ` +
        `ORDER BY d.id`,
      lineage,
    ) as Promise<BackwardTrace['certificates']>,
    manager.query(
      `SELECT r.id, r.run_number AS runNumber, r.kind, r.method_id AS methodId, r.in_window AS inWindow, ` +
        `r.run_at AS runAt FROM process_run r WHERE r.id IN (${runs}) ORDER BY r.run_at`,
      lineage,
    ) as Promise<RunFact[]>,
    manager.query(
      `SELECT id, nc_number AS ncNumber, subject_type AS subjectType, status, disposition FROM nonconformance
        WHERE lot_id IN (${lots}) OR (subject_type = 'heat' AND subject_id IN (${heats})) OR (subject_type
          = 'process-run' AND subject_id IN (${runs})) ORDER BY nc_number`,
      [...lineage, ...lineage, ...lineage],
    ) as Promise<BackwardTrace['nonconformances']>,
    // Signatures name their record by a text id.
    manager.query(
      `SELECT record_type AS recordType, record_id AS recordId, meaning, signed_at_text AS manifestation,
          content_hash AS contentHash FROM electronic_signature
        WHERE (record_type = 'lot-release' AND record_id IN (${lots}))
           OR (record_type = 'heat' AND record_id IN (SELECT CAST(lh.heat_id AS CHAR CHARACTER SET
             utf8mb4) COLLATE utf8mb4_unicode_ci FROM lot_heat lh WHERE lh.lot_id IN (${lots}))) ORDER BY id`,
      [...lineage.map(String), ...lineage],
    ) as Promise<BackwardTrace['signatures']>,
  ]);
}

/**
 * The lots a forward seed reaches (with the walk down splits and merges unless the seed already
 * holds them), every shipment of them, and the units each passed on to lots split or merged from it
 * (all of them in the scope: the walk goes down every link), read side by side. Measured at a
 * heat's 200 lots and a supplier's 25,000: cheaper than a per-lot subquery for the units shipped
 * plus a second walk for the consignees, or than joining each consignee onto every shipment.
 */
export function forwardReads(
  manager: EntityManager,
  seed: string,
  parameters: unknown[],
  includesDescendants: boolean,
): Promise<
  [
    Array<Omit<LotFactRow, 'shipped'>>,
    Array<{ lotId: number; consigneeId: number; qty: number }>,
    Array<{ lotId: number; qty: string }>,
  ]
> {
  const reached = includesDescendants
    ? `WITH reached (id) AS (${seed})`
    : `WITH RECURSIVE reached (id) AS (${seed} UNION SELECT k.child_lot_id FROM lot_link k JOIN reached ON ` +
      `k.parent_lot_id = reached.id)`;
  return Promise.all([
    manager.query(
      `${reached}
       SELECT l.id, l.lot_number, p.part_number, l.status, l.origin, l.start_qty, l.released_qty, ${parentsColumn}
         FROM reached r JOIN production_lot l ON l.id = r.id JOIN part p ON p.id = l.part_id ORDER BY l.lot_number`,
      parameters,
    ),
    manager.query(
      `${reached} SELECT s.lot_id AS lotId, s.consignee_id AS consigneeId, s.qty FROM reached r JOIN shipment ` +
        `s ON s.lot_id = r.id`,
      parameters,
    ),
    manager.query(
      `${reached} SELECT k.parent_lot_id AS lotId, SUM(k.qty) AS qty FROM reached r JOIN lot_link k ON ` +
        `k.parent_lot_id = r.id GROUP BY k.parent_lot_id`,
      parameters,
    ),
  ]);
}

export async function consigneesByIds(
  manager: EntityManager,
  ids: number[],
): Promise<Array<{ id: number; name: string; kind: string; country: string }>> {
  if (!ids.length) return [];
  return manager.query(`SELECT id, name, kind, country FROM consignee WHERE id IN (${marks(ids)})`, ids);
}

/** The name a start's own query (one column, \`name\`) gives for the id, or null when there is none. */
export async function startName(manager: EntityManager, sql: string, id: number): Promise<string | null> {
  const [row]: Array<{ name: string }> = await manager.query(sql, [id]);
  return row?.name ?? null;
}
