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
import { currentJustification } from '../materials/heat-evaluation.record';
import { labelCounts } from './release.repository';
import {
  barLengthsMoved,
  barLotFacts,
  certificateHashes,
  issuedBarPieces,
  issuedHeats,
  processRunsOf,
  recordAuthorIds,
  recordedOperations,
} from './release-dossier.repository';

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
  const heats = await issuedHeats(manager, lineage);
  const certificates = await certificateHashes(
    manager,
    heats.map((heat) => heat.id),
  );
  const operations = await recordedOperations(manager, lineage);
  const runIds = [
    ...new Set(operations.flatMap((operation) => (operation.process_run_id ? [operation.process_run_id] : []))),
  ];
  const runs = await processRunsOf(manager, runIds);
  const ncClauses = [`n.lot_id IN (${lineage.map(() => '?').join(',')})`];
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
  const labels = await labelCounts(manager, lotId);
  // Bar length is reconciled on the lots cut from bar: this one, or its ancestors.
  const material: ReadinessFacts['material'] = [];
  for (const ancestorId of lineage) {
    const bar = await barLotFacts(manager, ancestorId);
    if (bar?.origin !== 'bar') continue;
    const moved = await barLengthsMoved(manager, ancestorId);
    const result = reconcileMaterial({
      issuedMm: new DecimalE29(moved.issued).toFixed(2),
      returnedMm: new DecimalE29(moved.returned).toFixed(2),
      unitsStarted: bar.start_qty ?? 0,
      unitLengthMm: bar.unit_length_mm,
      cutoffAllowanceMm: bar.cutoff_allowance_mm,
      tolerancePct: bar.reconciliation_tolerance_pct,
    });
    material.push({ lotId: ancestorId, lotNumber: bar.lot_number, verdict: result.verdict, why: result.why });
  }
  // Bar held by an open recall or a nonconformance on it, its heat or a bar it was cut from.
  const issuedPieces = await issuedBarPieces(manager, lineage);
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
    labels,
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
  const authors = await recordAuthorIds(manager, lineage, lotId);
  const authorIds = [...new Set([...authors, ...runs.map((run) => run.recorded_by)])];
  return { lot, readiness, content, authorIds, lineage };
}
