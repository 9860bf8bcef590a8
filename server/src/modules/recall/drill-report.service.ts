// The report of a recall drill: the facts around its latest traced scope, read from the records,
// and their assessment (pure, in shared/domain/recall/drill-report.ts).
import { effectivenessOf } from './field-action.service';
import type { DataSource } from 'typeorm';
import { assessDrill, type DrillLotFacts } from '@shared/domain/recall/drill-report';
import { diffAffectedSets } from '@shared/domain/recall/snapshot-diff';
import type { DrillReport } from '@shared/schemas/recall';
import { AppError } from '../../errors';
import { snapshotContent } from './recall.service';
import { drillLotFacts, findRecallRow, rerunSnapshots } from './recall.repository';

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
  const reruns = await rerunSnapshots(manager, id);
  const last = reruns.at(-1);
  const latest = last ? await snapshotContent(manager, id, last.id) : opening;
  const diff = diffAffectedSets(opening.content.trace, latest.content.trace);
  const { lots, consignees } = latest.content.trace;
  const ids = lots.map((lot) => lot.id);
  const inScope = new Set(ids);

  const { heats, shipped, children } = await drillLotFacts(manager, ids);
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
    effectiveness: await effectivenessOf(manager, id),
    lots: lots.map((lot, index) => ({ ...lot, heats: facts[index]!.sourceHeats.map((heat) => heat.heatNumber) })),
    consignees,
    madeAt: now.toISOString(),
  };
}
