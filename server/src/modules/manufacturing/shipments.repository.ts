import type { EntityManager } from 'typeorm';
import { insertReturningId } from '../../db/insert-returning-id';
import { Consignee } from './entities/consignee.entity';
import { Shipment } from './entities/shipment.entity';

/** Every consignee by name, with how many shipments went to it. */
export async function consigneesWithShipments(
  manager: EntityManager,
): Promise<Array<Pick<Consignee, 'id' | 'name' | 'kind' | 'country' | 'contactEmail'> & { shipments: number }>> {
  const { entities, raw } = await manager
    .getRepository(Consignee)
    .createQueryBuilder('consignee')
    .addSelect(
      (count) => count.select('COUNT(*)').from(Shipment, 'shipment').where('shipment.consigneeId = consignee.id'),
      'shipments',
    )
    .orderBy('consignee.name')
    .getRawAndEntities<{ shipments: string | number }>();
  return entities.map((consignee, index) => ({
    id: consignee.id,
    name: consignee.name,
    kind: consignee.kind,
    country: consignee.country,
    contactEmail: consignee.contactEmail,
    shipments: Number(raw[index]?.shipments ?? 0),
  }));
}

export function consigneeNamed(manager: EntityManager, name: string) {
  return manager.getRepository(Consignee).findOne({ select: { id: true }, where: { name } });
}

export function findConsignee(manager: EntityManager, id: number) {
  return manager.getRepository(Consignee).findOne({ select: { id: true, name: true }, where: { id } });
}

/** The consignee, locked for a change of its contact address. */
export function lockConsignee(manager: EntityManager, id: number) {
  return manager.getRepository(Consignee).findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
}

export async function setConsigneeContact(manager: EntityManager, id: number, contactEmail: string | null) {
  await manager.getRepository(Consignee).update({ id }, { contactEmail });
}

export async function insertConsignee(
  manager: EntityManager,
  consignee: Pick<Consignee, 'name' | 'kind' | 'country' | 'contactEmail'>,
): Promise<number> {
  return insertReturningId(manager, Consignee, consignee);
}

/** Units of the lot shipped so far. */
export async function unitsShipped(manager: EntityManager, lotId: number): Promise<number> {
  return (await manager.getRepository(Shipment).sum('qty', { lotId })) ?? 0;
}

export async function insertShipment(
  manager: EntityManager,
  shipment: Pick<Shipment, 'lotId' | 'consigneeId' | 'qty' | 'shippedOn' | 'documentNumber' | 'recordedBy'>,
): Promise<number> {
  return insertReturningId(manager, Shipment, shipment);
}
