import 'reflect-metadata';
import { DataSource, type ObjectLiteral, type QueryRunner } from 'typeorm';
import type { AppConfig } from '../config/env';
import { entities } from './entities';
import { migrations } from './migrations';
import { readWithRetry } from './transient-errors';

export type DatabaseRole = 'app' | 'migration';

const readOnly = /^\s*(SELECT|WITH)\b/i;

/**
 * A DataSource whose reads outside a transaction are repeated while the database is briefly
 * unavailable (a restarting server, a failed cluster node), so that a failover costs a read
 * some seconds, not an error. Writes repeat only as whole transactions (inTransaction).
 */
class RetryingDataSource extends DataSource {
  override query<T = unknown>(
    sql: string,
    parameters?: unknown[] | ObjectLiteral,
    queryRunner?: QueryRunner,
  ): Promise<T> {
    if (queryRunner || !readOnly.test(sql)) return super.query<T>(sql, parameters, queryRunner);
    return readWithRetry(() => super.query<T>(sql, parameters));
  }
}

/** A DataSource for the running app (narrow grants) or for migrations (schema owner). */
export function createDataSource(config: AppConfig, role: DatabaseRole = 'app'): DataSource {
  return new RetryingDataSource({
    type: 'mariadb',
    host: config.DB_HOST,
    port: config.DB_PORT,
    database: config.DB_NAME,
    username: role === 'app' ? config.DB_USER : config.DB_MIGRATION_USER,
    password: role === 'app' ? config.DB_PASSWORD : config.DB_MIGRATION_PASSWORD,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    dateStrings: false,
    supportBigNumbers: true,
    bigNumberStrings: true,
    entities,
    migrations,
    migrationsTableName: 'migrations',
    migrationsTransactionMode: 'each',
    synchronize: false,
    logging: false,
    poolSize: config.DB_POOL_SIZE,
    connectTimeout: 5_000,
    extra: { enableKeepAlive: true },
  });
}
