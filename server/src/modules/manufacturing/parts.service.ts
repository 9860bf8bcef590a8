import type { DataSource, EntityManager } from 'typeorm';
import { processMethod } from '@shared/domain/manufacturing/process-methods';
import type { ContactCategory } from '@shared/domain/manufacturing/contact-categories';
import { partCreateSchema, type Part, type PartCreate, type RoutingStep } from '@shared/schemas/manufacturing';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { currentSpecifications } from '../materials/specification-library.repository';
import { methodScopeChecker } from './process-methods.service';

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

export async function loadParts(manager: EntityManager, ids?: number[]): Promise<Part[]> {
  if (ids && ids.length === 0) return [];
  const where = ids ? `WHERE p.id IN (${ids.map(() => '?').join(',')})` : '';
  const rows: PartRow[] = await manager.query(
    `SELECT p.*, (SELECT COUNT(*) FROM production_lot l WHERE l.part_id = p.id) AS lots FROM part p ${where} ORDER BY p.part_number, p.revision`,
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

export async function partById(dataSource: DataSource, id: number): Promise<Part> {
  const part = await findPart(dataSource.manager, id);
  if (!part) throw AppError.notFound('Part');
  return part;
}

/** Registers a part with its allowed material specifications and its routing, in one transaction. */
export async function createPart(
  dataSource: DataSource,
  raw: PartCreate,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<Part> {
  const input = partCreateSchema.parse(raw);
  return inTransaction(dataSource, async (manager) => {
    const library = await currentSpecifications(manager);
    const fields: Record<string, string> = {};
    input.specifications.forEach((allowed, index) => {
      const specification = library.find((candidate) => candidate.id.toUpperCase() === allowed.specId.toUpperCase());
      if (!specification)
        fields[`specifications.${index}.specId`] = `${allowed.specId} is not in the specification library`;
      else if (allowed.grade && !specification.grades.some((grade) => grade.grade === allowed.grade))
        fields[`specifications.${index}.grade`] = `${specification.id} has no grade ${allowed.grade}`;
      else allowed.specId = specification.id;
    });
    const scopeProblem = await methodScopeChecker(manager);
    const specIds = input.specifications.map((allowed) => allowed.specId);
    for (const [index, step] of input.routing.entries()) {
      if (!step.processMethod) continue;
      const method = processMethod(step.processMethod);
      if (!method) fields[`routing.${index}.processMethod`] = `Unknown process method ${step.processMethod}`;
      else if (method.kind !== step.kind)
        fields[`routing.${index}.processMethod`] = `${method.id} is a ${method.kind} method, not ${step.kind}`;
      else {
        const problem = scopeProblem(method, specIds, `The part's material`);
        if (problem) fields[`routing.${index}.processMethod`] = problem;
      }
    }
    if (Object.keys(fields).length) throw AppError.rule('Some of the part’s data does not match the library', fields);
    const [sameNumber] = await manager.query('SELECT id FROM part WHERE part_number = ? AND revision = ?', [
      input.partNumber,
      input.revision,
    ]);
    if (sameNumber)
      throw new AppError('CONFLICT', `Part ${input.partNumber} revision ${input.revision} exists already`, {
        revision: 'Already registered',
      });
    const [sameGtin] = await manager.query('SELECT part_number FROM part WHERE gtin = ?', [
      input.gtin.padStart(14, '0'),
    ]);
    if (sameGtin)
      throw new AppError('CONFLICT', `GTIN ${input.gtin} already identifies part ${sameGtin.part_number}`, {
        gtin: 'Already in use',
      });
    const result: { insertId: number } = await manager.query(
      `INSERT INTO part (part_number, revision, description, gtin, unit_length_mm, cutoff_allowance_mm, unit_mass_g, reconciliation_tolerance_pct, lot_pattern, contact_category, created_by)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      [
        input.partNumber,
        input.revision,
        input.description,
        input.gtin.padStart(14, '0'),
        input.unitLengthMm,
        input.cutoffAllowanceMm,
        input.unitMassG,
        input.reconciliationTolerancePct,
        input.lotPattern,
        input.contactCategory,
        person.id,
      ],
    );
    const id = Number(result.insertId);
    const seen = new Set<string>();
    for (const allowed of input.specifications) {
      const key = `${allowed.specId}|${allowed.grade ?? ''}`;
      if (seen.has(key)) continue;
      seen.add(key);
      await manager.query('INSERT INTO part_specification (part_id, spec_id, grade) VALUES (?, ?, ?)', [
        id,
        allowed.specId,
        allowed.grade ?? '',
      ]);
    }
    for (const [index, step] of input.routing.entries()) {
      await manager.query(
        'INSERT INTO routing_step (part_id, step_no, kind, name, process_method, sample_size, accept_number, reject_number) VALUES (?, ?, ?, ?, ?, ?, ?, ?)',
        [
          id,
          (index + 1) * 10,
          step.kind,
          step.name,
          step.processMethod,
          step.sampleSize,
          step.acceptNumber,
          step.rejectNumber,
        ],
      );
    }
    const part = (await findPart(manager, id))!;
    await appendLedgerEvent(manager, {
      actor,
      action: 'part.created',
      entity: { type: 'part', id },
      after: part,
      origin,
    });
    return part;
  });
}
