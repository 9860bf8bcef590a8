import type { DataSource, EntityManager } from 'typeorm';
import { parseUdi, Gs1Error } from '@shared/domain/gs1/element-string';
import type { BackwardTrace, ForwardStart, ForwardTrace, TracedLot } from '@shared/schemas/trace';
import { unitTotals } from '@shared/domain/trace/unit-totals';
import { AppError } from '../../errors';
import { descendantPieces, lotsFromPieces } from './genealogy.repository';
import {
  backwardFacts,
  consigneesByIds,
  forwardReads,
  lineageOf,
  pieceIdsTagged,
  startName,
  type LotFactRow,
} from './trace.repository';
import { unitChains } from '../manufacturing/lot-units';
import { unitsInPlant } from '@shared/domain/unit-words';

const marks = (values: unknown[]) => values.map(() => '?').join(',');
const byName = new Intl.Collator('en', { sensitivity: 'base', numeric: true });

/**
 * The lots a backward trace starts from, as a seed query: a UDI (element string or Digital Link), a lot number, or a
 * bar tag.
 */
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
    const pieces = await pieceIdsTagged(manager, start.tag.toUpperCase());
    if (!pieces.length) throw AppError.notFound(`Bar piece ${start.tag}`);
    const lotIds = await lotsFromPieces(manager, await descendantPieces(manager, pieces));
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
  const lineage = await lineageOf(manager, seed, parameters);
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
  const [lotRows, pieces, heatRows, certificates, runRows, nonconformances, signatures] = await backwardFacts(
    manager,
    lineage,
  );
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

/**
 * Every lot affected by a heat, a bar piece, a run or a supplier (optionally within a date window), through splits and
 * merges.
 */
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
  const [startLabel, [lotRows, shipments, passedOnRows]] = await Promise.all([
    label,
    forwardReads(manager, seed, parameters, includesDescendants === true),
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
  const consigneeRows = await consigneesByIds(manager, consigneeIds);
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
    const name = await startName(manager, sql, id);
    if (name === null) throw AppError.notFound(what);
    return label(name);
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
