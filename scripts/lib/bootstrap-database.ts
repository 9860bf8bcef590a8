import { rmSync } from 'node:fs';
import { witnessFilePath } from '../../server/src/modules/ledger/ledger-checkpoints';
import type { AppConfig } from '../../server/src/config/env';
import { accountsSql, appGrantsSql, type DatabaseAccounts } from '../../server/src/db/table-privileges';
import { MariadbServer } from './mariadb';
import { createDataSource } from '../../server/src/db/connection-options';
import { syncSpecificationLibrary } from '../../server/src/modules/materials/specification-library.repository';
import { runMigrations } from './migrate';
import { log } from './run';

export interface BootstrapOptions {
  /** Drop the database first and build it anew. */
  reset?: boolean;
  relaxedDurability?: boolean;
  bufferPoolMb?: number;
  /** A server that is already running (a cluster node) to administer instead of the local one. */
  server?: MariadbServer;
}

export function accountsFor(config: AppConfig): DatabaseAccounts {
  return {
    database: config.DB_NAME,
    appUser: config.DB_USER,
    appPassword: config.DB_PASSWORD,
    migrationUser: config.DB_MIGRATION_USER,
    migrationPassword: config.DB_MIGRATION_PASSWORD,
    hosts: ['127.0.0.1', 'localhost'],
  };
}

export function localServerFor(config: AppConfig, relaxedDurability = false, bufferPoolMb?: number): MariadbServer {
  return new MariadbServer({
    baseDir: `${config.DATA_DIR}/mariadb`,
    port: config.DB_PORT,
    relaxedDurability,
    bufferPoolMb,
  });
}

/**
 * Starts the project's own MariaDB (installing it when missing), creates the database and both
 * accounts, runs the migrations and gives the app account its per-table grants.
 */
export async function bootstrapDatabase(config: AppConfig, options: BootstrapOptions = {}): Promise<MariadbServer> {
  const server = options.server ?? localServerFor(config, options.relaxedDurability, options.bufferPoolMb);
  if (!options.server) await server.start();
  try {
    const accounts = accountsFor(config);
    if (options.reset) {
      log(`dropping database ${config.DB_NAME} to rebuild it`);
      await server.adminSql(`DROP DATABASE IF EXISTS \`${config.DB_NAME}\`;`);
      // The dropped ledger's checkpoints witness a ledger that no longer exists.
      rmSync(witnessFilePath(config), { force: true });
    }
    await server.adminSql(accountsSql(accounts));
    const ran = await runMigrations(config);
    log(ran.length ? `migrations run: ${ran.join(', ')}` : 'database schema is current');
    await applyAppGrants(server, config);
    await loadSpecificationLibrary(config);
    return server;
  } catch (error) {
    // A failed migration or grant must not leave a server behind that the next run finds "already running".
    if (!options.server) await server.stop();
    throw error;
  }
}

/** Stores the shipped specification revisions that the database does not hold yet. */
async function loadSpecificationLibrary(config: AppConfig): Promise<void> {
  const dataSource = createDataSource(config, 'app');
  await dataSource.initialize();
  try {
    const added = await dataSource.transaction((manager) => syncSpecificationLibrary(manager));
    if (added.length) log(`specification library: stored ${added.join(', ')}`);
  } finally {
    await dataSource.destroy();
  }
}

export async function applyAppGrants(server: MariadbServer, config: AppConfig): Promise<void> {
  const output = await server.adminSql(
    `SELECT table_name FROM information_schema.tables WHERE table_schema = '${config.DB_NAME}' AND table_type ` +
      `= 'BASE TABLE';`,
    ['-N', '-B'],
  );
  const tables = output
    .split('\n')
    .map((line) => line.trim())
    .filter(Boolean);
  const granted = await server.adminSql(
    `SELECT DISTINCT Host, Table_name FROM mysql.tables_priv WHERE User = '${config.DB_USER}' AND Db = ` +
      `'${config.DB_NAME}';`,
    ['-N', '-B'],
  );
  const previouslyGranted = granted
    .split('\n')
    .filter(Boolean)
    .map((line) => {
      const [host = '', table = ''] = line.split('\t');
      return { host, table };
    });
  await server.adminSql(appGrantsSql(accountsFor(config), tables, previouslyGranted));
}
