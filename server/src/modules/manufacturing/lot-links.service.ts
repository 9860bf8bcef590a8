import type { z } from 'zod';
import type { DataSource } from 'typeorm';
import { refuseIfHeld } from '../recall/lot-holds';
import { mergeProblem, splitProblem } from '@shared/domain/manufacturing/unit-chain';
import { lotNumberProblem } from '@shared/domain/gs1/gtin';
import { mergeInputSchema, splitInputSchema } from '@shared/schemas/manufacturing';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { findPart } from './parts.repository';
import { findLotIdByNumber, findLotRow, insertLotLink, lastStepOf } from './lots.repository';
import { changeLotStatus } from './production-lot.repository';
import { unitChains } from './lot-units';
import { insertLot } from './lots.service';
import { inheritHeats } from './lot-heats.repository';

/** Child lot numbers: the parent's number with -A, -B, … (a lot number stays within GS1's 20 characters). */
async function childLotNumber(manager: import('typeorm').EntityManager, parentNumber: string): Promise<string> {
  for (let index = 0; index < 26 * 27; index++) {
    const letters =
      index < 26
        ? String.fromCharCode(65 + index)
        : `${String.fromCharCode(64 + Math.floor(index / 26))}${String.fromCharCode(65 + (index % 26))}`;
    const candidate = `${parentNumber}-${letters}`;
    if ((await findLotIdByNumber(manager, candidate)) === null) {
      const problem = lotNumberProblem(candidate);
      if (problem)
        throw AppError.rule(
          `Lot ${parentNumber} cannot be split: ${candidate} would be too long for a GS1 lot number`,
          { quantities: problem },
        );
      return candidate;
    }
  }
  throw AppError.rule(`Lot ${parentNumber} has too many split lots`);
}

/** Splits units off a lot into new lots after its last recorded step; the children resume the routing there. */
export async function splitLot(
  dataSource: DataSource,
  lotId: number,
  input: z.output<typeof splitInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  return inTransaction(dataSource, async (manager) => {
    const lot = await findLotRow(manager, lotId, true);
    if (!lot) throw AppError.notFound('Lot');
    if (lot.status !== 'open')
      throw AppError.rule(`Lot ${lot.lot_number} is ${lot.status}; it cannot be split`, { quantities: lot.status });
    // Units split off a held lot would leave the hold behind.
    await refuseIfHeld(manager, [lotId], 'split', 'quantities');
    const chain = (await unitChains(manager, [lotId])).get(lotId)!;
    if (chain.started === null)
      throw AppError.rule(
        `Lot ${lot.lot_number} has not started; change its planned quantity instead of splitting it`,
        { quantities: 'Not started' },
      );
    const problem = splitProblem(chain.onHand, input.quantities);
    if (problem) throw AppError.rule(problem, { quantities: problem });
    const afterStep = await lastStepOf(manager, lotId);
    const part = (await findPart(manager, lot.part_id))!;
    const children: Array<{ id: number; lotNumber: string; qty: number }> = [];
    for (const qty of input.quantities) {
      const lotNumber = await childLotNumber(manager, lot.lot_number);
      const id = await insertLot(manager, {
        partId: part.id,
        partNumber: part.partNumber,
        pattern: part.lotPattern,
        plannedQty: qty,
        openedAt: new Date(),
        origin: 'split',
        startQty: qty,
        resumesAfterStep: afterStep,
        openedBy: person.id,
        lotNumber,
      });
      await insertLotLink(manager, {
        parentLotId: lotId,
        childLotId: id,
        kind: 'split',
        qty,
        afterStep,
        recordedBy: person.id,
      });
      await inheritHeats(manager, id, [lotId]);
      children.push({ id, lotNumber, qty });
    }
    const remaining = chain.onHand - input.quantities.reduce((sum, qty) => sum + qty, 0);
    if (remaining === 0) await changeLotStatus(manager, lotId, 'consume');
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.split',
      entity: { type: 'lot', id: lotId },
      before: { onHand: chain.onHand },
      after: { afterStep, children, remaining },
      reason: input.reason,
      origin,
    });
    return { children, remaining };
  });
}

/** Merges lots of one part that stand at the same routing step into a new lot holding all their units. */
export async function mergeLots(
  dataSource: DataSource,
  input: z.output<typeof mergeInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  return inTransaction(dataSource, async (manager) => {
    const ids = [...input.lotIds].sort((a, b) => a - b);
    const rows = [];
    for (const id of ids) {
      const row = await findLotRow(manager, id, true);
      if (!row) throw AppError.rule(`Lot ${id} does not exist`, { lotIds: 'Unknown lot' });
      rows.push(row);
    }
    await refuseIfHeld(manager, ids, 'merged', 'lotIds');
    const chains = await unitChains(manager, ids);
    const candidates = [];
    for (const row of rows) {
      const chain = chains.get(row.id)!;
      candidates.push({
        lotNumber: row.lot_number,
        partId: row.part_id,
        lastStep: await lastStepOf(manager, row.id),
        onHand: chain.onHand,
        blocked:
          row.status !== 'open'
            ? `it is ${row.status}`
            : chain.started === null
              ? 'it has not started'
              : Number(row.open_ncs) > 0
                ? 'it has an open nonconformance'
                : null,
      });
    }
    const problem = mergeProblem(candidates);
    if (problem) throw AppError.rule(problem, { lotIds: problem });
    const part = (await findPart(manager, rows[0]!.part_id))!;
    const total = candidates.reduce((sum, lot) => sum + lot.onHand, 0);
    const afterStep = candidates[0]!.lastStep;
    const id = await insertLot(manager, {
      partId: part.id,
      partNumber: part.partNumber,
      pattern: part.lotPattern,
      plannedQty: total,
      openedAt: new Date(),
      origin: 'merge',
      startQty: total,
      resumesAfterStep: afterStep,
      openedBy: person.id,
    });
    for (const [index, row] of rows.entries()) {
      await insertLotLink(manager, {
        parentLotId: row.id,
        childLotId: id,
        kind: 'merge',
        qty: candidates[index]!.onHand,
        afterStep,
        recordedBy: person.id,
      });
      await changeLotStatus(manager, row.id, 'consume');
    }
    await inheritHeats(manager, id, ids);
    const merged = (await findLotRow(manager, id))!;
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.merged',
      entity: { type: 'lot', id },
      after: {
        lotNumber: merged.lot_number,
        parents: candidates.map((lot) => ({ lot: lot.lotNumber, qty: lot.onHand })),
        afterStep,
        total,
      },
      reason: input.reason,
      origin,
    });
    return { id, lotNumber: merged.lot_number, qty: total };
  });
}
