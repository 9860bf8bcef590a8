/**
 * The DataSource for TypeORM's command-line tool (migration:create, migration:show). It connects
 * as the migration user. Run it through tsx, e.g.
 *   npx tsx node_modules/typeorm/cli.js migration:show -d server/src/db/data-source.ts
 */
import { loadConfig, loadDotEnv } from '../config/env';
import { createDataSource } from './connection-options';

loadDotEnv();
export default createDataSource(loadConfig(), 'migration');
