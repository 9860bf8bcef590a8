import type { EntityManager, EntityTarget, ObjectLiteral, QueryDeepPartialEntity } from 'typeorm';

/** Inserts one row through its entity's repository and gives the id the database generated for it. */
export async function insertReturningId<Entity extends ObjectLiteral>(
  manager: EntityManager,
  target: EntityTarget<Entity>,
  row: QueryDeepPartialEntity<Entity>,
): Promise<number> {
  const result = await manager.getRepository(target).insert(row);
  return Number(result.identifiers[0]!.id);
}
