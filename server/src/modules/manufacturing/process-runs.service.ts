import type { z } from 'zod';
import type { DataSource } from 'typeorm';
import { processMethod } from '@shared/domain/manufacturing/process-methods';
import { checkRunWindow, type WindowCheck } from '@shared/domain/manufacturing/run-window';
import type { ProcessRunDetail, ProcessRunSummary } from '@shared/schemas/lot-detail';
import { processRunInputSchema, type ProcessRunListQuery } from '@shared/schemas/manufacturing';
import type { Person } from '@shared/schemas/people';
import type { Part } from '@shared/schemas/manufacturing';
import { methodScopeChecker } from './process-methods.service';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { findPart } from './parts.repository';
import { findLotRow, insertOperation, recordedStepNos } from './lots.repository';
import { findProcessRunRow, insertProcessRun, lotsInRun, processRunRows, type RunRow } from './process-runs.repository';
import { unitChains } from './lot-units';
import { insertNonconformance, nonconformancesWhere } from './nonconformances.repository';
import { nextSequence } from './numbering.repository';

function toSummary(row: RunRow): ProcessRunSummary {
  return {
    id: row.id,
    runNumber: row.run_number,
    kind: row.kind,
    methodId: row.method_id,
    methodTitle: processMethod(row.method_id)?.title ?? row.method_id,
    equipment: row.equipment,
    operatorName: row.operator_name,
    runAt: new Date(row.run_at).toISOString(),
    inWindow: Boolean(row.in_window),
    lots: Number(row.lots),
    recordedBy: row.recorded_by_name,
  };
}

export async function listProcessRuns(dataSource: DataSource, query: ProcessRunListQuery) {
  const { total, rows } = await processRunRows(dataSource.manager, query);
  return { items: rows.map(toSummary), total, page: query.page, pageSize: query.pageSize };
}

export async function processRunDetail(dataSource: DataSource, id: number): Promise<ProcessRunDetail> {
  const row = await findProcessRunRow(dataSource.manager, id);
  if (!row) throw AppError.notFound('Process run');
  const lots = await lotsInRun(dataSource.manager, id);
  return {
    ...toSummary(row),
    parameters: JSON.parse(row.parameters_json) as Record<string, string>,
    windowCheck: JSON.parse(row.window_check_json) as WindowCheck,
    lotsInRun: lots.map((lot) => ({
      lotId: lot.lot_id,
      lotNumber: lot.lot_number,
      partNumber: lot.part_number,
      qty: lot.qty_in,
    })),
    nonconformances: await nonconformancesWhere(dataSource.manager, 'n.process_run_id = ?', [id]),
  };
}

/**
 * Records a passivation or cleaning run with the lots it held. Each lot's next routing step must
 * be of the run's kind (and method, when the routing names one); the step is recorded for every
 * lot with the units it holds. A run outside its method's window raises a nonconformance on every
 * lot in it, in the same transaction.
 */
