import type { z } from 'zod';
import type { DataSource, EntityManager } from 'typeorm';
import { DecimalE29 } from '@shared/domain/materials/e29-rounding';
import { lotNumberParts, formatLotNumber } from '@shared/domain/manufacturing/lot-number';
import { lotNumberProblem } from '@shared/domain/gs1/gtin';
import {
  lotOpenSchema,
  materialMovementSchema,
  type LotListQuery,
  type LotSummary,
} from '@shared/schemas/manufacturing';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { materialHolds } from './material-holds.repository';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { findPiece, findPieceByTag } from '../materials/bar-stock.repository';
import { findHeat } from '../materials/heats.repository';
import { findPart, lockPart } from './parts.repository';
import { findLotRow, heatsByLot, insertLotRow, listLotRows, toLotSummary } from './lots.repository';
import { heatIdsIssuedTo, insertMovement, netLengthOut } from './material-movements.repository';
import { nextSequence } from './numbering.repository';
import { unitChains } from './lot-units';
import { heatMixingApproved } from './heat-mixing.record';
import { addHeatToLot } from './lot-heats.repository';

export async function listLots(dataSource: DataSource, query: LotListQuery) {
  const { rows, total } = await listLotRows(dataSource.manager, query);
  const ids = rows.map((row) => row.id);
  const [chains, heats] = await Promise.all([
    unitChains(dataSource.manager, ids, rows),
    heatsByLot(dataSource.manager, ids),
  ]);
  const items: LotSummary[] = rows.map((row) =>
    toLotSummary(
      row,
      chains.get(row.id)?.started === null ? null : (chains.get(row.id)?.onHand ?? null),
      heats.get(row.id) ?? [],
    ),
  );
  return { items, total, page: query.page, pageSize: query.pageSize };
}

/** Today's date, or the given day (for lots recorded after they were opened), not in the future. */
function openingDate(openedOn: string | undefined): Date {
  if (!openedOn) return new Date();
  const date = new Date(`${openedOn}T00:00:00Z`);
  if (Number.isNaN(date.getTime()) || date.toISOString().slice(0, 10) !== openedOn)
    throw new AppError('VALIDATION_FAILED', 'Not a calendar date', { openedOn: 'Not a calendar date' });
  if (date.getTime() > Date.now())
    throw new AppError('VALIDATION_FAILED', 'The opening date is in the future', { openedOn: 'Not in the future' });
  return date;
}

/** Opens a production lot with the next number from its part's pattern. */
export async function openLot(
  dataSource: DataSource,
  input: z.output<typeof lotOpenSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<LotSummary> {
  const openedAt = openingDate(input.openedOn);
  return inTransaction(dataSource, async (manager) => {
    await lockPart(manager, input.partId);
    const part = await findPart(manager, input.partId);
    if (!part) throw AppError.rule('Choose a registered part', { partId: 'Unknown part' });
    const id = await insertLot(manager, {
      partId: part.id,
      partNumber: part.partNumber,
      pattern: part.lotPattern,
      plannedQty: input.plannedQty,
      openedAt,
      origin: 'bar',
      startQty: null,
      resumesAfterStep: 0,
      openedBy: person.id,
    });
    const row = (await findLotRow(manager, id))!;
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.opened',
      entity: { type: 'lot', id },
      after: {
        lotNumber: row.lot_number,
        part: `${part.partNumber} rev ${part.revision}`,
        plannedQty: input.plannedQty,
      },
      origin,
    });
    return toLotSummary(row, null, []);
  });
}

export async function insertLot(
  manager: EntityManager,
  lot: {
    partId: number;
    partNumber: string;
    pattern: string;
    plannedQty: number;
    openedAt: Date;
    origin: 'bar' | 'split' | 'merge';
    startQty: number | null;
    resumesAfterStep: number;
    openedBy: number;
    lotNumber?: string;
  },
): Promise<number> {
  let lotNumber = lot.lotNumber;
  if (!lotNumber) {
    const context = { partNumber: lot.partNumber, openedOn: lot.openedAt };
    const { prefix, suffix } = lotNumberParts(lot.pattern, context);
    lotNumber = formatLotNumber(lot.pattern, context, await nextSequence(manager, 'production_lot', prefix, suffix));
  }
  const problem = lotNumberProblem(lotNumber);
  if (problem) throw AppError.rule(`Lot number ${lotNumber} cannot be used: ${problem}`, { lotNumber: problem });
  return insertLotRow(manager, {
    lotNumber,
    partId: lot.partId,
    plannedQty: lot.plannedQty,
    startQty: lot.startQty,
    origin: lot.origin,
    resumesAfterStep: lot.resumesAfterStep,
    openedBy: lot.openedBy,
    openedAt: lot.openedAt,
  });
}

async function openLotForWork(manager: EntityManager, lotId: number) {
  const lot = await findLotRow(manager, lotId, true);
  if (!lot) throw AppError.notFound('Lot');
  if (lot.status !== 'open')
    throw AppError.rule(`Lot ${lot.lot_number} is ${lot.status}; its record can no longer change`, { lot: lot.status });
  return lot;
}

/**
 * Issues bar to a lot. The piece must be in stock with enough length left, its heat accepted and
 * bought to a specification the part allows; a second heat in one lot needs a QA approver's
 * signature first.
 */
