import type { EntityManager } from 'typeorm';
import { insertReturningId } from '../../db/insert-returning-id';
import type { ContactCategory } from '@shared/domain/manufacturing/contact-categories';
import type { Part, RoutingStep } from '@shared/schemas/manufacturing';
import { Part as PartEntity } from './entities/part.entity';
import { PartSpecification } from './entities/part-specification.entity';
import { RoutingStep as RoutingStepEntity } from './entities/routing-step.entity';

interface PartRow {
  id: number;
  part_number: string;
  revision: string;
  description: string;
  gtin: string;
  unit_length_mm: string;
  cutoff_allowance_mm: string;
  unit_mass_g: string | null;
  reconciliation_tolerance_pct: string;
  lot_pattern: string;
  contact_category: ContactCategory;
  lots: string | number;
}

interface StepRow {
  id: number;
  part_id: number;
  step_no: number;
  kind: RoutingStep['kind'];
  name: string;
  process_method: string | null;
  sample_size: number | null;
  accept_number: number | null;
  reject_number: number | null;
}

const toStep = (row: StepRow): RoutingStep => ({
  id: row.id,
  stepNo: row.step_no,
  kind: row.kind,
  name: row.name,
  processMethod: row.process_method,
  sampleSize: row.sample_size,
  acceptNumber: row.accept_number,
  rejectNumber: row.reject_number,
});

/** Parts with their specifications, routing and count of lots, by part number and revision. */
export async function loadParts(manager: EntityManager, ids?: number[]): Promise<Part[]> {
  if (ids && ids.length === 0) return [];
  const where = ids ? `WHERE p.id IN (${ids.map(() => '?').join(',')})` : '';
  const rows: PartRow[] = await manager.query(
    `SELECT p.*, (SELECT COUNT(*) FROM production_lot l WHERE l.part_id = p.id) AS lots FROM part p ${where} ` +
      `ORDER BY p.part_number, p.revision`,
    ids ?? [],
  );
  if (!rows.length) return [];
  const partIds = rows.map((row) => row.id);
  const marks = partIds.map(() => '?').join(',');
  const steps: StepRow[] = await manager.query(
    `SELECT * FROM routing_step WHERE part_id IN (${marks}) ORDER BY part_id, step_no`,
    partIds,
  );
  const specs: Array<{ part_id: number; spec_id: string; grade: string }> = await manager.query(
    `SELECT * FROM part_specification WHERE part_id IN (${marks}) ORDER BY spec_id, grade`,
    partIds,
  );
  return rows.map((row) => ({
    id: row.id,
    partNumber: row.part_number,
    revision: row.revision,
    description: row.description,
    gtin: row.gtin,
    unitLengthMm: row.unit_length_mm,
    cutoffAllowanceMm: row.cutoff_allowance_mm,
    unitMassG: row.unit_mass_g,
    reconciliationTolerancePct: row.reconciliation_tolerance_pct,
    lotPattern: row.lot_pattern,
    contactCategory: row.contact_category,
    specifications: specs
      .filter((spec) => spec.part_id === row.id)
      .map((spec) => ({ specId: spec.spec_id, grade: spec.grade || null })),
    routing: steps.filter((step) => step.part_id === row.id).map(toStep),
    lots: Number(row.lots),
  }));
}

export async function findPart(manager: EntityManager, id: number): Promise<Part | null> {
  return (await loadParts(manager, [id]))[0] ?? null;
}

/** Locks the part for the rest of the transaction. */
export async function lockPart(manager: EntityManager, id: number): Promise<void> {
  await manager
    .getRepository(PartEntity)
    .findOne({ select: { id: true }, where: { id }, lock: { mode: 'pessimistic_write' } });
}

export function partNumbered(manager: EntityManager, partNumber: string, revision: string) {
  return manager.getRepository(PartEntity).findOne({ select: { id: true }, where: { partNumber, revision } });
}

export function partOfGtin(manager: EntityManager, gtin: string) {
  return manager.getRepository(PartEntity).findOne({ select: { id: true, partNumber: true }, where: { gtin } });
}

export async function insertPart(
  manager: EntityManager,
  part: Omit<PartEntity, 'id' | 'createdAt' | 'createdByPerson'>,
): Promise<number> {
  return insertReturningId(manager, PartEntity, part);
}

export async function insertPartSpecification(
  manager: EntityManager,
  allowed: Pick<PartSpecification, 'partId' | 'specId' | 'grade'>,
): Promise<void> {
  await manager.getRepository(PartSpecification).insert(allowed);
}

export async function insertRoutingStep(
  manager: EntityManager,
  step: Omit<RoutingStepEntity, 'id' | 'part'>,
): Promise<void> {
  await manager.getRepository(RoutingStepEntity).insert(step);
}
