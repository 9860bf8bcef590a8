import { AppError } from '../../errors';
import type { Database } from '../../db/database';
import type { Health } from '@shared/schemas/health';

const accessRefusedCodes = new Set([
  'ER_ACCESS_DENIED_ERROR',
  'ER_DBACCESS_DENIED_ERROR',
  'ER_TABLEACCESS_DENIED_ERROR',
]);

export async function checkHealth(database: Database, version: string): Promise<Health> {
  let server: string;
  try {
    server = await database.serverVersion();
  } catch (error) {
    const code = (error as { code?: string }).code ?? '';
    const reason = accessRefusedCodes.has(code) ? 'Database refused the app account' : 'Database unreachable';
    throw new AppError('SERVICE_UNAVAILABLE', `${reason}: ${describe(error)}`);
  }
  let pending: string[];
  try {
    pending = await database.pendingMigrations();
  } catch (error) {
    throw new AppError('SERVICE_UNAVAILABLE', `Cannot read the migration history: ${describe(error)}`);
  }
  if (pending.length > 0) {
    throw new AppError(
      'SERVICE_UNAVAILABLE',
      `Database schema is behind: ${pending.length} migration(s) not run (${pending.join(', ')})`,
    );
  }
  return { status: 'ok', version, database: { server, migrationsPending: 0 } };
}

function describe(error: unknown): string {
  const code = (error as { code?: string }).code;
  const message = error instanceof Error ? error.message : String(error);
  return code && !message.includes(code) ? `${code} ${message}` : message;
}
