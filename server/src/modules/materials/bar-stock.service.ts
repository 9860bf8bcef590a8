import type { z } from 'zod';
import type { DataSource } from 'typeorm';
import { checkCut } from '@shared/domain/materials/bar-cut';
import { DecimalE29 } from '@shared/domain/materials/e29-rounding';
import { compareHeatMarking } from '@shared/domain/materials/heat-marking';
import type { BarListQuery, BarPiece } from '@shared/schemas/materials';
import { barCutSchema, barReceiptSchema } from '@shared/schemas/materials';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import * as bars from './bar-stock.repository';
import { findHeat } from './heats.repository';

/** Child tags: the parent's tag with -A, -B, … (then -AA, -AB … past Z). */
export function childTag(parentTag: string, index: number): string {
  const letters =
    index < 26
      ? String.fromCharCode(65 + index)
      : `${String.fromCharCode(65 + Math.floor(index / 26) - 1)}${String.fromCharCode(65 + (index % 26))}`;
  return `${parentTag}-${letters}`;
}

export async function listBarPieces(dataSource: DataSource, query: BarListQuery) {
  const { items, total } = await bars.listPieces(dataSource.manager, query);
  return { items, total, page: query.page, pageSize: query.pageSize };
}

export async function barPiece(dataSource: DataSource, id: number): Promise<BarPiece> {
  const piece = await bars.findPiece(dataSource.manager, id);
  if (!piece) throw AppError.notFound('Bar piece');
  return piece;
}

export async function receiveBar(
  dataSource: DataSource,
  input: z.output<typeof barReceiptSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<BarPiece> {
  let mismatch: { heatId: number; heatNumber: string; problem: string } | null = null;
  try {
    return await inTransaction(dataSource, async (manager) => {
      mismatch = null;
      const heat = await findHeat(manager, input.heatId, true);
      if (!heat) throw AppError.rule('Choose a received heat', { heatId: 'Unknown heat' });
      if (heat.status === 'rejected')
        throw AppError.rule(`Heat ${heat.heatNumber} is rejected; its bar cannot be taken into stock`, {
          heatId: 'Rejected heat',
        });
      const marking = compareHeatMarking(input.markedHeatNumber, heat.heatNumber);
      if (!marking.matches) {
        mismatch = { heatId: heat.id, heatNumber: heat.heatNumber, problem: marking.problem! };
        throw AppError.rule(`${marking.problem}. The bar was not taken into stock; set it aside and ask QA.`, {
          markedHeatNumber: `Does not match heat ${heat.heatNumber}`,
        });
      }
      if (await bars.findPieceByTag(manager, input.tag))
        throw new AppError('CONFLICT', `Tag ${input.tag} is already in use`, { tag: 'Already in use' });
      const id = await bars.insertPiece(manager, { ...input, parentId: null, createdBy: person.id });
      const piece = (await bars.findPiece(manager, id))!;
      await appendLedgerEvent(manager, {
        actor,
        action: 'bar.received',
        entity: { type: 'bar-piece', id: piece.tag },
        after: piece,
        origin,
      });
      return piece;
    });
  } catch (error) {
    // A mismatch refuses the receipt, but is itself recorded: someone read a bar that does not
    // belong to the heat it was about to be booked against.
    const refused = mismatch as { heatId: number; heatNumber: string; problem: string } | null;
    if (refused) {
      await inTransaction(dataSource, (manager) =>
        appendLedgerEvent(manager, {
          actor,
          action: 'bar.heat-marking-mismatch',
          entity: { type: 'heat', id: refused.heatId },
          after: {
            tag: input.tag,
            markedHeatNumber: input.markedHeatNumber,
            heatNumber: refused.heatNumber,
            problem: refused.problem,
          },
          origin,
        }),
      );
    }
    throw error;
  }
}

/** Cuts a piece into child pieces; the children and the kerf must account for the whole piece. */
export async function cutBar(
  dataSource: DataSource,
  pieceId: number,
  input: z.output<typeof barCutSchema>,
  kerfAllowanceMm: string,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<BarPiece[]> {
  return inTransaction(dataSource, async (manager) => {
    const parent = await bars.findPiece(manager, pieceId, true);
    if (!parent) throw AppError.notFound('Bar piece');
    if (parent.status !== 'in-stock')
      throw AppError.rule(`Piece ${parent.tag} was already cut`, { pieces: 'Already cut' });
    const check = checkCut(
      parent.remainingMm,
      input.pieces.map((piece) => piece.lengthMm),
      kerfAllowanceMm,
    );
    if (!check.ok)
      throw AppError.rule(check.reason ?? 'The cut does not account for the bar', {
        pieces: check.reason ?? 'Check the lengths',
      });
    const children: BarPiece[] = [];
    for (const [index, piece] of input.pieces.entries()) {
      const tag = childTag(parent.tag, index);
      if (await bars.findPieceByTag(manager, tag))
        throw new AppError('CONFLICT', `Tag ${tag} is already in use`, { pieces: `Tag ${tag} exists` });
      const share = parent.massKg
        ? new DecimalE29(parent.massKg).times(piece.lengthMm).div(parent.lengthMm).toDecimalPlaces(3).toFixed(3)
        : null;
      const id = await bars.insertPiece(manager, {
        tag,
        heatId: parent.heat.id,
        markedHeatNumber: parent.markedHeatNumber,
        parentId: parent.id,
        diameterMm: parent.diameterMm,
        lengthMm: piece.lengthMm,
        massKg: share,
        location: piece.location || parent.location,
        createdBy: person.id,
      });
      children.push((await bars.findPiece(manager, id))!);
    }
    await bars.markCut(manager, parent.id);
    await appendLedgerEvent(manager, {
      actor,
      action: 'bar.cut',
      entity: { type: 'bar-piece', id: parent.tag },
      before: { tag: parent.tag, lengthMm: parent.lengthMm, status: parent.status },
      after: {
        children: children.map((child) => ({ tag: child.tag, lengthMm: child.lengthMm })),
        kerfLossMm: check.lossMm,
        allowedLossMm: check.allowedLossMm,
      },
      origin,
    });
    return children;
  });
}
