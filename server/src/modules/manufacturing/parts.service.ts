import type { z } from 'zod';
import type { DataSource } from 'typeorm';
import { processMethod } from '@shared/domain/manufacturing/process-methods';
import { partCreateSchema, type Part } from '@shared/schemas/manufacturing';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { currentSpecifications } from '../materials/specification-library.repository';
import { methodScopeChecker } from './process-methods.service';
import {
  findPart,
  insertPart,
  insertPartSpecification,
  insertRoutingStep,
  partNumbered,
  partOfGtin,
} from './parts.repository';

export { findPart, loadParts } from './parts.repository';

export async function partById(dataSource: DataSource, id: number): Promise<Part> {
  const part = await findPart(dataSource.manager, id);
  if (!part) throw AppError.notFound('Part');
  return part;
}

/** Registers a part with its allowed material specifications and its routing, in one transaction. */
export async function createPart(
  dataSource: DataSource,
  input: z.output<typeof partCreateSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<Part> {
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
    if (await partNumbered(manager, input.partNumber, input.revision))
      throw new AppError('CONFLICT', `Part ${input.partNumber} revision ${input.revision} exists already`, {
        revision: 'Already registered',
      });
    const sameGtin = await partOfGtin(manager, input.gtin.padStart(14, '0'));
    if (sameGtin)
      throw new AppError('CONFLICT', `GTIN ${input.gtin} already identifies part ${sameGtin.partNumber}`, {
        gtin: 'Already in use',
      });
    const id = await insertPart(manager, {
      partNumber: input.partNumber,
      revision: input.revision,
      description: input.description,
      gtin: input.gtin.padStart(14, '0'),
      unitLengthMm: input.unitLengthMm,
      cutoffAllowanceMm: input.cutoffAllowanceMm,
      unitMassG: input.unitMassG,
      reconciliationTolerancePct: input.reconciliationTolerancePct,
      lotPattern: input.lotPattern,
      contactCategory: input.contactCategory,
      createdBy: person.id,
    });
    const seen = new Set<string>();
    for (const allowed of input.specifications) {
      const key = `${allowed.specId}|${allowed.grade ?? ''}`;
      if (seen.has(key)) continue;
      seen.add(key);
      await insertPartSpecification(manager, { partId: id, specId: allowed.specId, grade: allowed.grade ?? '' });
    }
    for (const [index, step] of input.routing.entries()) {
      await insertRoutingStep(manager, {
        partId: id,
        stepNo: (index + 1) * 10,
        kind: step.kind,
        name: step.name,
        processMethod: step.processMethod,
        sampleSize: step.sampleSize,
        acceptNumber: step.acceptNumber,
        rejectNumber: step.rejectNumber,
      });
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