export async function issueMaterial(
  dataSource: DataSource,
  lotId: number,
  input: z.output<typeof materialMovementSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  return inTransaction(dataSource, async (manager) => {
    const lot = await openLotForWork(manager, lotId);
    if (lot.origin !== 'bar')
      throw AppError.rule(`Lot ${lot.lot_number} came from a ${lot.origin}; its material is its parents'`, {
        tag: 'No bar issue to this lot',
      });
    const found = await findPieceByTag(manager, input.tag);
    if (!found) throw AppError.rule(`No bar piece has tag ${input.tag}`, { tag: 'Unknown tag' });
    await findPiece(manager, found.id, true);
    const piece = (await findPieceByTag(manager, input.tag))!;
    const heat = (await findHeat(manager, piece.heat.id))!;
    if (piece.status !== 'in-stock')
      throw AppError.rule(`Piece ${piece.tag} was cut; issue one of its pieces (${piece.childTags.join(', ')})`, {
        tag: 'Cut piece',
      });
    if (heat.status !== 'accepted')
      throw AppError.rule(`Heat ${heat.heatNumber} is ${heat.status}, not accepted; its bar cannot be issued`, {
        tag: `Heat ${heat.status}`,
      });
    const holds = await materialHolds(manager, { heatId: heat.id, pieceId: piece.id, supplierId: heat.supplier.id });
    if (holds.length)
      throw AppError.rule(
        `Bar ${piece.tag} of heat ${heat.heatNumber} is held: ${holds.join('; ')}. It cannot be issued until ` +
          `that is closed`,
        { tag: 'Material on hold' },
      );
    const part = (await findPart(manager, lot.part_id))!;
    const allowed = part.specifications.some(
      (spec) => spec.specId === heat.spec.id && (spec.grade === null || spec.grade === heat.spec.grade),
    );
    if (!allowed) {
      const wanted = part.specifications
        .map((spec) => `${spec.specId}${spec.grade ? ` grade ${spec.grade}` : ''}`)
        .join(' or ');
      throw AppError.rule(
        `Heat ${heat.heatNumber} is ${heat.spec.id}${heat.spec.grade ? ` grade ${heat.spec.grade}` : ''}; ` +
          `part ${part.partNumber} must be made from ${wanted}`,
        { tag: 'Wrong material for this part' },
      );
    }
    if (new DecimalE29(input.lengthMm).greaterThan(piece.remainingMm)) {
      throw AppError.rule(
        `Piece ${piece.tag} has ${piece.remainingMm} mm left; ${input.lengthMm} mm cannot be issued`,
        { lengthMm: `At most ${piece.remainingMm} mm` },
      );
    }
    const heats = await heatIdsIssuedTo(manager, lotId);
    if (heats.length && !heats.includes(heat.id)) {
      if (!(await heatMixingApproved(manager, lotId, heat.id))) {
        throw AppError.rule(
          `Lot ${lot.lot_number} is made from another heat; mixing in heat ${heat.heatNumber} needs a QA ` +
            `approver’s signature first`,
          { tag: 'Heat mixing not approved' },
        );
      }
    }
    await insertMovement(manager, {
      lotId,
      barPieceId: piece.id,
      kind: 'issue',
      lengthMm: input.lengthMm,
      recordedBy: person.id,
    });
    await addHeatToLot(manager, lotId, heat.id);
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.material-issued',
      entity: { type: 'lot', id: lotId },
      after: {
        tag: piece.tag,
        heat: heat.heatNumber,
        lengthMm: input.lengthMm,
        remainingMm: new DecimalE29(piece.remainingMm).minus(input.lengthMm).toFixed(2),
      },
      origin,
    });
    return { tag: piece.tag, heatNumber: heat.heatNumber, lengthMm: input.lengthMm };
  });
}

/** Returns an unused remnant of a piece issued to the lot back to stores. */
export async function returnMaterial(
  dataSource: DataSource,
  lotId: number,
  input: z.output<typeof materialMovementSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  return inTransaction(dataSource, async (manager) => {
    const lot = await openLotForWork(manager, lotId);
    const piece = await findPieceByTag(manager, input.tag);
    if (!piece) throw AppError.rule(`No bar piece has tag ${input.tag}`, { tag: 'Unknown tag' });
    const outstanding = new DecimalE29(await netLengthOut(manager, lotId, piece.id, true));
    if (outstanding.lessThanOrEqualTo(0))
      throw AppError.rule(`Piece ${piece.tag} was not issued to lot ${lot.lot_number}`, {
        tag: 'Not issued to this lot',
      });
    if (new DecimalE29(input.lengthMm).greaterThan(outstanding))
      throw AppError.rule(`Only ${outstanding.toFixed(2)} mm of ${piece.tag} is out on this lot`, {
        lengthMm: `At most ${outstanding.toFixed(2)} mm`,
      });
    await insertMovement(manager, {
      lotId,
      barPieceId: piece.id,
      kind: 'return',
      lengthMm: input.lengthMm,
      recordedBy: person.id,
    });
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.material-returned',
      entity: { type: 'lot', id: lotId },
      after: { tag: piece.tag, lengthMm: input.lengthMm },
      origin,
    });
    return { tag: piece.tag, lengthMm: input.lengthMm };
  });
}
