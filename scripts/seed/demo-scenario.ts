import type { DataSource } from 'typeorm';
import { Organisation } from '../../server/src/modules/organisation/entities/organisation.entity';
import { inTransaction } from '../../server/src/db/transaction';
import { appendLedgerEvent, type Actor } from '../../server/src/modules/ledger/ledger.repository';
import { rolesFromGroups } from '../../server/src/modules/people/people.domain';
import { insertPerson, replaceIdentityProviderRoles } from '../../server/src/modules/people/people.repository';
import { demoPeople } from '../stand-in-idp/demo-people';

/**
 * The demo scenario: an invented implant maker with invented mills, heats and customers.
 * Nothing here names or describes a real firm. The GS1 company prefix uses the 952 range that
 * GS1 sets aside for demonstrations and examples.
 */
export const demoOrganisation = {
  name: 'Kestrelmoor Implant Works',
  site: 'Tarnbridge machining and finishing plant',
  address: 'Unit 4, Fellgate Park, Tarnbridge TB4 9QZ',
  gs1CompanyPrefix: '9520123',
  timeZone: 'Europe/London',
} as const;

/** People whom the demo deactivates in Ingotrace (the identity provider still knows them). */
export const deactivatedDemoSubjects = ['kiw-0901'];

const seedActor: Actor = { id: null, name: 'demo scenario seed', role: null };

export async function isDatabaseEmpty(dataSource: DataSource): Promise<boolean> {
  return (await dataSource.getRepository(Organisation).count()) === 0;
}

/** Builds the whole demo scenario in one transaction, with its ledger events. */
export async function seedDemoScenario(dataSource: DataSource, roleMap: Record<string, string>): Promise<void> {
  await inTransaction(dataSource, async (manager) => {
    const organisation = await manager.getRepository(Organisation).insert({ ...demoOrganisation });
    await appendLedgerEvent(manager, {
      actor: seedActor,
      action: 'organisation.created',
      entity: { type: 'organisation', id: organisation.identifiers[0]?.id ?? null },
      after: { ...demoOrganisation },
      reason: 'demo scenario',
    });
    for (const person of demoPeople) {
      const active = !deactivatedDemoSubjects.includes(person.subject);
      const id = await insertPerson(manager, {
        subject: person.subject,
        name: person.name,
        email: person.email,
        active,
      });
      const roles = rolesFromGroups(person.groups, roleMap);
      await replaceIdentityProviderRoles(manager, id, roles);
      await appendLedgerEvent(manager, {
        actor: seedActor,
        action: 'person.provisioned',
        entity: { type: 'person', id },
        after: {
          subject: person.subject,
          name: person.name,
          email: person.email,
          active,
          identityProviderRoles: roles,
        },
        reason: 'demo scenario',
      });
    }
  });
}
