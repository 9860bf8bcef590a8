import type { z } from 'zod';
import type { DataSource, EntityManager } from 'typeorm';
import { evaluateAgainst, EvaluationInputError } from '@shared/domain/materials/evaluate-certificate';
import { readChemistryValue, readMechanicalValue, ReportedValueError } from '@shared/domain/materials/reported-value';
import { certificateInputSchema } from '@shared/schemas/evaluation';
import { scopeOf } from '@shared/domain/materials/specification';
import type { HeatDetail, HeatListQuery, HeatSummary } from '@shared/schemas/materials';
import { heatCreateSchema, heatResultsSchema } from '@shared/schemas/materials';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { currentSpecifications, storedSpecification } from './specification-library.repository';
import * as heats from './heats.repository';
import { findSupplier } from './suppliers.repository';
import { inspectCertificateFile } from './certificate-files';
import { screeningOfHeat } from './certificate-screening.service';
import { checkAnalysisOfHeat } from './check-analysis.service';
import { currentJustification } from './heat-evaluation.record';

export async function listHeats(dataSource: DataSource, query: HeatListQuery) {
  const { items, total } = await heats.listHeats(dataSource.manager, query);
  return { items, total, page: query.page, pageSize: query.pageSize };
}

export async function heatDetail(dataSource: DataSource, id: number): Promise<HeatDetail> {
  const manager = dataSource.manager;
  const heat = await heats.findHeat(manager, id);
  if (!heat) throw AppError.notFound('Heat');
  const { receivedById: _receivedBy, ...summary } = heat;
  const certificates = await heats.heatCertificates(manager, id);
  const sameDocumentOn = new Set<string>();
  for (const certificate of certificates)
    for (const heatNumber of await heats.otherHeatsWithDocument(manager, id, certificate.id))
      sameDocumentOn.add(heatNumber);
  return {
    ...summary,
    results: await heats.heatResults(manager, id),
    evaluation: (await heats.latestEvaluation(manager, id))?.evaluation ?? null,
    justification: await currentJustification(manager, id),
    certificates,
    crossChecks: {
      identicalResultsOn: await heats.heatsWithIdenticalResults(manager, id),
      sameDocumentOn: [...sameDocumentOn].sort(),
    },
    screening: await screeningOfHeat(manager, id),
    checkAnalysis: await checkAnalysisOfHeat(manager, id),
  };
}

