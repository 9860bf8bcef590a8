import type { DataSource } from 'typeorm';
import type { Role } from '@shared/auth/roles';
import type { SignInRefusalCode } from '@shared/auth/sign-in-refusals';
import { ownRoleChangeRefusal, roleCombinationRefusal, signingRolesChanged } from '@shared/auth/role-changes';
import type {
  ActivationChange,
  PeopleQuery,
  PeoplePage,
  PeopleSettings,
  Person,
  RoleChange,
  RoleChangeOutcome,
} from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import * as people from './people.repository';
import {
  administratorsMayApprove,
  insertRoleChangeRequest,
  pendingRoleChanges,
} from './role-change-requests.repository';

export interface SignInIdentity {
  subject: string;
  name: string;
  email: string;
  identityProviderRoles: Role[];
  authnInstant: Date;
}

export class SignInRefused extends Error {
  constructor(
    readonly code: SignInRefusalCode,
    message: string,
  ) {
    super(message);
  }
}

const systemActor: Actor = { id: null, name: 'identity provider', role: null };

/**
 * Provisions or updates the person named by a verified assertion and records the sign-in; refuses
 * deactivated people and people without any Ingotrace role.
 */
export async function signIn(dataSource: DataSource, identity: SignInIdentity, origin: RequestOrigin): Promise<Person> {
  return inTransaction(dataSource, async (manager) => {
    let existing = await people.findPersonBySubject(manager, identity.subject);
    if (!existing) {
      const id = await people.insertPerson(manager, identity);
      await appendLedgerEvent(manager, {
        actor: systemActor,
        action: 'person.provisioned',
        entity: { type: 'person', id },
        after: { subject: identity.subject, name: identity.name, email: identity.email },
        origin,
      });
      existing = (await people.findPersonById(manager, id, true))!;
    }
    if (!existing.active)
      throw new SignInRefused('deactivated', 'Your Ingotrace account is deactivated; ask an administrator');
    const before = existing.identityProviderRoles;
    if (before.join() !== identity.identityProviderRoles.join()) {
      await people.replaceIdentityProviderRoles(manager, existing.id, identity.identityProviderRoles);
      await appendLedgerEvent(manager, {
        actor: systemActor,
        action: 'person.identity-provider-roles-changed',
        entity: { type: 'person', id: existing.id },
        before: { identityProviderRoles: before },
        after: { identityProviderRoles: identity.identityProviderRoles },
        origin,
      });
    }
    await people.updatePersonProfile(manager, existing.id, {
      name: identity.name,
      email: identity.email,
      signedInAt: new Date(),
    });
    const person = (await people.findPersonById(manager, existing.id))!;
    if (person.roles.length === 0)
      throw new SignInRefused('no-role', 'You hold no Ingotrace role; ask an administrator to give you one');
    const combination = roleCombinationRefusal(person.roles, await administratorsMayApprove(manager));
    if (combination)
      throw new SignInRefused('role-combination', `${combination}; ask an administrator to remove one of them`);
    await appendLedgerEvent(manager, {
      actor: { id: person.id, name: person.name, role: null },
      action: 'session.signed-in',
      entity: { type: 'person', id: person.id },
      after: { roles: person.roles, authnInstant: identity.authnInstant.toISOString() },
      origin,
    });
    return person;
  });
}

/** Records a refused sign-in in its own transaction (nothing else is written). */
export async function recordRefusedSignIn(
  dataSource: DataSource,
  reason: string,
  subject: string | null,
  origin: RequestOrigin,
): Promise<void> {
  await inTransaction(dataSource, (manager) =>
    appendLedgerEvent(manager, {
      actor: { id: null, name: subject, role: null },
      action: 'session.sign-in-refused',
      entity: { type: 'person', id: null },
      after: { subject },
      reason,
      origin,
    }),
  );
}

export async function recordSignOut(dataSource: DataSource, person: Person, origin: RequestOrigin): Promise<void> {
  await inTransaction(dataSource, (manager) =>
    appendLedgerEvent(manager, {
      actor: { id: person.id, name: person.name, role: null },
      action: 'session.signed-out',
      entity: { type: 'person', id: person.id },
      origin,
    }),
  );
}

