import type { z } from 'zod';
import type { DataSource, EntityManager } from 'typeorm';
import { inspectionVerdict } from '@shared/domain/manufacturing/inspection';
import { operationInputSchema } from '@shared/schemas/manufacturing';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { findPart } from './parts.repository';
import { findLotRow, insertOperation, recordedStepNos, setStartQty, type LotRow } from './lots.repository';
import { netLengthOut } from './material-movements.repository';
import { unitChains } from './lot-units';
import { insertNonconformance } from './nonconformances.repository';

/**
 * Checks that a step may be recorded now for the lot: it is on the part's routing, not yet
 * recorded, every earlier step is recorded, and the units entering it are exactly the units the
 * lot holds. Returns the routing step.
 */
export async function stepReadyFor(manager: EntityManager, lot: LotRow, stepNo: number, qtyIn: number) {
  const part = (await findPart(manager, lot.part_id))!;
  const step = part.routing.find((candidate) => candidate.stepNo === stepNo);
  if (!step)
    throw AppError.rule(`Step ${stepNo} is not on the routing of ${part.partNumber} rev ${part.revision}`, {
      stepNo: 'Not on the routing',
    });
  if (stepNo <= lot.resumes_after_step)
    throw AppError.rule(
      `Lot ${lot.lot_number} began after step ${lot.resumes_after_step}; step ${stepNo} belongs to its parent lot`,
      { stepNo: 'Recorded on the parent lot' },
    );
  const done = new Set(await recordedStepNos(manager, lot.id));
  if (done.has(stepNo))
    throw new AppError('CONFLICT', `Step ${stepNo} ${step.name} is already recorded for lot ${lot.lot_number}`, {
      stepNo: 'Already recorded',
    });
  const missing = part.routing.find(
    (candidate) =>
      candidate.stepNo > lot.resumes_after_step && candidate.stepNo < stepNo && !done.has(candidate.stepNo),
  );
  if (missing)
    throw AppError.rule(`Record step ${missing.stepNo} ${missing.name} first; the routing runs in order`, {
      stepNo: `Step ${missing.stepNo} comes first`,
    });
  const chain = (await unitChains(manager, [lot.id])).get(lot.id)!;
  const starting = lot.origin === 'bar' && done.size === 0;
  if (starting) {
    if (Number(await netLengthOut(manager, lot.id)) <= 0)
      throw AppError.rule(`Issue bar to lot ${lot.lot_number} before recording its first operation`, {
        stepNo: 'No material issued',
      });
  } else if (qtyIn !== chain.onHand) {
    throw AppError.rule(
      `Lot ${lot.lot_number} holds ${chain.onHand} units after its last step; ${qtyIn} cannot enter step ${stepNo}`,
      { qtyIn: `Expected ${chain.onHand}` },
    );
  }
  return { step, part, starting };
}

export async function recordOperation(
  dataSource: DataSource,
  lotId: number,
  input: z.output<typeof operationInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  return inTransaction(dataSource, async (manager) => {
    const lot = await findLotRow(manager, lotId, true);
    if (!lot) throw AppError.notFound('Lot');
    if (lot.status !== 'open')
      throw AppError.rule(`Lot ${lot.lot_number} is ${lot.status}; its record can no longer change`, {
        lot: lot.status,
      });
    const { step, starting } = await stepReadyFor(manager, lot, input.stepNo, input.qtyIn);
    if (step.kind === 'passivation' || step.kind === 'cleaning')
      throw AppError.rule(`Step ${step.stepNo} ${step.name} is recorded through a ${step.kind} run`, {
        stepNo: `Record a ${step.kind} run`,
      });
    let verdict: { verdict: 'accept' | 'reject'; why: string } | null = null;
    if (step.kind === 'inspection') {
      if (input.inspected === null || input.defectsFound === null)
        throw new AppError('VALIDATION_FAILED', 'An inspection records the units inspected and the defects found', {
          inspected: 'Required for an inspection',
        });
      const required = Math.min(step.sampleSize!, input.qtyIn);
      if (input.inspected < required)
        throw new AppError('VALIDATION_FAILED', `The plan needs ${required} units inspected`, {
          inspected: `At least ${required}`,
        });
      if (input.defectsFound > input.inspected)
        throw new AppError('VALIDATION_FAILED', 'More defects than units inspected', {
          defectsFound: `At most ${input.inspected}`,
        });
      verdict = inspectionVerdict(
        { sampleSize: step.sampleSize!, acceptNumber: step.acceptNumber!, rejectNumber: step.rejectNumber! },
        input.qtyIn,
        input.inspected,
        input.defectsFound,
      );
    }
    const id = await insertOperation(manager, {
      lotId,
      routingStepId: step.id,
      operatorName: input.operatorName,
      workCentre: input.workCentre,
      programRevision: input.programRevision,
      startedAt: new Date(input.startedAt),
      endedAt: new Date(input.endedAt),
      qtyIn: input.qtyIn,
      qtyGood: input.qtyGood,
      qtyScrap: input.qtyScrap,
      scrapReasons: JSON.stringify(input.scrapReasons),
      sampleSize: input.inspected,
      defectsFound: input.defectsFound,
      verdict: verdict?.verdict ?? null,
      notes: input.notes,
      recordedBy: person.id,
    });
    if (starting) await setStartQty(manager, lotId, input.qtyIn);
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.operation-recorded',
      entity: { type: 'lot', id: lotId },
      after: { operationId: id, step: `${step.stepNo} ${step.name}`, ...input, verdict: verdict?.verdict ?? null },
      origin,
    });
    if (verdict?.verdict === 'reject') {
      const nc = await insertNonconformance(manager, {
        subjectType: 'lot',
        subjectId: lotId,
        lotId,
        runId: null,
        source: 'raised',
        description: `Inspection step ${step.stepNo} ${step.name} rejected the lot: ${verdict.why}`,
        containment: 'Lot held at inspection pending disposition',
        raisedBy: person.id,
      });
      await appendLedgerEvent(manager, {
        actor,
        action: 'nonconformance.raised',
        entity: { type: 'nonconformance', id: nc.id },
        after: { ncNumber: nc.ncNumber, lot: lot.lot_number, cause: 'inspection rejected' },
        origin,
      });
    }
    return { id, verdict: verdict?.verdict ?? null, why: verdict?.why ?? null };
  });
}
