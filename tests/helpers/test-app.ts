import 'reflect-metadata';
import { pino } from 'pino';
import { loadConfig, type AppConfig } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { Database } from '../../server/src/db/database';
import { createApp, type AppOptions, type IngotraceApp } from '../../server/src/app';

export interface TestApp {
  app: IngotraceApp;
  database: Database;
  config: AppConfig;
  close(): Promise<void>;
}

/** The real app against the test profile's MariaDB (or another database when overrides say so). */
export function createTestApp(overrides: Record<string, string> = {}, appOptions: AppOptions = {}): TestApp {
  const config = loadConfig({ ...process.env, ...overrides });
  const database = new Database(createDataSource(config, 'app'));
  const app = createApp(
    { config, database, logger: pino({ level: process.env.TEST_LOG_LEVEL ?? 'silent' }), version: 'test' },
    appOptions,
  );
  return {
    app,
    database,
    config,
    close: async () => {
      await app.shutdown();
      await database.close();
    },
  };
}
