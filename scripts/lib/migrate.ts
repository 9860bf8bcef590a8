import type { AppConfig } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';

/** Runs pending migrations as the migration user; returns the names it ran. */
export async function runMigrations(config: AppConfig): Promise<string[]> {
  const dataSource = createDataSource(config, 'migration');
  await dataSource.initialize();
  try {
    const ran = await dataSource.runMigrations({ transaction: 'each' });
    return ran.map((migration) => migration.name);
  } finally {
    await dataSource.destroy();
  }
}
