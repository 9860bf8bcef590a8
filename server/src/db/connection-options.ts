import 'reflect-metadata';
import { DataSource } from 'typeorm';
import type { AppConfig } from '../config/env';
import { entities } from './entities';
import { migrations } from './migrations';

export type DatabaseRole = 'app' | 'migration';

/** A DataSource for the running app (narrow grants) or for migrations (schema owner). */
export function createDataSource(config: AppConfig, role: DatabaseRole = 'app'): DataSource {
  return new DataSource({
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
