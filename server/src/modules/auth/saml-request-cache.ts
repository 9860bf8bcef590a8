import type { CacheItem, CacheProvider } from '@node-saml/node-saml';
import type { Database } from '../../db/database';

/**
 * node-saml's InResponseTo cache kept in MariaDB, so that a response can arrive at any app
 * instance. Entries older than the expiry are ignored and swept.
 */
export class MariadbSamlRequestCache implements CacheProvider {
  constructor(
    private readonly database: Database,
    private readonly expiryMs: number,
  ) {}

  async saveAsync(key: string, value: string): Promise<CacheItem | null> {
    const dataSource = await this.database.connect();
    const createdAt = new Date();
    await dataSource.query('DELETE FROM saml_request WHERE created_at < ?', [new Date(Date.now() - this.expiryMs)]);
    await dataSource.query('INSERT INTO saml_request (id, value, created_at) VALUES (?, ?, ?)', [
      key,
      value,
      createdAt,
    ]);
    return { value, createdAt: createdAt.getTime() };
  }

  async getAsync(key: string): Promise<string | null> {
    const dataSource = await this.database.connect();
    const [row]: Array<{ value: string }> = await dataSource.query(
      'SELECT value FROM saml_request WHERE id = ? AND created_at >= ?',
      [key, new Date(Date.now() - this.expiryMs)],
    );
    return row?.value ?? null;
  }

  async removeAsync(key: string | null): Promise<string | null> {
    if (key === null) return null;
    const dataSource = await this.database.connect();
    const [row]: Array<{ value: string }> = await dataSource.query('SELECT value FROM saml_request WHERE id = ?', [
      key,
    ]);
    await dataSource.query('DELETE FROM saml_request WHERE id = ?', [key]);
    return row?.value ?? null;
  }
}

/** Remembers every accepted assertion id until it expires, so that a captured response cannot be replayed. */
export async function claimAssertionId(database: Database, assertionId: string, expiresAt: Date): Promise<boolean> {
  const dataSource = await database.connect();
  await dataSource.query('DELETE FROM saml_assertion_used WHERE expires_at < ?', [
    new Date(Date.now() - 24 * 3600_000),
  ]);
  try {
    await dataSource.query('INSERT INTO saml_assertion_used (assertion_id, used_at, expires_at) VALUES (?, ?, ?)', [
      assertionId,
      new Date(),
      expiresAt,
    ]);
    return true;
  } catch (error) {
    if ((error as { code?: string }).code === 'ER_DUP_ENTRY') return false;
    throw error;
  }
}
