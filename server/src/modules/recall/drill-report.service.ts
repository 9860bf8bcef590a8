// The report of a recall drill: the facts around its latest traced scope, read from the records,
// and their assessment (pure, in shared/domain/recall/drill-report.ts).
import type { DataSource, EntityManager } from 'typeorm';
import { assessDrill, type DrillLotFacts } from '@shared/domain/recall/drill-report';
import { diffAffectedSets } from '@shared/domain/recall/snapshot-diff';
import type { DrillReport } from '@shared/schemas/recall';
import { AppError } from '../../errors';
import { findRecallRow, snapshotContent } from './recall.service';

const chunked = <T>(items: T[], size = 1000): T[][] =>
  Array.from({ length: Math.ceil(items.length / size) }, (_, index) => items.slice(index * size, (index + 1) * size));

/** Rows of `sql` (with one IN (?) list) for every chunk of ids. */
async function perLots<Row>(manager: EntityManager, sql: (marks: string) => string, ids: number[]): Promise<Row[]> {
  const rows: Row[] = [];
  for (const chunk of chunked(ids))
    rows.push(...((await manager.query(sql(chunk.map(() => '?').join(', ')), chunk)) as Row[]));
  return rows;
}

function groupBy<T>(rows: T[], key: (row: T) => number): Map<number, T[]> {
  const groups = new Map<number, T[]>();
  for (const row of rows) {
    const group = groups.get(key(row));
    if (group) group.push(row);
    else groups.set(key(row), [row]);
  }
  return groups;
}

export async function drillReport(dataSource: DataSource, id: number, now = new Date()): Promise<DrillReport> {
  const manager = dataSource.manager;
  const row = await findRecallRow(manager, id);
  if (!row) throw AppError.notFound('Recall investigation');
  if (row.mode !== 'drill')
    throw AppError.rule(`${row.recall_number} is a recall, not a drill; export its affected set instead`);
  const opening = await snapshotContent(manager, id);
  const reruns: Array<{ id: number }> = await manager.query(
    "SELECT id FROM recall_snapshot WHERE recall_id = ? AND kind = 'rerun' ORDER BY id",
    [id],
  );
  const last = reruns.at(-1);
  const latest = last ? await snapshotContent(manager, id, last.id) : opening;
  const diff = diffAffectedSets(opening.content.trace, latest.content.trace);
  const { lots, consignees } = latest.content.trace;
  const ids = lots.map((lot) => lot.id);
  const inScope = new Set(ids);

  const heats = await perLots<{ lot_id: number; heat_number: string; status: string; certificates: string }>(
    manager,
    (
      marks,
    ) => `SELECT lh.lot_id, h.heat_number, h.status, (SELECT COUNT(*) FROM heat_certificate c WHERE c.heat_id = h.id) AS certificates
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
      `SELECT k.parent_lot_id, k.child_lot_id, c.lot_number, k.qty FROM lot_link k JOIN production_lot c ON c.id = k.child_lot_id WHERE k.parent_lot_id IN (${marks}) ORDER BY c.lot_number`,
    ids,
  );
  const shippedNow = new Map(shipped.map((entry) => [entry.lot_id, Number(entry.units)]));
  // Grouped once: a supplier-wide scope holds tens of thousands of lots.
  const heatsOf = groupBy(heats, (heat) => heat.lot_id);
  const childrenOf = groupBy(children, (child) => child.parent_lot_id);
  const facts: DrillLotFacts[] = lots.map((lot) => ({
    lotNumber: lot.lotNumber,
    status: lot.status,
    origin: lot.origin,
    parents: lot.parents,
    made: lot.made,
    passedOn: (childrenOf.get(lot.id) ?? []).reduce((sum, child) => sum + Number(child.qty), 0),
    released: lot.released,
    shipped: lot.shipped,
    onHand: lot.onHand,
    shippedNow: shippedNow.get(lot.id) ?? 0,
    sourceHeats: (heatsOf.get(lot.id) ?? []).map((heat) => ({
      heatNumber: heat.heat_number,
      status: heat.status,
      certificates: Number(heat.certificates),
    })),
    childrenOutsideScope: (childrenOf.get(lot.id) ?? [])
      .filter((child) => !inScope.has(child.child_lot_id))
      .map((child) => child.lot_number),
  }));
  const openedAt = new Date(row.opened_at).toISOString();
  const closedAt = row.closed_at ? new Date(row.closed_at).toISOString() : null;
  const assessment = assessDrill({
    openedAt,
    closedAt,
    asOf: now.toISOString(),
    openingTakenAt: opening.content.takenAt,
    tracedInMs: opening.content.tracedInMs ?? null,
    reruns: reruns.length,
    lotsAddedSinceOpening: diff.lotsAdded.map((lot) => lot.lotNumber),
    lotsRemovedSinceOpening: diff.lotsRemoved.map((lot) => lot.lotNumber),
    lots: facts,
    consignees,
  });
  return {
    drill: {
      id,
      recallNumber: row.recall_number,
      status: row.status,
      trigger: row.trigger_label,
      reason: row.reason,
      openedBy: row.opened_by,
      openedAt,
      closedAt,
    },
    scope: {
      snapshot: latest.meta,
      lotsAddedSinceOpening: diff.lotsAdded.map((lot) => lot.lotNumber),
      lotsRemovedSinceOpening: diff.lotsRemoved.map((lot) => lot.lotNumber),
    },
    assessment,
    lots: lots.map((lot, index) => ({ ...lot, heats: facts[index]!.sourceHeats.map((heat) => heat.heatNumber) })),
    consignees,
    madeAt: now.toISOString(),
  };
}