export async function findPerson(dataSource: DataSource, id: number): Promise<Person | null> {
  return people.findPersonById(dataSource.manager, id);
}

export async function listPeople(dataSource: DataSource, query: PeopleQuery): Promise<PeoplePage> {
  const { items, total } = await people.listPeople(dataSource.manager, query);
  return { items, total, page: query.page, pageSize: query.pageSize };
}

/**
 * Changes a person's roles. Nobody changes their own; a change that grants or removes a signing
 * role waits for a second administrator's signed confirmation (the `role-change` record type);
 * other changes take effect at once. Roles that may not be held together are refused.
 */
export async function changeRoles(
  dataSource: DataSource,
  personId: number,
  change: RoleChange,
  actor: Actor,
  origin: RequestOrigin,
): Promise<RoleChangeOutcome> {
  const own = ownRoleChangeRefusal(actor.id, personId);
  if (own) throw new AppError('FORBIDDEN', own);
  return inTransaction(dataSource, async (manager) => {
    const person = await people.findPersonById(manager, personId, true);
    if (!person) throw AppError.notFound('Person');
    const wanted = [...new Set(change.roles)].sort();
    if (wanted.join() === person.roles.join())
      throw AppError.rule('These are already the person’s roles', { roles: 'Nothing to change' });
    const combination = roleCombinationRefusal(wanted, await administratorsMayApprove(manager));
    if (combination) throw AppError.rule(combination, { roles: combination });
    if (signingRolesChanged(person.roles, wanted).length) {
      const [waiting] = await pendingRoleChanges(manager, personId);
      if (waiting)
        throw new AppError(
          'CONFLICT',
          `A change of ${person.name}’s roles asked by ${waiting.requestedBy} is waiting for confirmation`,
          { roles: 'Waiting for confirmation' },
        );
      const id = await insertRoleChangeRequest(manager, {
        personId,
        rolesBefore: person.roles,
        rolesAfter: wanted,
        reason: change.reason,
        requestedBy: actor.id!,
      });
      await appendLedgerEvent(manager, {
        actor,
        action: 'person.role-change-requested',
        entity: { type: 'person', id: personId },
        before: { roles: person.roles },
        after: { roles: wanted, request: id },
        reason: change.reason,
        origin,
      });
      const [pending] = await pendingRoleChanges(manager, personId);
      return { applied: false, person, pending: pending! };
    }
    await people.setAdministratorRoles(manager, personId, wanted, person.identityProviderRoles);
    const after = (await people.findPersonById(manager, personId))!;
    await appendLedgerEvent(manager, {
      actor,
      action: 'person.roles-changed',
      entity: { type: 'person', id: personId },
      before: { roles: person.roles },
      after: { roles: after.roles },
      reason: change.reason,
      origin,
    });
    return { applied: true, person: after, pending: null };
  });
}

export async function peopleSettings(dataSource: DataSource): Promise<PeopleSettings> {
  return {
    administratorsMayApprove: await administratorsMayApprove(dataSource.manager),
    pendingRoleChanges: await pendingRoleChanges(dataSource.manager),
  };
}

export async function changeActivation(
  dataSource: DataSource,
  personId: number,
  change: ActivationChange,
  actor: Actor,
  origin: RequestOrigin,
): Promise<Person> {
  return inTransaction(dataSource, async (manager) => {
    const person = await people.findPersonById(manager, personId, true);
    if (!person) throw AppError.notFound('Person');
    if (actor.id === personId && !change.active)
      throw AppError.rule('You cannot deactivate yourself', { active: 'Ask another administrator' });
    if (person.active === change.active)
      throw AppError.rule(change.active ? 'This person is already active' : 'This person is already deactivated', {
        active: 'Nothing to change',
      });
    await people.setPersonActive(manager, personId, change.active);
    await appendLedgerEvent(manager, {
      actor,
      action: change.active ? 'person.reactivated' : 'person.deactivated',
      entity: { type: 'person', id: personId },
      before: { active: person.active },
      after: { active: change.active },
      reason: change.reason,
      origin,
    });
    return { ...person, active: change.active };
  });
}
