import { loadConfig } from '../../server/src/config/env';
import { localServerFor } from '../../scripts/lib/bootstrap-database';

/** SQL as the database administrator (OS root through the socket) on the test profile's server. */
export function adminSql(sql: string): Promise<string> {
  const config = loadConfig();
  return localServerFor(config).adminSql(`USE \`${config.DB_NAME}\`;\n${sql}`, ['-N', '-B']);
}