export async function receiveHeat(
  dataSource: DataSource,
  input: z.output<typeof heatCreateSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<HeatSummary> {
  return inTransaction(dataSource, async (manager) => {
    const supplier = await findSupplier(manager, input.supplierId);
    if (!supplier) throw AppError.rule('Choose a registered supplier', { supplierId: 'Unknown supplier' });
    const specification = (await currentSpecifications(manager)).find(
      (candidate) => candidate.id.toUpperCase() === input.specId.toUpperCase(),
    );
    if (!specification)
      throw AppError.rule(`Unknown specification ${input.specId}`, { specId: 'Not in the specification library' });
    const grades = specification.grades.map((grade) => grade.grade);
    const grade = specification.grades.length === 1 ? specification.grades[0]!.grade : input.grade;
    if (!grades.includes(grade))
      throw AppError.rule(`${specification.id} needs a grade: one of ${grades.join(', ')}`, {
        grade: `One of ${grades.join(', ')}`,
      });
    const scope = scopeOf(specification);
    if (!scope.forms.includes(input.productForm)) {
      throw AppError.rule(
        `${specification.id} ${specification.revision} covers ${scope.forms.join(', ')}, not ${input.productForm}`,
        { productForm: `One of ${scope.forms.join(', ')}` },
      );
    }
    if (!scope.conditions.includes(input.condition)) {
      throw AppError.rule(
        `${specification.id} ${specification.revision} covers the conditions ${scope.conditions.join(', ')}, ` +
          `not ${input.condition}`,
        { condition: `One of ${scope.conditions.join(', ')}` },
      );
    }
    if (await heats.heatOf(manager, supplier.id, input.heatNumber))
      throw new AppError('CONFLICT', `Heat ${input.heatNumber} from ${supplier.name} is already received`, {
        heatNumber: 'Already received',
      });
    const id = await heats.insertHeat(manager, {
      ...input,
      specId: specification.id,
      specRevision: specification.revision,
      grade,
      receivedBy: person.id,
    });
    const heat = (await heats.findHeat(manager, id))!;
    const { receivedById: _receivedBy, ...summary } = heat;
    await appendLedgerEvent(manager, {
      actor,
      action: 'heat.received',
      entity: { type: 'heat', id },
      after: summary,
      origin,
    });
    return summary;
  });
}

/** Stores the reported results, evaluates them against the heat's specification revision and keeps the evaluation. */
export async function recordResults(
  dataSource: DataSource,
  heatId: number,
  input: z.output<typeof heatResultsSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<HeatDetail> {
  await inTransaction(dataSource, (manager) => recordResultsIn(manager, heatId, input, person, actor, origin));
  return heatDetail(dataSource, heatId);
}

/** The same, inside the caller's transaction (an import writes many heats in one). */
export async function recordResultsIn(
  manager: EntityManager,
  heatId: number,
  input: z.output<typeof heatResultsSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<string> {
  const heat = await heats.findHeat(manager, heatId, true);
  if (!heat) throw AppError.notFound('Heat');
  if (heat.status === 'accepted' || heat.status === 'rejected')
    throw AppError.rule(`The heat is ${heat.status}; its results can no longer change`, {
      results: 'Dispositioned heat',
    });
  const rows: Array<{ kind: 'chemistry' | 'mechanical'; item: string; asReported: string; value: string }> = [];
  const fields: Record<string, string> = {};
  for (const [element, value] of Object.entries(input.chemistry)) {
    try {
      rows.push({
        kind: 'chemistry',
        item: element,
        asReported: String(value).trim(),
        value: readChemistryValue(value).value,
      });
    } catch (error) {
      if (error instanceof ReportedValueError) fields[`chemistry.${element}`] = error.message;
      else throw error;
    }
  }
  for (const [property, value] of Object.entries(input.mechanical)) {
    if (value === undefined) continue;
    try {
      rows.push({
        kind: 'mechanical',
        item: property,
        asReported: String(value).trim(),
        value: readMechanicalValue(value),
      });
    } catch (error) {
      if (error instanceof ReportedValueError) fields[`mechanical.${property}`] = error.message;
      else throw error;
    }
  }
  if (Object.keys(fields).length) throw new AppError('VALIDATION_FAILED', 'Some results are not numbers', fields);
  const specification = await storedSpecification(manager, heat.spec.id, heat.spec.revision);
  if (!specification) throw new Error(`specification ${heat.spec.id} ${heat.spec.revision} is missing`);
  let evaluation;
  try {
    evaluation = evaluateAgainst(
      specification,
      certificateInputSchema.parse({
        spec: heat.spec.id,
        grade: heat.spec.grade,
        form: heat.productForm,
        condition: heat.condition,
        sizeMm: heat.sizeMm,
        chemistry: input.chemistry,
        mechanical: input.mechanical,
      }),
    );
  } catch (error) {
    if (error instanceof EvaluationInputError) throw new AppError('VALIDATION_FAILED', error.message, error.fields);
    throw error;
  }
  const before = await heats.heatResults(manager, heatId);
  await heats.replaceHeatResults(manager, heatId, rows);
  await heats.insertEvaluation(manager, {
    heatId,
    specId: heat.spec.id,
    revision: heat.spec.revision,
    verdict: evaluation.verdict,
    json: JSON.stringify(evaluation),
    evaluatedBy: person.id,
  });
  const after = await heats.heatResults(manager, heatId);
  await appendLedgerEvent(manager, {
    actor,
    action: 'heat.results-recorded',
    entity: { type: 'heat', id: heatId },
    before,
    after: { ...after, verdict: evaluation.verdict },
    reason: input.reason ?? null,
    origin,
  });
  return evaluation.verdict;
}

export async function attachCertificate(
  dataSource: DataSource,
  heatId: number,
  file: { bytes: Buffer; originalName: string },
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  const inspected = await inspectCertificateFile(file.bytes, file.originalName);
  return inTransaction(dataSource, async (manager) => {
    const heat = await heats.findHeat(manager, heatId, true);
    if (!heat) throw AppError.notFound('Heat');
    const document = await heats.storeDocument(manager, {
      sha256: inspected.sha256,
      mediaType: inspected.mediaType,
      bytes: file.bytes,
      originalName: inspected.name,
      uploadedBy: person.id,
    });
    const attached = await heats.attachDocument(manager, heatId, document.id, person.id);
    if (!attached)
      throw new AppError('CONFLICT', 'This certificate is already attached to the heat', {
        certificate: 'Already attached',
      });
    const sharedWith = await heats.otherHeatsWithDocument(manager, heatId, document.id);
    await appendLedgerEvent(manager, {
      actor,
      action: 'heat.certificate-attached',
      entity: { type: 'heat', id: heatId },
      after: {
        documentId: document.id,
        sha256: inspected.sha256,
        mediaType: inspected.mediaType,
        name: inspected.name,
        storedNow: document.created,
        alsoOnHeats: sharedWith,
      },
      origin,
    });
    return { documentId: document.id, sha256: inspected.sha256, storedNow: document.created, alsoOnHeats: sharedWith };
  });
}

export async function certificateFile(dataSource: DataSource, heatId: number, documentId: number) {
  const document = await heats.documentOfHeat(dataSource.manager, heatId, documentId);
  if (!document) throw AppError.notFound('Certificate');
  return document;
}
