import type { DataSource } from 'typeorm';
import { Organisation } from '../../server/src/modules/organisation/organisation.entity';

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
} as const;

export async function isDatabaseEmpty(dataSource: DataSource): Promise<boolean> {
  return (await dataSource.getRepository(Organisation).count()) === 0;
}

/** Builds the whole demo scenario in one transaction. */
export async function seedDemoScenario(dataSource: DataSource): Promise<void> {
  await dataSource.transaction(async (manager) => {
    await manager.getRepository(Organisation).insert({ ...demoOrganisation });
  });
}
