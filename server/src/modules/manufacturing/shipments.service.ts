import type { DataSource } from 'typeorm';
import {
  consigneeInputSchema,
  shipmentInputSchema,
  type ConsigneeInput,
  type ShipmentInput,
} from '@shared/schemas/manufacturing';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { findLotRow } from './lots.repository';
import { refuseIfHeld } from '../recall/lot-holds';

export async function listConsignees(dataSource: DataSource) {
  const rows: Array<{
    id: number;
    name: string;
    kind: string;
    country: string;
    contact_email: string | null;
    shipments: string | number;
  }> = await dataSource.query(
    'SELECT c.*, (SELECT COUNT(*) FROM shipment s WHERE s.consignee_id = c.id) AS shipments FROM consignee c ORDER BY c.name',
  );
  return rows.map((row) => ({
    id: row.id,
    name: row.name,
    kind: row.kind,
    country: row.country,
    contactEmail: row.contact_email,
    shipments: Number(row.shipments),
  }));
}

export async function createConsignee(
  dataSource: DataSource,
  raw: ConsigneeInput,
  actor: Actor,
  origin: RequestOrigin,
) {
  const input = consigneeInputSchema.parse(raw);
  return inTransaction(dataSource, async (manager) => {
    const [existing] = await manager.query('SELECT id FROM consignee WHERE name = ?', [input.name]);
    if (existing)
      throw new AppError('CONFLICT', `A consignee named ${input.name} exists already`, { name: 'Already registered' });
    const result: { insertId: number } = await manager.query(
      'INSERT INTO consignee (name, kind, country, contact_email) VALUES (?, ?, ?, ?)',
      [input.name, input.kind, input.country, input.contactEmail],
    );
    const id = Number(result.insertId);
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

/** Ships units of a released lot; never more than were released, less what already shipped. */
export async function shipLot(
  dataSource: DataSource,
  lotId: number,
  raw: ShipmentInput,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  const input = shipmentInputSchema.parse(raw);
  return inTransaction(dataSource, async (manager) => {
    const lot = await findLotRow(manager, lotId, true);
    if (!lot) throw AppError.notFound('Lot');
    if (lot.status !== 'released')
      throw AppError.rule(`Lot ${lot.lot_number} is ${lot.status}; only released lots ship`, {
        qty: 'Lot not released',
      });
    await refuseIfHeld(manager, [lotId], 'shipped', 'qty');
    const [consignee] = await manager.query('SELECT id, name FROM consignee WHERE id = ?', [input.consigneeId]);
    if (!consignee) throw AppError.rule('Choose a registered consignee', { consigneeId: 'Unknown consignee' });
    const [shipped]: Array<{ qty: string | null }> = await manager.query(
      'SELECT SUM(qty) AS qty FROM shipment WHERE lot_id = ?',
      [lotId],
    );
    const available = lot.released_qty - Number(shipped?.qty ?? 0);
    if (input.qty > available)
      throw AppError.rule(
        `Lot ${lot.lot_number} has ${available} released units not yet shipped; ${input.qty} cannot ship`,
        { qty: `At most ${available}` },
      );
    const result: { insertId: number } = await manager.query(
      'INSERT INTO shipment (lot_id, consignee_id, qty, shipped_on, document_number, recorded_by) VALUES (?, ?, ?, ?, ?, ?)',
      [lotId, input.consigneeId, input.qty, input.shippedOn, input.documentNumber, person.id],
    );
    const id = Number(result.insertId);
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
