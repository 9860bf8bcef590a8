import type { EntityManager } from 'typeorm';
import { Person } from '../people/entities/person.entity';
import { Reauthentication } from './entities/reauthentication.entity';

export async function insertReauthentication(
  manager: EntityManager,
  started: Pick<Reauthentication, 'id' | 'personId' | 'purpose' | 'bindingHash' | 'returnTo' | 'startedAt'>,
): Promise<void> {
  await manager.getRepository(Reauthentication).insert(started);
}

/** The re-authentication, optionally locked for the rest of the transaction, or null. */
export function findReauthentication(
  manager: EntityManager,
  id: string,
  lock = false,
): Promise<Reauthentication | null> {
  return manager
    .getRepository(Reauthentication)
    .findOne({ where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
}

export async function updateReauthentication(
  manager: EntityManager,
  id: string,
  change: Partial<Pick<Reauthentication, 'confirmedAt' | 'authnInstant' | 'refusedReason' | 'usedAt'>>,
): Promise<void> {
  await manager.getRepository(Reauthentication).update({ id }, change);
}

/** The subject and name the identity provider must assert again for this person. */
export function findPersonIdentity(
  manager: EntityManager,
  personId: number,
): Promise<{ subject: string; name: string } | null> {
  return manager.getRepository(Person).findOne({ select: { subject: true, name: true }, where: { id: personId } });
}
