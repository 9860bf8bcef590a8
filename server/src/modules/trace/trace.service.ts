import type { DataSource, EntityManager } from 'typeorm';
import { parseUdi, Gs1Error } from '@shared/domain/gs1/element-string';
import type { BackwardTrace, ForwardStart, ForwardTrace, TracedLot } from '@shared/schemas/trace';
import { unitTotals } from '@shared/domain/trace/unit-totals';
import { AppError } from '../../errors';
import { descendantPieces, lotsFromPieces } from './genealogy.repository';
import { latestVerdictSql } from '../materials/heats.repository';
import { unitChains } from '../manufacturing/lot-units';
import { unitsInPlant } from '@shared/domain/unit-words';

const marks = (values: unknown[]) => values.map(() => '?').join(',');
const byName = new Intl.Collator('en', { sensitivity: 'base', numeric: true });

/** The lots a backward trace starts from, as a seed query: a UDI (element string or Digital Link), a lot number, or a bar tag. */
async function backwardSeed(
  manager: EntityManager,
  start: { udi?: string; lot?: string; tag?: string },
): Promise<{ seed: string; parameters: unknown[]; label: string; notFound: string | null }> {
  if (start.udi) {
    let parts;
    try {
      parts = parseUdi(start.udi);
    } catch (error) {
      if (error instanceof Gs1Error)
        throw new AppError('VALIDATION_FAILED', `The UDI cannot be read: ${error.message}`, { udi: error.message });
      throw error;
    }
    if (!parts.lot)
      throw new AppError('VALIDATION_FAILED', 'The UDI carries no lot (AI 10)', { udi: 'No lot in the UDI' });
    return {
      seed: 'SELECT l.id FROM production_lot l JOIN part p ON p.id = l.part_id WHERE p.gtin = ? AND l.lot_number = ?',
      parameters: [parts.gtin, parts.lot],
      label: `UDI (01)${parts.gtin}(10)${parts.lot}`,
      notFound: `Lot ${parts.lot} of GTIN ${parts.gtin}`,
    };
  }
  if (start.lot)
    return {
      seed: 'SELECT id FROM production_lot WHERE lot_number = ?',
      parameters: [start.lot],
      label: `lot ${start.lot}`,
      notFound: `Lot ${start.lot}`,
    };
  if (start.tag) {
    const pieces: Array<{ id: number }> = await manager.query('SELECT id FROM bar_piece WHERE tag = ?', [
      start.tag.toUpperCase(),
    ]);
    if (!pieces.length) throw AppError.notFound(`Bar piece ${start.tag}`);
    const lotIds = await lotsFromPieces(
      manager,
      await descendantPieces(
        manager,
        pieces.map((piece) => piece.id),
      ),
    );
    // A bar that no lot has drawn on yet traces to nothing, which is an answer, not an error.
    return {
      seed: `SELECT id FROM production_lot WHERE id IN (${marks(lotIds.length ? lotIds : [0])})`,
      parameters: lotIds.length ? lotIds : [0],
      label: `bar ${start.tag.toUpperCase()}`,
      notFound: null,
    };
  }
  throw new AppError('VALIDATION_FAILED', 'Give a UDI, a lot number or a bar tag', { udi: 'One of udi, lot or tag' });
}

/**
 * Where a lot came from: its lots through splits and merges, bar pieces, heats, certificates,
 * suppliers, runs, nonconformances and signatures. The lineage first (a recursive walk up splits
 * and merges), then seven plain reads side by side; heats come from lot_heat. Measured against
 * one statement that built the whole answer as JSON (slower: it paid for each JSON aggregate),
 * against repeating the walk in each read (MariaDB sets up each recursive statement at a cost of
 * about a millisecond), and against waiting for the bar pieces before the heats (one more trip).
 */
