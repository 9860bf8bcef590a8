import type { z } from 'zod';
// Certificate screening in the running product: the history of a heat's supplier and
// specification screened with the pure functions in shared/, the findings that involve the heat,
// and reviewers' acknowledgements of them (which acceptance of the heat waits for).
import type { DataSource, EntityManager } from 'typeorm';
import {
  screenSupplierHistory,
  type PropertyLimits,
  type ScreenedHeat,
} from '@shared/domain/materials/certificate-screening';
import { readChemistryValue, ReportedValueError } from '@shared/domain/materials/reported-value';
import { conditionOf, type Specification } from '@shared/domain/materials/specification';
import type { Person } from '@shared/schemas/people';
import { screeningAcknowledgementSchema, type HeatScreening, type SupplierScreening } from '@shared/schemas/screening';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import * as heats from './heats.repository';
import { storedSpecification } from './specification-library.repository';
import {
  acknowledgedFindings,
  acknowledgementsOfHeat,
  insertAcknowledgement,
  screeningGroups,
  supplierCertificateHashes,
  supplierForScreening,
  supplierResultRows,
} from './screening.repository';

/** Every heat of a supplier, specification and grade, with its reported values and document hashes. */
async function supplierHistory(
  manager: EntityManager,
  supplierId: number,
  specId: string,
  grade: string | null,
): Promise<ScreenedHeat[]> {
  const rows = await supplierResultRows(manager, supplierId, specId, grade);
  const documents = await supplierCertificateHashes(manager, supplierId, specId, grade);
  const byId = new Map<number, ScreenedHeat>();
  for (const row of rows) {
    const heat = byId.get(row.id) ?? {
      heatId: row.id,
      heatNumber: row.heat_number,
      receivedAt: new Date(row.received_at).toISOString(),
      values: {},
      documentHashes: [],
    };
    byId.set(row.id, heat);
    if (row.item && row.as_reported !== null) heat.values[row.item] = comparableValue(row.kind!, row.as_reported);
  }
  for (const document of documents) byId.get(document.heat_id)?.documentHashes.push(document.sha256);
  return [...byId.values()];
}

/** Chemistry in wt % with its reported decimals (40 ppm → 0.0040); mechanical values as reported. */
function comparableValue(kind: 'chemistry' | 'mechanical', asReported: string): string {
  if (kind === 'mechanical') return asReported;
  try {
    return readChemistryValue(asReported).value;
  } catch (error) {
    if (error instanceof ReportedValueError) return asReported;
    throw error;
  }
}

/** The limits of a grade: chemistry, and the mechanical minimums of the set for the heat's form and condition. */
export function limitsOf(
  specification: Specification | null,
  grade: string | null,
  form: string,
  condition: string,
): Record<string, PropertyLimits> {
  const limits: Record<string, PropertyLimits> = {};
  const chosen = specification?.grades.find((candidate) => candidate.grade === grade) ?? specification?.grades[0];
  if (!chosen) return limits;
  for (const element of chosen.chemistry)
    limits[element.element] = {
      ...(element.min ? { min: element.min } : {}),
      ...(element.max ? { max: element.max } : {}),
    };
  const set = chosen.mechanical.find(
    (candidate) =>
      candidate.forms.includes(form as never) && conditionOf(candidate.condition) === conditionOf(condition),
  );
  for (const limit of set?.limits ?? []) limits[limit.property] = { min: limit.min };
  return limits;
}

