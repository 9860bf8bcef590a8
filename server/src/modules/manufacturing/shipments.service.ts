import type { z } from 'zod';
import type { DataSource } from 'typeorm';
import { consigneeContactInputSchema, consigneeInputSchema, shipmentInputSchema } from '@shared/schemas/manufacturing';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { findLotRow } from './lots.repository';
import { refuseIfHeld } from '../recall/lot-holds';
import {
  consigneeNamed,
  consigneesWithShipments,
  findConsignee,
  insertConsignee,
  insertShipment,
  lockConsignee,
  setConsigneeContact,
  unitsShipped,
} from './shipments.repository';

export async function listConsignees(dataSource: DataSource) {
  return consigneesWithShipments(dataSource.manager);
}

export async function createConsignee(
  dataSource: DataSource,
  input: z.output<typeof consigneeInputSchema>,
  actor: Actor,
  origin: RequestOrigin,
) {
  return inTransaction(dataSource, async (manager) => {
    if (await consigneeNamed(manager, input.name))
      throw new AppError('CONFLICT', `A consignee named ${input.name} exists already`, { name: 'Already registered' });
    const id = await insertConsignee(manager, {
      name: input.name,
      kind: input.kind,
      country: input.country,
      contactEmail: input.contactEmail,
    });
    await appendLedgerEvent(manager, {
      actor,
      action: 'consignee.created',
      entity: { type: 'consignee', id },
      after: input,
      origin,
    });
    return { id, ...input, shipments: 0 };
  });
}

/**
 * Records where a consignee's recall notices go. A notice already prepared keeps the address it
 * was prepared with; preparing the notices again takes the new one.
 */
export async function changeConsigneeContact(
  dataSource: DataSource,
  consigneeId: number,
  input: z.output<typeof consigneeContactInputSchema>,
  actor: Actor,
  origin: RequestOrigin,
) {
  return inTransaction(dataSource, async (manager) => {
    const consignee = await lockConsignee(manager, consigneeId);
    if (!consignee) throw AppError.notFound('Consignee');
    await setConsigneeContact(manager, consigneeId, input.contactEmail);
    await appendLedgerEvent(manager, {
      actor,
      action: 'consignee.contact-changed',
      entity: { type: 'consignee', id: consigneeId },
      before: { contactEmail: consignee.contactEmail },
      after: { contactEmail: input.contactEmail },
      origin,
    });
    return (await consigneesWithShipments(manager)).find((entry) => entry.id === consigneeId)!;
  });
}

/** Ships units of a released lot; never more than were released, less what already shipped. */
export async function shipLot(
  dataSource: DataSource,
  lotId: number,
  input: z.output<typeof shipmentInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  return inTransaction(dataSource, async (manager) => {
    const lot = await findLotRow(manager, lotId, true);
    if (!lot) throw AppError.notFound('Lot');
    if (lot.status !== 'released')
      throw AppError.rule(`Lot ${lot.lot_number} is ${lot.status}; only released lots ship`, {
        qty: 'Lot not released',
      });
    await refuseIfHeld(manager, [lotId], 'shipped', 'qty');
    const consignee = await findConsignee(manager, input.consigneeId);
    if (!consignee) throw AppError.rule('Choose a registered consignee', { consigneeId: 'Unknown consignee' });
    const available = lot.released_qty - (await unitsShipped(manager, lotId));
    if (input.qty > available)
      throw AppError.rule(
        `Lot ${lot.lot_number} has ${available} released units not yet shipped; ${input.qty} cannot ship`,
        { qty: `At most ${available}` },
      );
    const id = await insertShipment(manager, {
      lotId,
      consigneeId: input.consigneeId,
      qty: input.qty,
      shippedOn: input.shippedOn,
      documentNumber: input.documentNumber,
      recordedBy: person.id,
    });
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.shipped',
      entity: { type: 'lot', id: lotId },
      after: { shipmentId: id, consignee: consignee.name, ...input },
      origin,
    });
    return {
      id,
      lot: lot.lot_number,
      consignee: consignee.name as string,
      qty: input.qty,
      remaining: available - input.qty,
    };
  });
}