export async function backwardTrace(
  dataSource: DataSource,
  start: { udi?: string; lot?: string; tag?: string },
): Promise<BackwardTrace> {
  const manager = dataSource.manager;
  const { seed, parameters, label, notFound } = await backwardSeed(manager, start);
  const lineage: number[] = (
    await manager.query(
      `WITH RECURSIVE lineage (id) AS (${seed} UNION SELECT k.parent_lot_id FROM lot_link k JOIN lineage ON k.child_lot_id = lineage.id) SELECT id FROM lineage`,
      parameters,
    )
  ).map((row: { id: number }) => row.id);
  if (!lineage.length) {
    if (notFound) throw AppError.notFound(notFound);
    return {
      start: label,
      lots: [],
      barPieces: [],
      heats: [],
      certificates: [],
      runs: [],
      nonconformances: [],
      signatures: [],
    };
  }
  const lots = marks(lineage);
  const heats = `SELECT lh.heat_id FROM lot_heat lh WHERE lh.lot_id IN (${lots})`;
  const runs = `SELECT o.process_run_id FROM lot_operation o WHERE o.lot_id IN (${lots}) AND o.process_run_id IS NOT NULL`;
  // Independent reads, sent side by side on separate pooled connections.
  const [lotRows, pieces, heatRows, certificates, runRows, nonconformances, signatures] = await Promise.all([
    manager.query(
      `SELECT ${lotFactColumns} FROM production_lot l JOIN part p ON p.id = l.part_id WHERE l.id IN (${lots}) ORDER BY l.lot_number`,
      lineage,
    ) as Promise<LotFactRow[]>,
    manager.query(
      `WITH RECURSIVE issued (id) AS (SELECT bar_piece_id FROM material_movement WHERE kind = 'issue' AND lot_id IN (${lots})
         UNION SELECT b.parent_id FROM bar_piece b JOIN issued ON b.id = issued.id WHERE b.parent_id IS NOT NULL)
       SELECT b.id, b.tag, b.heat_id AS heatId, parent.tag AS parentTag FROM issued JOIN bar_piece b ON b.id = issued.id LEFT JOIN bar_piece parent ON parent.id = b.parent_id ORDER BY b.tag`,
      lineage,
    ) as Promise<BackwardTrace['barPieces']>,
    manager.query(
      `SELECT h.id, h.heat_number AS heatNumber, h.status, h.spec_id AS specId, su.id AS supplierId, su.name AS supplier, su.approval,
              ${latestVerdictSql('h.id')} AS verdict
         FROM heat h JOIN supplier su ON su.id = h.supplier_id WHERE h.id IN (${heats}) ORDER BY h.heat_number`,
      lineage,
    ) as Promise<BackwardTrace['heats']>,
    manager.query(
      `SELECT c.heat_id AS heatId, d.id AS documentId, d.original_name AS name, d.sha256 FROM heat_certificate c JOIN certificate_document d ON d.id = c.document_id WHERE c.heat_id IN (${heats}) ORDER BY d.id`,
      lineage,
    ) as Promise<BackwardTrace['certificates']>,
    manager.query(
      `SELECT r.id, r.run_number AS runNumber, r.kind, r.method_id AS methodId, r.in_window AS inWindow, r.run_at AS runAt FROM process_run r WHERE r.id IN (${runs}) ORDER BY r.run_at`,
      lineage,
    ) as Promise<
      Array<{ id: number; runNumber: string; kind: string; methodId: string; inWindow: number; runAt: Date }>
    >,
    manager.query(
      `SELECT id, nc_number AS ncNumber, subject_type AS subjectType, status, disposition FROM nonconformance
        WHERE lot_id IN (${lots}) OR (subject_type = 'heat' AND subject_id IN (${heats})) OR (subject_type = 'process-run' AND subject_id IN (${runs})) ORDER BY nc_number`,
      [...lineage, ...lineage, ...lineage],
    ) as Promise<BackwardTrace['nonconformances']>,
    // Signatures name their record by a text id.
    manager.query(
      `SELECT record_type AS recordType, record_id AS recordId, meaning, signed_at_text AS manifestation, content_hash AS contentHash FROM electronic_signature
        WHERE (record_type = 'lot-release' AND record_id IN (${lots}))
           OR (record_type = 'heat' AND record_id IN (SELECT CAST(lh.heat_id AS CHAR CHARACTER SET utf8mb4) COLLATE utf8mb4_unicode_ci FROM lot_heat lh WHERE lh.lot_id IN (${lots}))) ORDER BY id`,
      [...lineage.map(String), ...lineage],
    ) as Promise<BackwardTrace['signatures']>,
  ]);
  return {
    start: label,
    lots: toTracedLots(lotRows, (row) => Number(row.shipped ?? 0), await goodUnitsBeforeRelease(manager, lotRows)),
    barPieces: pieces,
    heats: heatRows,
    certificates,
    runs: runRows.map((run) => ({ ...run, inWindow: Boolean(run.inWindow), runAt: new Date(run.runAt).toISOString() })),
    nonconformances,
    signatures,
  };
}

/** Every lot affected by a heat, a bar piece, a run or a supplier (optionally within a date window), through splits and merges. */
export async function forwardTrace(dataSource: DataSource, start: ForwardStart): Promise<ForwardTrace> {
  return forwardTraceIn(dataSource.manager, start);
}

/**
 * The forward trace inside a caller's transaction (a recall freezes what it returns). Every start
 * becomes one seed query of lot ids, extended through splits and merges by a recursive walk where
 * it does not already hold them; every read below starts from that set inside the database, so
 * that a supplier-wide trace of tens of thousands of lots never travels as a list of ids.
 */
