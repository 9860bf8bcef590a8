import type { CacheItem, CacheProvider } from '@node-saml/node-saml';
import { LessThan, MoreThanOrEqual } from 'typeorm';
import type { Database } from '../../db/database';
import { SamlAssertionUsed } from './entities/saml-assertion-used.entity';
import { SamlRequest } from './entities/saml-request.entity';

/**
 * node-saml's InResponseTo cache kept in MariaDB, so that a response can arrive at any app
 * instance. Entries older than the expiry are ignored and swept.
 */
export class MariadbSamlRequestCache implements CacheProvider {
  constructor(
    private readonly database: Database,
    private readonly expiryMs: number,
  ) {}

  private async requests() {
    return (await this.database.connect()).getRepository(SamlRequest);
  }

  async saveAsync(key: string, value: string): Promise<CacheItem | null> {
    const requests = await this.requests();
    const createdAt = new Date();
    await requests.delete({ createdAt: LessThan(new Date(Date.now() - this.expiryMs)) });
    await requests.insert({ id: key, value, createdAt });
    return { value, createdAt: createdAt.getTime() };
  }

  async getAsync(key: string): Promise<string | null> {
    const requests = await this.requests();
    const row = await requests.findOne({
      select: { value: true },
      where: { id: key, createdAt: MoreThanOrEqual(new Date(Date.now() - this.expiryMs)) },
    });
    return row?.value ?? null;
  }

  async removeAsync(key: string | null): Promise<string | null> {
    if (key === null) return null;
    const requests = await this.requests();
    const row = await requests.findOne({ select: { value: true }, where: { id: key } });
    await requests.delete({ id: key });
    return row?.value ?? null;
  }
}

/** Remembers every accepted assertion id until it expires, so that a captured response cannot be replayed. */
export async function claimAssertionId(database: Database, assertionId: string, expiresAt: Date): Promise<boolean> {
  const used = (await database.connect()).getRepository(SamlAssertionUsed);
  await used.delete({ expiresAt: LessThan(new Date(Date.now() - 24 * 3600_000)) });
  try {
    await used.insert({ assertionId, usedAt: new Date(), expiresAt });
    return true;
  } catch (error) {
    // TypeORM wraps the driver's error in a QueryFailedError that keeps its code.
    if ((error as { code?: string; driverError?: { code?: string } }).code === 'ER_DUP_ENTRY') return false;
    if ((error as { driverError?: { code?: string } }).driverError?.code === 'ER_DUP_ENTRY') return false;
    throw error;
  }
}