export async function recordProcessRun(
  dataSource: DataSource,
  input: z.output<typeof processRunInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<ProcessRunDetail> {
  const method = processMethod(input.methodId);
  if (!method) throw AppError.rule(`Unknown process method ${input.methodId}`, { methodId: 'Not a known method' });
  if (method.kind !== input.kind)
    throw AppError.rule(`${method.id} is a ${method.kind} method`, { methodId: `Choose a ${input.kind} method` });
  const missing = checkRunWindow(method, input.parameters).missing;
  if (missing.length) {
    const fields = Object.fromEntries(
      missing.map((key) => [
        `parameters.${key}`,
        `Record the ${method.parameters.find((parameter) => parameter.key === key)?.label.toLowerCase() ?? key}`,
      ]),
    );
    throw new AppError('VALIDATION_FAILED', 'Some of the method’s parameters are missing', fields);
  }
  const unknown = Object.keys(input.parameters).filter(
    (key) => !method.parameters.some((parameter) => parameter.key === key),
  );
  if (unknown.length)
    throw new AppError(
      'VALIDATION_FAILED',
      `${method.id} records no ${unknown.join(', ')}`,
      Object.fromEntries(unknown.map((key) => [`parameters.${key}`, 'Not a parameter of this method'])),
    );
  if (new Set(input.lotIds).size !== input.lotIds.length)
    throw new AppError('VALIDATION_FAILED', 'A lot is named twice', { lotIds: 'Name each lot once' });
  const runAt = new Date(input.runAt);
  if (runAt.getTime() > Date.now() + 5 * 60_000)
    throw new AppError('VALIDATION_FAILED', 'The run is in the future', { runAt: 'Not in the future' });

  const id = await inTransaction(dataSource, async (manager) => {
    // Every lot is checked before anything is written: its due step, its material against the
    // method's scope, and where its device touches the body (which sets the run's endotoxin limit).
    const due: Array<{ lotId: number; lotNumber: string; stepId: number; onHand: number }> = [];
    const categories = new Set<Part['contactCategory']>();
    const scopeProblem = await methodScopeChecker(manager);
    for (const lotId of input.lotIds) {
      const lot = await findLotRow(manager, lotId, true);
      if (!lot) throw AppError.rule(`Lot ${lotId} does not exist`, { lotIds: 'Unknown lot' });
      if (lot.status !== 'open')
        throw AppError.rule(`Lot ${lot.lot_number} is ${lot.status}`, { lotIds: `${lot.lot_number} is ${lot.status}` });
      const part = (await findPart(manager, lot.part_id))!;
      const done = new Set(await recordedStepNos(manager, lotId));
      const next = part.routing.find((step) => step.stepNo > lot.resumes_after_step && !done.has(step.stepNo));
      if (!next || next.kind !== input.kind) {
        throw AppError.rule(
          `Lot ${lot.lot_number} is not due for ${input.kind}: its next step is ` +
            `${next ? `${next.stepNo} ${next.name}` : 'none (routing complete)'}`,
          { lotIds: `${lot.lot_number} not due` },
        );
      }
      if (next.processMethod && next.processMethod !== method.id) {
        throw AppError.rule(`Lot ${lot.lot_number}'s routing calls for ${next.processMethod}, not ${method.id}`, {
          lotIds: `${lot.lot_number} needs ${next.processMethod}`,
        });
      }
      const outOfScope = scopeProblem(
        method,
        part.specifications.map((allowed) => allowed.specId),
        `Lot ${lot.lot_number}`,
      );
      if (outOfScope) throw AppError.rule(outOfScope, { lotIds: `${lot.lot_number} is outside ${method.id}'s scope` });
      const chain = (await unitChains(manager, [lotId])).get(lotId)!;
      if (chain.onHand < 1)
        throw AppError.rule(`Lot ${lot.lot_number} holds no units`, { lotIds: `${lot.lot_number} is empty` });
      categories.add(part.contactCategory);
      due.push({ lotId, lotNumber: lot.lot_number, stepId: next.id, onHand: chain.onHand });
    }
    const check = checkRunWindow(method, input.parameters, [...categories]);

    const prefix = `${input.kind === 'passivation' ? 'PV' : 'CL'}-${runAt.getUTCFullYear()}-`;
    const runNumber = `${prefix}${String(await nextSequence(manager, 'process_run', prefix)).padStart(4, '0')}`;
    const runId = await insertProcessRun(manager, {
      runNumber,
      kind: input.kind,
      methodId: method.id,
      equipment: input.equipment,
      parametersJson: JSON.stringify(input.parameters),
      windowCheckJson: JSON.stringify(check),
      inWindow: check.inWindow,
      operatorName: input.operatorName,
      runAt,
      recordedBy: person.id,
    });
    for (const lot of due) {
      await insertOperation(manager, {
        lotId: lot.lotId,
        routingStepId: lot.stepId,
        operatorName: input.operatorName,
        workCentre: input.equipment,
        programRevision: null,
        startedAt: runAt,
        endedAt: runAt,
        qtyIn: lot.onHand,
        qtyGood: lot.onHand,
        qtyScrap: 0,
        scrapReasons: '[]',
        sampleSize: null,
        defectsFound: null,
        verdict: null,
        processRunId: runId,
        notes: null,
        recordedBy: person.id,
      });
      if (!check.inWindow) {
        const outside = check.items
          .filter((item) => item.verdict === 'out-of-window')
          .map((item) => `${item.label}: ${item.why}`);
        const nc = await insertNonconformance(manager, {
          subjectType: 'lot',
          subjectId: lot.lotId,
          lotId: lot.lotId,
          runId,
          source: 'run-window',
          description:
            `${input.kind === 'passivation' ? 'Passivation' : 'Cleaning'} run ${runNumber} (${method.id}) ran ` +
            `outside its window — ${outside.join('; ')}`,
          containment: 'Raised automatically when the run was recorded; the lot cannot be released while this is open',
          raisedBy: person.id,
          raisedAt: runAt,
        });
        await appendLedgerEvent(manager, {
          actor,
          action: 'nonconformance.raised',
          entity: { type: 'nonconformance', id: nc.id },
          after: { ncNumber: nc.ncNumber, lot: lot.lotNumber, run: runNumber, cause: 'run outside its window' },
          origin,
        });
      }
    }
    const lotNumbers = due.map((lot) => lot.lotNumber);
    await appendLedgerEvent(manager, {
      actor,
      action: 'process-run.recorded',
      entity: { type: 'process-run', id: runId },
      after: { runNumber, method: method.id, parameters: input.parameters, inWindow: check.inWindow, lots: lotNumbers },
      origin,
    });
    return runId;
  });
  return processRunDetail(dataSource, id);
}