export async function forwardTraceIn(manager: EntityManager, start: ForwardStart): Promise<ForwardTrace> {
  const { seed, parameters, label, includesDescendants } = await seedOf(manager, start);
  const reached = includesDescendants
    ? `WITH reached (id) AS (${seed})`
    : `WITH RECURSIVE reached (id) AS (${seed} UNION SELECT k.child_lot_id FROM lot_link k JOIN reached ON k.parent_lot_id = reached.id)`;
  // The name and two reads side by side: the lots, and every shipment of them (from which both the
  // units shipped per lot and the consignees' totals follow). Measured at a heat's 200 lots and a
  // supplier's 25,000: cheaper than a per-lot subquery for the units shipped plus a second walk
  // for the consignees, or than joining each consignee onto every shipment.
  // A third read gives the units each lot passed on to lots split or merged from it (all of them in
  // the scope: the walk goes down every link), so that the total made counts each unit once.
  const [startLabel, lotRows, shipments, passedOnRows]: [
    string,
    Array<Omit<LotFactRow, 'shipped'>>,
    Array<{ lotId: number; consigneeId: number; qty: number }>,
    Array<{ lotId: number; qty: string }>,
  ] = await Promise.all([
    label,
    manager.query(
      `${reached}
       SELECT l.id, l.lot_number, p.part_number, l.status, l.origin, l.start_qty, l.released_qty, ${parentsColumn}
         FROM reached r JOIN production_lot l ON l.id = r.id JOIN part p ON p.id = l.part_id ORDER BY l.lot_number`,
      parameters,
    ),
    manager.query(
      `${reached} SELECT s.lot_id AS lotId, s.consignee_id AS consigneeId, s.qty FROM reached r JOIN shipment s ON s.lot_id = r.id`,
      parameters,
    ),
    manager.query(
      `${reached} SELECT k.parent_lot_id AS lotId, SUM(k.qty) AS qty FROM reached r JOIN lot_link k ON k.parent_lot_id = r.id GROUP BY k.parent_lot_id`,
      parameters,
    ),
  ]);
  const passedOn = new Map(passedOnRows.map((row) => [row.lotId, Number(row.qty)]));
  const shippedByLot = new Map<number, number>();
  const byConsignee = new Map<number, { units: number; lots: Set<number> }>();
  for (const shipment of shipments) {
    const qty = Number(shipment.qty);
    shippedByLot.set(shipment.lotId, (shippedByLot.get(shipment.lotId) ?? 0) + qty);
    const entry = byConsignee.get(shipment.consigneeId) ?? { units: 0, lots: new Set<number>() };
    entry.units += qty;
    entry.lots.add(shipment.lotId);
    byConsignee.set(shipment.consigneeId, entry);
  }
  const consigneeIds = [...byConsignee.keys()];
  // Sorted here: MariaDB's sort of a few hundred names by collation cost more than the lookup.
  const consigneeRows: Array<{ id: number; name: string; kind: string; country: string }> = consigneeIds.length
    ? await manager.query(
        `SELECT id, name, kind, country FROM consignee WHERE id IN (${marks(consigneeIds)})`,
        consigneeIds,
      )
    : [];
  consigneeRows.sort((a, b) => byName.compare(a.name, b.name) || a.id - b.id);
  const consignees = consigneeRows.map((row) => ({
    ...row,
    units: byConsignee.get(row.id)!.units,
    lots: byConsignee.get(row.id)!.lots.size,
  }));
  const lots = toTracedLots(
    lotRows,
    (row) => shippedByLot.get(row.id) ?? 0,
    await goodUnitsBeforeRelease(manager, lotRows),
  );
  const totals = unitTotals(lots, passedOn);
  return { start: startLabel, lots, totals, consignees };
}

/**
 * The lots a start touches directly: bar of the piece or its cuts issued to them; a run's lots. A
 * heat's or a supplier's lots come from lot_heat, which already holds every lot made from them
 * through splits and merges (includesDescendants), so that they need no walk.
 */
