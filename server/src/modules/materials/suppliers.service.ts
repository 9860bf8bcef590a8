import type { DataSource } from 'typeorm';
import type { Supplier } from '@shared/schemas/materials';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import * as suppliers from './suppliers.repository';

export function listSuppliers(dataSource: DataSource): Promise<Supplier[]> {
  return suppliers.listSuppliers(dataSource.manager);
}

export async function createSupplier(
  dataSource: DataSource,
  input: Pick<Supplier, 'name' | 'country' | 'approval'> & { reason: string },
  actor: Actor,
  origin: RequestOrigin,
): Promise<Supplier> {
  return inTransaction(dataSource, async (manager) => {
    if (await suppliers.supplierNamed(manager, input.name))
      throw new AppError('CONFLICT', `A supplier named ${input.name} exists already`, { name: 'Already registered' });
    const id = await suppliers.insertSupplier(manager, input);
    await appendLedgerEvent(manager, {
      actor,
      action: 'supplier.created',
      entity: { type: 'supplier', id },
      after: { name: input.name, country: input.country, approval: input.approval },
      reason: input.reason,
      origin,
    });
    return { id, name: input.name, country: input.country, approval: input.approval, heats: 0 };
  });
}

export async function changeSupplierApproval(
  dataSource: DataSource,
  id: number,
  change: { approval: Supplier['approval']; reason: string },
  actor: Actor,
  origin: RequestOrigin,
): Promise<Supplier> {
  return inTransaction(dataSource, async (manager) => {
    const supplier = await suppliers.findSupplier(manager, id, true);
    if (!supplier) throw AppError.notFound('Supplier');
    if (supplier.approval === change.approval)
      throw AppError.rule(`The supplier is already ${change.approval}`, { approval: 'Nothing to change' });
    await suppliers.setSupplierApproval(manager, id, change.approval);
    await appendLedgerEvent(manager, {
      actor,
      action: 'supplier.approval-changed',
      entity: { type: 'supplier', id },
      before: { approval: supplier.approval },
      after: { approval: change.approval },
      reason: change.reason,
      origin,
    });
    return { ...supplier, approval: change.approval };
  });
}