/** The findings that involve one heat, each with its acknowledgement for this heat if given. */
export async function screeningOfHeat(manager: EntityManager, heatId: number): Promise<HeatScreening> {
  const heat = await heats.findHeat(manager, heatId);
  if (!heat) throw AppError.notFound('Heat');
  const history = await supplierHistory(manager, heat.supplier.id, heat.spec.id, heat.spec.grade);
  const specification = await storedSpecification(manager, heat.spec.id, heat.spec.revision);
  const findings = screenSupplierHistory(
    history,
    limitsOf(specification, heat.spec.grade, heat.productForm, heat.condition),
  ).filter((finding) => finding.heatIds.includes(heatId));
  const acknowledgements = await acknowledgementsOfHeat(manager, heatId);
  const numberOf = new Map(history.map((entry) => [entry.heatId, entry.heatNumber]));
  return {
    heatsScreened: history.length,
    findings: findings.map(({ heatIds, ...finding }) => {
      const acknowledgement = acknowledgements.find((candidate) => candidate.finding_key === finding.key);
      return {
        ...finding,
        heatNumbers: heatIds.map((id) => numberOf.get(id) ?? String(id)),
        acknowledgement: acknowledgement
          ? {
              by: acknowledgement.name,
              at: new Date(acknowledgement.acknowledged_at).toISOString(),
              reason: acknowledgement.reason,
            }
          : null,
      };
    }),
  };
}

/**
 * The screening of every specification and grade a supplier delivers, each finding with the
 * heats it involves and whether a reviewer acknowledged it for each of them.
 */
export async function screeningOfSupplier(manager: EntityManager, supplierId: number): Promise<SupplierScreening> {
  const [supplier] = await supplierForScreening(manager, supplierId);
  if (!supplier) throw AppError.notFound('Supplier');
  // Per specification and grade, the newest heat sets the limits (its revision, form and condition).
  const groups = await screeningGroups(manager, supplierId);
  const acknowledged = await acknowledgedFindings(manager, supplierId);
  const isAcknowledged = new Set(acknowledged.map((row) => `${row.heat_id} ${row.finding_key}`));
  const screened = [];
  for (const group of groups) {
    const history = await supplierHistory(manager, supplierId, group.spec_id, group.grade);
    const specification = await storedSpecification(manager, group.spec_id, group.spec_revision);
    const numberOf = new Map(history.map((entry) => [entry.heatId, entry.heatNumber]));
    const findings = screenSupplierHistory(
      history,
      limitsOf(specification, group.grade, group.product_form, group.heat_condition),
    );
    screened.push({
      specId: group.spec_id,
      grade: group.grade,
      heatsScreened: history.length,
      findings: findings.map(({ heatIds, ...finding }) => ({
        ...finding,
        heats: heatIds.map((id) => ({
          id,
          heatNumber: numberOf.get(id) ?? String(id),
          acknowledged: isAcknowledged.has(`${id} ${finding.key}`),
        })),
      })),
    });
  }
  return { supplier, groups: screened };
}

/** Findings on the heat that nobody has acknowledged yet. */
export async function openFindings(manager: EntityManager, heatId: number): Promise<string[]> {
  return (await screeningOfHeat(manager, heatId)).findings
    .filter((finding) => !finding.acknowledgement)
    .map((finding) => finding.explanation);
}

/** Records that a reviewer looked into a finding on this heat, and why it does not stop acceptance. */
export async function acknowledgeFinding(
  dataSource: DataSource,
  heatId: number,
  input: z.output<typeof screeningAcknowledgementSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<HeatScreening> {
  return inTransaction(dataSource, async (manager) => {
    const heat = await heats.findHeat(manager, heatId, true);
    if (!heat) throw AppError.notFound('Heat');
    if (heat.status === 'accepted' || heat.status === 'rejected')
      throw AppError.rule(`The heat is already ${heat.status}`, { findingKey: 'Dispositioned heat' });
    const finding = (await screeningOfHeat(manager, heatId)).findings.find(
      (candidate) => candidate.key === input.findingKey,
    );
    if (!finding)
      throw AppError.rule('No such finding on this heat; reload the heat to see its current screening', {
        findingKey: 'Unknown finding',
      });
    if (finding.acknowledgement)
      throw new AppError('CONFLICT', `${finding.acknowledgement.by} already acknowledged this finding`, {
        findingKey: 'Already acknowledged',
      });
    await insertAcknowledgement(manager, heatId, finding, input.reason, person.id);
    await appendLedgerEvent(manager, {
      actor,
      action: 'heat.screening-finding-acknowledged',
      entity: { type: 'heat', id: heatId },
      after: { finding: finding.key, kind: finding.kind, explanation: finding.explanation },
      reason: input.reason,
      origin,
    });
    return screeningOfHeat(manager, heatId);
  });
}
