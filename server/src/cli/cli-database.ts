import { loadConfig, loadDotEnv } from '../config/env';
import { createDataSource } from '../db/connection-options';
import { CliExit } from './cli-exit';

/** Runs work against the configured database as the app's account; exit 2 when it cannot be reached. */
export async function withDatabase<T>(
  work: (dataSource: ReturnType<typeof createDataSource>) => Promise<T>,
): Promise<T> {
  loadDotEnv();
  const dataSource = createDataSource(loadConfig(), 'app');
  try {
    await dataSource.initialize();
  } catch (error) {
    throw new CliExit(2, `cannot reach the database: ${error instanceof Error ? error.message : String(error)}`);
  }
  try {
    return await work(dataSource);
  } finally {
    await dataSource.destroy();
  }
}