async function seedOf(
  manager: EntityManager,
  start: ForwardStart,
): Promise<{ seed: string; parameters: unknown[]; label: Promise<string>; includesDescendants?: true }> {
  // The start's own name is read side by side with the trace; a start that does not exist is a 404.
  const named = async (sql: string, id: number, what: string, label: (name: string) => string) => {
    const [row]: Array<{ name: string }> = await manager.query(sql, [id]);
    if (!row) throw AppError.notFound(what);
    return label(row.name);
  };
  const window = start.from || start.to ? [start.from ?? '1000-01-01', start.to ?? '9999-12-31'] : null;
  const issuedFrom = (where: string) =>
    `SELECT m.lot_id FROM bar_piece b JOIN material_movement m ON m.bar_piece_id = b.id AND m.kind = 'issue' ${where}`;
  if (start.heatId) {
    const label = named(
      'SELECT heat_number AS name FROM heat WHERE id = ?',
      start.heatId,
      'Heat',
      (name) => `heat ${name}`,
    );
    return {
      seed: 'SELECT lot_id FROM lot_heat WHERE heat_id = ?',
      parameters: [start.heatId],
      label,
      includesDescendants: true,
    };
  }
  if (start.pieceId) {
    const label = await named(
      'SELECT tag AS name FROM bar_piece WHERE id = ?',
      start.pieceId,
      'Bar piece',
      (name) => `bar ${name}`,
    );
    const pieces = await descendantPieces(manager, [start.pieceId]);
    return { seed: issuedFrom(`WHERE b.id IN (${marks(pieces)})`), parameters: pieces, label: Promise.resolve(label) };
  }
  if (start.runId) {
    const label = named(
      'SELECT run_number AS name FROM process_run WHERE id = ?',
      start.runId,
      'Process run',
      (name) => `run ${name}`,
    );
    return {
      seed: 'SELECT o.lot_id FROM lot_operation o WHERE o.process_run_id = ?',
      parameters: [start.runId],
      label,
    };
  }
  if (start.supplierId) {
    const label = named(
      'SELECT name FROM supplier WHERE id = ?',
      start.supplierId,
      'Supplier',
      (name) => `supplier ${name}${window ? ` (heats received ${window[0]} to ${window[1]})` : ''}`,
    );
    return {
      seed: `SELECT DISTINCT lh.lot_id FROM heat h JOIN lot_heat lh ON lh.heat_id = h.id
              WHERE h.supplier_id = ?${window ? ' AND h.received_at >= ? AND h.received_at < ? + INTERVAL 1 DAY' : ''}`,
      parameters: [start.supplierId, ...(window ?? [])],
      label,
      includesDescendants: true,
    };
  }
  if (start.partId) {
    // Every lot made as the part; a lot split or merged from one is made as the same part.
    const label = named(
      "SELECT CONCAT(part_number, ' (GTIN ', gtin, ')') AS name FROM part WHERE id = ?",
      start.partId,
      'Part',
      (name) => `part ${name}`,
    );
    return {
      seed: 'SELECT id FROM production_lot WHERE part_id = ?',
      parameters: [start.partId],
      label,
      includesDescendants: true,
    };
  }
  throw new AppError('VALIDATION_FAILED', 'Start from a heat, a bar piece, a run, a supplier or a part', {
    heatId: 'One of heatId, pieceId, runId, supplierId or partId',
  });
}

/** Each lot with its part, quantities made and released, units shipped and the lots it came from. */
// Only a lot split or merged from others has parents; asking only those saves a lookup per lot.
const parentsColumn = `CASE WHEN l.origin <> 'bar' THEN (SELECT GROUP_CONCAT(pl.lot_number ORDER BY pl.lot_number SEPARATOR ',') FROM lot_link k JOIN production_lot pl ON pl.id = k.parent_lot_id WHERE k.child_lot_id = l.id) END AS parents`;
const lotFactColumns = `l.id, l.lot_number, p.part_number, l.status, l.origin, l.start_qty, l.released_qty,
  (SELECT SUM(qty) FROM shipment s WHERE s.lot_id = l.id) AS shipped,
  ${parentsColumn}`;

interface LotFactRow {
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

/** The lots as traced; `shippedOf` gives each lot's units shipped (read with it, or summed from its shipments). */
/**
 * Good units held by each lot not yet released (its work in progress), from its unit chain. Read
 * only for those lots: a wide trace is mostly released lots, whose units in plant need no chain.
 */
async function goodUnitsBeforeRelease(
  manager: EntityManager,
  rows: ReadonlyArray<{ id: number; status: string }>,
): Promise<Map<number, number>> {
  const unreleased = rows
    .filter((row) => row.status === 'open' || row.status === 'submitted' || row.status === 'reviewed')
    .map((row) => row.id);
  if (!unreleased.length) return new Map();
  const chains = await unitChains(manager, unreleased);
  return new Map([...chains].map(([id, chain]) => [id, chain.onHand ?? 0]));
}

function toTracedLots<Row extends Omit<LotFactRow, 'shipped'>>(
  rows: Row[],
  shippedOf: (row: Row) => number,
  goodOf?: ReadonlyMap<number, number>,
): TracedLot[] {
  return rows.map((row) => {
    const shipped = shippedOf(row);
    return {
      id: row.id,
      lotNumber: row.lot_number,
      partNumber: row.part_number,
      status: row.status,
      origin: row.origin,
      parents: row.parents ? row.parents.split(',') : [],
      made: row.start_qty,
      released: row.released_qty,
      shipped,
      onHand: unitsInPlant({
        status: row.status,
        released: row.released_qty,
        shipped,
        good: goodOf?.get(row.id) ?? null,
      }),
    };
  });
}
