import type { EntityManager } from 'typeorm';
import { Supplier as SupplierEntity } from './entities/supplier.entity';
import type { Supplier } from '@shared/schemas/materials';

export async function listSuppliers(manager: EntityManager): Promise<Supplier[]> {
  const rows: Array<{ id: number; name: string; country: string; approval: Supplier['approval']; heats: string }> =
    await manager.query(
      'SELECT s.id, s.name, s.country, s.approval, (SELECT COUNT(*) FROM heat h WHERE h.supplier_id = s.id) ' +
        'AS heats FROM supplier s ORDER BY s.name',
    );
  return rows.map((row) => ({ ...row, heats: Number(row.heats) }));
}

export async function findSupplier(manager: EntityManager, id: number, lock = false): Promise<Supplier | null> {
  const [row]: Array<{ id: number; name: string; country: string; approval: Supplier['approval'] }> =
    await manager.query(`SELECT id, name, country, approval FROM supplier WHERE id = ?${lock ? ' FOR UPDATE' : ''}`, [
      id,
    ]);
  return row ? { ...row, heats: 0 } : null;
}

export async function insertSupplier(
  manager: EntityManager,
  supplier: Pick<Supplier, 'name' | 'country' | 'approval'>,
): Promise<number> {
  const result: { insertId: number } = await manager.query(
    'INSERT INTO supplier (name, country, approval) VALUES (?, ?, ?)',
    [supplier.name, supplier.country, supplier.approval],
  );
  return Number(result.insertId);
}

export async function setSupplierApproval(
  manager: EntityManager,
  id: number,
  approval: Supplier['approval'],
): Promise<void> {
  await manager.query('UPDATE supplier SET approval = ? WHERE id = ?', [approval, id]);
}

/** The supplier registered under this name, or null. */
export async function supplierNamed(manager: EntityManager, name: string): Promise<{ id: number } | null> {
  return manager.getRepository(SupplierEntity).findOne({ select: { id: true }, where: { name } });
}
