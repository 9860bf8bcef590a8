import type { Logger } from 'pino';
import type { AppConfig } from './config/env';
import type { Database } from './db/database';

/** What every router and service may need; built once in index.ts (or by a test). */
export interface AppContext {
  config: AppConfig;
  database: Database;
  logger: Logger;
  version: string;
}
