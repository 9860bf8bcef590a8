import type { DataSource, EntityManager } from 'typeorm';
import { activeHolds } from '../recall/lot-holds';
import { releaseReadiness, type Readiness, type ReadinessFacts } from '@shared/domain/release/readiness';
import type { LotDetail } from '@shared/schemas/lot-detail';
import { lotDetailIn } from '../manufacturing/lot-detail.service';
import { ancestorLots } from '../trace/genealogy.repository';
import { nonconformancesWhere } from '../manufacturing/nonconformances.repository';
import { materialHolds } from '../manufacturing/material-holds.repository';
import { reconcileMaterial } from '@shared/domain/manufacturing/material-reconciliation';
import { DecimalE29 } from '@shared/domain/materials/e29-rounding';
import { latestVerdictSql } from '../materials/heats.repository';
import { currentJustification } from '../materials/heat-evaluation.record';

/** The lot and every lot its units came through (splits and merges), the lot itself first. */
export async function ancestry(manager: EntityManager, lotId: number): Promise<number[]> {
  return [lotId, ...(await ancestorLots(manager, [lotId])).filter((id) => id !== lotId)];
}

export interface ReleaseDossier {
  lot: LotDetail;
  readiness: Readiness;
  /** Exactly what the release signatures cover: the record as evaluated, without volatile times of reading. */
  content: Record<string, unknown>;
  authorIds: number[];
  /** The lot and the lots its units came through, the lot first. */
  lineage: number[];
}

/** Builds the release dossier of a lot: its record with its genealogy, and the readiness checklist. */
export function releaseDossier(dataSource: DataSource, lotId: number): Promise<ReleaseDossier> {
  return releaseDossierIn(dataSource.manager, lotId);
}

