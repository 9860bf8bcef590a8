import type { DataSource, EntityManager } from 'typeorm';
import { activeHolds } from '../recall/lot-holds';
import { DecimalE29 } from '@shared/domain/materials/e29-rounding';
import { reconcileMaterial } from '@shared/domain/manufacturing/material-reconciliation';
import type {
  LotDetail,
  MaterialMovement,
  OperationRecord,
  ShipmentRecord,
  TimelineEntry,
} from '@shared/schemas/lot-detail';
import { AppError } from '../../errors';
import { lotMaterialMovements, lotOperationFiles, lotShipmentRows } from './lot-record.repository';
import { findPart } from './parts.repository';
import { findLotRow, heatsByLot, linkRows, operationRows, toLotSummary } from './lots.repository';
import { unitChains } from './lot-units';
import { nonconformancesWhere } from './nonconformances.repository';

/** The lot's whole record, its unit chain and material reconciliation, and one timeline of it all. */
export function lotDetail(dataSource: DataSource, lotId: number): Promise<LotDetail> {
  return lotDetailIn(dataSource.manager, lotId);
}

/** The same, read through the given manager (inside a caller's transaction). */
export async function lotDetailIn(manager: EntityManager, lotId: number): Promise<LotDetail> {
  const row = await findLotRow(manager, lotId);
  if (!row) throw AppError.notFound('Lot');
  const part = (await findPart(manager, row.part_id))!;
  const chain = (await unitChains(manager, [lotId])).get(lotId)!;
  const movements = await lotMaterialMovements(manager, lotId);
  const material: MaterialMovement[] = movements.map((movement) => ({
    id: movement.id,
    kind: movement.kind,
    tag: movement.tag,
    barPieceId: movement.bar_piece_id,
    heat: {
      id: movement.heat_id,
      heatNumber: movement.heat_number,
      status: movement.heat_status,
      supplier: movement.supplier,
      specId: movement.spec_id,
    },
    lengthMm: movement.length_mm,
    recordedAt: new Date(movement.recorded_at).toISOString(),
    recordedBy: movement.by,
  }));
  const files = await lotOperationFiles(manager, lotId);
  const operations: OperationRecord[] = (await operationRows(manager, [lotId])).map((operation) => ({
    id: operation.id,
    stepNo: operation.step_no,
    stepName: operation.step_name,
    kind: operation.kind,
    operatorName: operation.operator_name,
    workCentre: operation.work_centre,
    programRevision: operation.program_revision,
    startedAt: new Date(operation.started_at).toISOString(),
    endedAt: new Date(operation.ended_at).toISOString(),
    qtyIn: operation.qty_in,
    qtyGood: operation.qty_good,
    qtyScrap: operation.qty_scrap,
    scrapReasons: JSON.parse(operation.scrap_reasons) as Array<{ reason: string; qty: number }>,
    sampleSize: operation.sample_size,
    defectsFound: operation.defects_found,
    verdict: operation.verdict,
    processRun: operation.process_run_id
      ? { id: operation.process_run_id, runNumber: operation.run_number!, inWindow: Boolean(operation.in_window) }
      : null,
    notes: operation.notes,
    files: files
      .filter((file) => file.operation_id === operation.id)
      .map((file) => ({ documentId: file.document_id, name: file.name, sha256: file.sha256 })),
    recordedBy: operation.recorded_by_name,
    recordedAt: new Date(operation.recorded_at).toISOString(),
  }));
  const links = await linkRows(manager, [lotId]);
  const parents = links
    .filter((link) => link.child_lot_id === lotId)
    .map((link) => ({
      lotId: link.parent_lot_id,
      lotNumber: link.parent_number,
      kind: link.kind,
      qty: link.qty,
      afterStep: link.after_step,
    }));
  const children = links
    .filter((link) => link.parent_lot_id === lotId)
    .map((link) => ({
      lotId: link.child_lot_id,
      lotNumber: link.child_number,
      kind: link.kind,
      qty: link.qty,
      afterStep: link.after_step,
    }));
  const heatIds = [...new Set(material.map((movement) => movement.heat.id))];
  const pieceIds = [...new Set(material.map((movement) => movement.barPieceId))];
  const runIds = [
    ...new Set(operations.flatMap((operation) => (operation.processRun ? [operation.processRun.id] : []))),
  ];
  const clauses = ['n.lot_id = ?'];
  const parameters: unknown[] = [lotId];
  if (heatIds.length) {
    clauses.push(`(n.subject_type = 'heat' AND n.subject_id IN (${heatIds.map(() => '?').join(',')}))`);
    parameters.push(...heatIds);
  }
  if (pieceIds.length) {
    clauses.push(`(n.subject_type = 'bar-piece' AND n.subject_id IN (${pieceIds.map(() => '?').join(',')}))`);
    parameters.push(...pieceIds);
  }
  if (runIds.length) {
    clauses.push(`(n.subject_type = 'process-run' AND n.subject_id IN (${runIds.map(() => '?').join(',')}))`);
    parameters.push(...runIds);
  }
  const nonconformances = (await nonconformancesWhere(manager, clauses.join(' OR '), parameters)).map(
    ({ raisedById: _by, ...nc }) => nc,
  );
  const shipmentRows = await lotShipmentRows(manager, lotId);
  const shipments: ShipmentRecord[] = shipmentRows.map((shipment) => ({
    id: shipment.id,
    consignee: { id: shipment.consignee_id, name: shipment.name, kind: shipment.kind, country: shipment.country },
    qty: shipment.qty,
    shippedOn:
      typeof shipment.shipped_on === 'string'
        ? shipment.shipped_on.slice(0, 10)
        : new Date(shipment.shipped_on).toISOString().slice(0, 10),
    documentNumber: shipment.document_number,
    recordedBy: shipment.by,
  }));
  const sum = (kind: 'issue' | 'return') =>
    material
      .filter((movement) => movement.kind === kind)
      .reduce((total, movement) => total.plus(movement.lengthMm), new DecimalE29(0));
  const materialReconciliation =
    row.origin === 'bar'
      ? reconcileMaterial({
          issuedMm: sum('issue').toFixed(2),
          returnedMm: sum('return').toFixed(2),
          unitsStarted: chain.started ?? 0,
          unitLengthMm: part.unitLengthMm,
          cutoffAllowanceMm: part.cutoffAllowanceMm,
          tolerancePct: part.reconciliationTolerancePct,
        })
      : null;
  const done = new Set(operations.map((operation) => operation.stepNo));
  const next = part.routing.find((step) => step.stepNo > row.resumes_after_step && !done.has(step.stepNo));
  const timeline: TimelineEntry[] = [
    {
      at: new Date(row.opened_at).toISOString(),
      kind: 'opened' as const,
      title: `Lot opened (${row.origin === 'bar' ? 'from bar' : `by ${row.origin}`})`,
      detail: `${row.planned_qty} units planned`,
      by: row.opened_by_name,
      link: null,
    },
    ...material.map((movement): TimelineEntry => ({
      at: movement.recordedAt,
      kind: 'material',
      title: `${movement.kind === 'issue' ? 'Bar issued' : 'Remnant returned'}: ${movement.tag}`,
      detail: `${movement.lengthMm} mm from heat ${movement.heat.heatNumber}`,
      by: movement.recordedBy,
      link: `/bar-stock/${movement.barPieceId}`,
    })),
    ...operations.map((operation): TimelineEntry => ({
      at: operation.endedAt,
      kind: operation.processRun ? 'run' : 'operation',
      title:
        `Step ${operation.stepNo} ` +
        `${operation.stepName}${operation.processRun ? ` in run ${operation.processRun.runNumber}` : ''}`,
      detail:
        `${operation.qtyIn} in, ${operation.qtyGood} good, ${operation.qtyScrap} ` +
        `scrap${operation.verdict ? `; inspection ${operation.verdict}` : ''}`,
      by: operation.operatorName,
      link: operation.processRun ? `/process-runs/${operation.processRun.id}` : null,
    })),
    ...nonconformances.map((nc): TimelineEntry => ({
      at: nc.raisedAt,
      kind: 'nonconformance',
      title: `${nc.ncNumber} raised (${nc.status})`,
      detail: nc.description,
      by: nc.raisedBy,
      link: `/nonconformances/${nc.id}`,
    })),
    ...links.map((link): TimelineEntry => ({
      at: new Date(link.recorded_at).toISOString(),
      kind: link.kind,
      title:
        link.kind === 'split'
          ? `Split: ${link.qty} units to ${link.child_number}`
          : `Merge: ${link.qty} units from ${link.parent_number} into ${link.child_number}`,
      detail: `after step ${link.after_step}`,
      by: link.recorded_by_name,
      link: `/lots/${link.parent_lot_id === lotId ? link.child_lot_id : link.parent_lot_id}`,
    })),
    ...shipments.map((shipment): TimelineEntry => ({
      at: `${shipment.shippedOn}T00:00:00.000Z`,
      kind: 'shipment',
      title: `Shipped ${shipment.qty} to ${shipment.consignee.name}`,
      detail: shipment.documentNumber,
      by: shipment.recordedBy,
      link: null,
    })),
  ].sort((a, b) => a.at.localeCompare(b.at));
  return {
    ...toLotSummary(
      row,
      chain.started === null ? null : chain.onHand,
      (await heatsByLot(manager, [lotId])).get(lotId) ?? [],
    ),
    partRecord: part,
    startQty: row.start_qty,
    resumesAfterStep: row.resumes_after_step,
    releasedQty: row.released_qty,
    material,
    operations,
    nextRoutingStep: next ? { stepNo: next.stepNo, name: next.name, kind: next.kind } : null,
    parents,
    children,
    nonconformances,
    shipments,
    unitChain: chain,
    materialReconciliation,
    timeline,
    holds: await activeHolds(manager, [lotId]),
  };
}
