import type { z } from 'zod';
import type { DataSource, EntityManager } from 'typeorm';
import { familiesOutsideScope, outsideScopeMessage } from '@shared/domain/manufacturing/method-scope';
import { processMethod, processMethods, type ProcessMethod } from '@shared/domain/manufacturing/process-methods';
import { materialFamilyLabels, type MaterialFamily } from '@shared/domain/materials/specification';
import { methodValidationInputSchema, type ProcessMethodView } from '@shared/schemas/process-methods';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { currentSpecifications } from '../materials/specification-library.repository';
import { insertMethodValidation, standingMethodValidations } from './method-validations.repository';

export async function listProcessMethods(manager: EntityManager): Promise<ProcessMethodView[]> {
  const validations = await standingMethodValidations(manager);
  return processMethods.map((method) => ({
    ...method,
    firmValidations: validations.filter((validation) => validation.methodId === method.id),
  }));
}

/**
 * Checks methods against the materials of parts, with the specification library and the firm's
 * standing validations read once (a run checks every lot it holds, a part every step it names).
 */
export async function methodScopeChecker(
  manager: EntityManager,
): Promise<(method: ProcessMethod, specIds: readonly string[], subject: string) => string | null> {
  const [library, validations] = await Promise.all([
    currentSpecifications(manager),
    standingMethodValidations(manager),
  ]);
  return (method, specIds, subject) => {
    const families = specIds.map(
      (specId) => library.find((specification) => specification.id.toUpperCase() === specId.toUpperCase())?.family,
    );
    const known = [...new Set(families.filter((family): family is MaterialFamily => Boolean(family)))];
    const outside = familiesOutsideScope(method, known, validations);
    return outside.length ? outsideScopeMessage(method, outside, subject) : null;
  };
}

/**
 * Records that the firm has validated a method for a material its published scope does not cover
 * (or withdraws that validation). QA approvers only; every change is an audit-trail event.
 */
export async function recordMethodValidation(
  dataSource: DataSource,
  methodId: string,
  input: z.output<typeof methodValidationInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<ProcessMethodView> {
  const method = processMethod(methodId);
  if (!method) throw AppError.notFound('Process method');
  const family = input.materialFamily;
  if (method.materialScope.families.includes(family)) {
    throw AppError.rule(`${method.id}'s own scope already covers ${materialFamilyLabels[family].toLowerCase()}`, {
      materialFamily: 'Already in the method’s scope',
    });
  }
  return inTransaction(dataSource, async (manager) => {
    const standing = (await standingMethodValidations(manager)).some(
      (validation) => validation.methodId === method.id && validation.family === family,
    );
    if (input.stands && standing)
      throw new AppError(
        'CONFLICT',
        `The firm's validation of ${method.id} for ${materialFamilyLabels[family].toLowerCase()} is recorded already`,
        { materialFamily: 'Already validated' },
      );
    if (!input.stands && !standing)
      throw AppError.rule(`No validation of ${method.id} for ${materialFamilyLabels[family].toLowerCase()} stands`, {
        materialFamily: 'Nothing to withdraw',
      });
    const id = await insertMethodValidation(manager, {
      methodId: method.id,
      family,
      stands: input.stands,
      reference: input.reference,
      reason: input.reason,
      recordedBy: person.id,
    });
    await appendLedgerEvent(manager, {
      actor,
      action: input.stands ? 'process-method.validation-recorded' : 'process-method.validation-withdrawn',
      entity: { type: 'process-method-validation', id },
      after: { method: method.id, material: family, reference: input.reference },
      reason: input.reason,
      origin,
    });
    return (await listProcessMethods(manager)).find((view) => view.id === method.id)!;
  });
}