/** The same, read through the given manager (inside a caller's transaction). */
export async function releaseDossierIn(manager: EntityManager, lotId: number): Promise<ReleaseDossier> {
  const lot = await lotDetailIn(manager, lotId);
  const lineage = await ancestry(manager, lotId);
  const marks = lineage.map(() => '?').join(',');
  const heats: Array<{
    id: number;
    heat_number: string;
    status: string;
    supplier: string;
    spec_id: string;
    spec_revision: string;
    grade: string | null;
    verdict: string | null;
  }> = await manager.query(
    `SELECT DISTINCT h.id, h.heat_number, h.status, s.name AS supplier, h.spec_id, h.spec_revision, h.grade,
            ${latestVerdictSql('h.id')} AS verdict
       FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id JOIN heat h ON h.id = b.heat_id JOIN supplier s ON s.id = h.supplier_id
      WHERE m.lot_id IN (${marks}) AND m.kind = 'issue' ORDER BY h.heat_number`,
    lineage,
  );
  const certificates: Array<{ heat_id: number; sha256: string }> = heats.length
    ? await manager.query(
        `SELECT c.heat_id, d.sha256 FROM heat_certificate c JOIN certificate_document d ON d.id = c.document_id WHERE c.heat_id IN (${heats.map(() => '?').join(',')}) ORDER BY d.sha256`,
        heats.map((heat) => heat.id),
      )
    : [];
  const operations: Array<{
    lot_id: number;
    step_no: number;
    kind: string;
    name: string;
    verdict: 'accept' | 'reject' | null;
    process_run_id: number | null;
    recorded_by: number;
    lot_number: string;
  }> = await manager.query(
    `SELECT o.lot_id, s.step_no, s.kind, s.name, o.verdict, o.process_run_id, o.recorded_by, l.lot_number
       FROM lot_operation o JOIN routing_step s ON s.id = o.routing_step_id JOIN production_lot l ON l.id = o.lot_id WHERE o.lot_id IN (${marks}) ORDER BY s.step_no, l.lot_number, o.id`,
    lineage,
  );
  const runIds = [
    ...new Set(operations.flatMap((operation) => (operation.process_run_id ? [operation.process_run_id] : []))),
  ];
  const runs: Array<{
    id: number;
    run_number: string;
    method_id: string;
    in_window: number;
    parameters_json: string;
    recorded_by: number;
  }> = runIds.length
    ? await manager.query(
        `SELECT id, run_number, method_id, in_window, parameters_json, recorded_by FROM process_run WHERE id IN (${runIds.map(() => '?').join(',')}) ORDER BY run_at, id`,
        runIds,
      )
    : [];
  const ncClauses = [`n.lot_id IN (${marks})`];
  const ncParameters: unknown[] = [...lineage];
  if (heats.length) {
    ncClauses.push(`(n.subject_type = 'heat' AND n.subject_id IN (${heats.map(() => '?').join(',')}))`);
    ncParameters.push(...heats.map((heat) => heat.id));
  }
  if (runIds.length) {
    ncClauses.push(`(n.subject_type = 'process-run' AND n.subject_id IN (${runIds.map(() => '?').join(',')}))`);
    ncParameters.push(...runIds);
  }
  const nonconformances = (await nonconformancesWhere(manager, ncClauses.join(' OR '), ncParameters)).sort((a, b) =>
    a.ncNumber.localeCompare(b.ncNumber),
  );
  const [labels]: Array<{ printed: string | null; voided: string | null }> = await manager.query(
    "SELECT SUM(CASE kind WHEN 'print' THEN qty ELSE 0 END) AS printed, SUM(CASE kind WHEN 'void' THEN qty ELSE 0 END) AS voided FROM label_print WHERE lot_id = ?",
    [lotId],
  );
  // Bar length is reconciled on the lots cut from bar: this one, or its ancestors.
  const material: ReadinessFacts['material'] = [];
  for (const ancestorId of lineage) {
    const bar: Array<{
      origin: string;
      lot_number: string;
      start_qty: number | null;
      unit_length_mm: string;
      cutoff_allowance_mm: string;
      reconciliation_tolerance_pct: string;
    }> = await manager.query(
      'SELECT l.origin, l.lot_number, l.start_qty, p.unit_length_mm, p.cutoff_allowance_mm, p.reconciliation_tolerance_pct FROM production_lot l JOIN part p ON p.id = l.part_id WHERE l.id = ?',
      [ancestorId],
    );
    if (bar[0]?.origin !== 'bar') continue;
    const [moved]: Array<{ issued: string | null; returned: string | null }> = await manager.query(
      "SELECT SUM(CASE kind WHEN 'issue' THEN length_mm ELSE 0 END) AS issued, SUM(CASE kind WHEN 'return' THEN length_mm ELSE 0 END) AS returned FROM material_movement WHERE lot_id = ?",
      [ancestorId],
    );
    const result = reconcileMaterial({
      issuedMm: new DecimalE29(moved?.issued ?? '0').toFixed(2),
      returnedMm: new DecimalE29(moved?.returned ?? '0').toFixed(2),
      unitsStarted: bar[0].start_qty ?? 0,
      unitLengthMm: bar[0].unit_length_mm,
      cutoffAllowanceMm: bar[0].cutoff_allowance_mm,
      tolerancePct: bar[0].reconciliation_tolerance_pct,
    });
    material.push({ lotId: ancestorId, lotNumber: bar[0].lot_number, verdict: result.verdict, why: result.why });
  }
  // Bar held by an open recall or a nonconformance on it, its heat or a bar it was cut from.
  const issuedPieces: Array<{ piece_id: number; tag: string; heat_id: number; supplier_id: number }> =
    await manager.query(
      `SELECT DISTINCT b.id AS piece_id, b.tag, h.id AS heat_id, h.supplier_id FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id JOIN heat h ON h.id = b.heat_id
      WHERE m.lot_id IN (${marks}) AND m.kind = 'issue' ORDER BY b.tag`,
      lineage,
    );
  const heldMaterial: ReadinessFacts['heldMaterial'] = [];
  for (const piece of issuedPieces) {
    const reasons = await materialHolds(
      manager,
      { heatId: piece.heat_id, pieceId: piece.piece_id, supplierId: piece.supplier_id },
      lineage,
    );
    if (reasons.length) heldMaterial.push({ tag: piece.tag, reasons });
  }
  const recordedStep = new Map(operations.map((operation) => [operation.step_no, operation.lot_number]));
  const facts: ReadinessFacts = {
    lot: { id: lot.id, lotNumber: lot.lotNumber, onHand: lot.onHand },
    heats: heats.map((heat) => ({ id: heat.id, heatNumber: heat.heat_number, status: heat.status })),
    routing: lot.partRecord.routing.map((step) => ({
      stepNo: step.stepNo,
      name: step.name,
      kind: step.kind,
      recordedOn: recordedStep.get(step.stepNo) ?? null,
    })),
    runs: runs.map((run) => ({
      id: run.id,
      runNumber: run.run_number,
      inWindow: Boolean(run.in_window),
      openNonconformances: nonconformances.filter((nc) => nc.runNumber === run.run_number && nc.status !== 'closed')
        .length,
    })),
    inspections: lot.partRecord.routing
      .filter((step) => step.kind === 'inspection')
      .map((step) => ({
        stepNo: step.stepNo,
        name: step.name,
        verdict: operations.find((operation) => operation.step_no === step.stepNo)?.verdict ?? null,
      })),
    unitsConsistent: lot.unitChain.consistent,
    unitProblems: lot.unitChain.items
      .filter((entry) => entry.verdict === 'discrepancy')
      .map((entry) => `step ${entry.stepNo}: ${entry.why}`),
    material,
    openNonconformances: nonconformances
      .filter((nc) => nc.status !== 'closed')
      .map((nc) => ({ id: nc.id, ncNumber: nc.ncNumber, status: nc.status })),
    holds: (await activeHolds(manager, [lot.id])).map((hold) => ({ id: hold.id, reference: hold.reference })),
    heldMaterial,
    labels: { printed: Number(labels?.printed ?? 0), voided: Number(labels?.voided ?? 0) },
  };
  const readiness = releaseReadiness(facts);
  const justifications = new Map<number, string>();
  for (const heat of heats.filter((candidate) => candidate.verdict === 'cannot-be-evaluated')) {
    const justification = await currentJustification(manager, heat.id);
    if (justification) justifications.set(heat.id, `${justification.manifestation}: ${justification.reason}`);
  }
  const content = {
    lot: lot.lotNumber,
    part: `${lot.part.partNumber} rev ${lot.part.revision} — ${lot.part.description}`,
    gtin: lot.partRecord.gtin,
    quantity: lot.onHand,
    genealogy:
      lineage.length > 1
        ? lot.parents.map(
            (parent) => `${parent.kind} from ${parent.lotNumber} (${parent.qty} units after step ${parent.afterStep})`,
          )
        : [],
    heats: heats.map((heat) => ({
      heat: heat.heat_number,
      supplier: heat.supplier,
      specification: `${heat.spec_id} ${heat.spec_revision}${heat.grade ? ` grade ${heat.grade}` : ''}`,
      disposition: heat.status,
      evaluation: heat.verdict,
      // Only for heats accepted on a QA approver's justification, so that other packets sign what they signed before.
      ...(justifications.has(heat.id) ? { justification: justifications.get(heat.id)! } : {}),
      certificates: certificates
        .filter((certificate) => certificate.heat_id === heat.id)
        .map((certificate) => certificate.sha256),
    })),
    steps: operations.map((operation) => ({
      lot: operation.lot_number,
      step: `${operation.step_no} ${operation.name}`,
      verdict: operation.verdict,
    })),
    operations: lot.operations.map((operation) => ({
      step: `${operation.stepNo} ${operation.stepName}`,
      units: `${operation.qtyIn} in, ${operation.qtyGood} good, ${operation.qtyScrap} scrap`,
      by: `${operation.operatorName}, ${operation.workCentre}`,
      ended: operation.endedAt,
      files: operation.files.map((file) => file.sha256),
    })),
    runs: runs.map((run) => ({
      run: run.run_number,
      method: run.method_id,
      inWindow: Boolean(run.in_window),
      parameters: JSON.parse(run.parameters_json) as unknown,
    })),
    nonconformances: nonconformances.map((nc) => ({
      nonconformance: nc.ncNumber,
      subject: nc.subjectLabel,
      status: nc.status,
      disposition: nc.disposition,
    })),
    labels: facts.labels,
    readiness: readiness.items.map((entry) => ({ item: entry.title, verdict: entry.verdict, why: entry.why })),
  };
  const [authors]: Array<{ ids: string | null }> = await manager.query(
    `SELECT GROUP_CONCAT(DISTINCT person_id) AS ids FROM (
       SELECT opened_by AS person_id FROM production_lot WHERE id IN (${marks})
       UNION SELECT recorded_by FROM material_movement WHERE lot_id IN (${marks})
       UNION SELECT recorded_by FROM lot_operation WHERE lot_id IN (${marks})
       UNION SELECT submitted_by FROM release_submission WHERE lot_id = ?) AS authors`,
    [...lineage, ...lineage, ...lineage, lotId],
  );
  const authorIds = [
    ...new Set([...(authors?.ids ?? '').split(',').filter(Boolean).map(Number), ...runs.map((run) => run.recorded_by)]),
  ];
  return { lot, readiness, content, authorIds, lineage };
}
