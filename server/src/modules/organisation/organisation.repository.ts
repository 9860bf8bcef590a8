import type { DataSource, EntityManager } from 'typeorm';
import { Organisation } from './entities/organisation.entity';
import type { OrganisationSummary } from '@shared/schemas/organisation';

/** The organisation the plant records belong to (the first one), or null before it is set up. */
export async function findOrganisation(source: DataSource | EntityManager): Promise<OrganisationSummary | null> {
  const row = await source.getRepository(Organisation).findOne({ where: {}, order: { id: 'ASC' } });
  if (!row) return null;
  return {
    name: row.name,
    site: row.site,
    address: row.address,
    gs1CompanyPrefix: row.gs1CompanyPrefix,
    timeZone: row.timeZone,
  };
}

/** The plant's time zone, read inside the caller's transaction (UTC before any organisation exists). */
export async function plantTimeZone(manager: EntityManager): Promise<string> {
  const row = await manager
    .getRepository(Organisation)
    .findOne({ where: {}, order: { id: 'ASC' }, select: { id: true, timeZone: true } });
  return row?.timeZone ?? 'UTC';
}

export async function setPlantTimeZone(manager: EntityManager, timeZone: string): Promise<string> {
  const before = await plantTimeZone(manager);
  await manager.getRepository(Organisation).createQueryBuilder().update().set({ timeZone }).execute();
  return before;
}
