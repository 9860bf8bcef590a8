import type { DataSource } from 'typeorm';
import { Organisation } from './organisation.entity';
import type { OrganisationSummary } from '@shared/schemas/organisation';

export async function findOrganisation(dataSource: DataSource): Promise<OrganisationSummary | null> {
  const row = await dataSource.getRepository(Organisation).findOne({ where: {}, order: { id: 'ASC' } });
  if (!row) return null;
  return { name: row.name, site: row.site, address: row.address, gs1CompanyPrefix: row.gs1CompanyPrefix };
}
