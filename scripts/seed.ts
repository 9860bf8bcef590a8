// npm run seed [-- --reset]: seeds the demo scenario when the database is empty; --reset drops
// the database and rebuilds it (schema, grants and demo data).
import { parseArgs } from 'node:util';
import { loadConfig, loadDotEnv } from '../server/src/config/env';
import { bootstrapDatabase } from './lib/bootstrap-database';
import { fail, log } from './lib/run';
import { seedIfEmpty } from './seed/seed-if-empty';

async function main(): Promise<void> {
  const { values } = parseArgs({ options: { reset: { type: 'boolean', default: false } } });
  loadDotEnv();
  const config = loadConfig();
  const server = await bootstrapDatabase(config, { reset: values.reset });
  try {
    const seeded = await seedIfEmpty(config);
    log(seeded ? 'demo scenario seeded' : 'database already holds data; nothing seeded (use --reset to rebuild)');
  } finally {
    await server.stop();
  }
}

main().catch(fail('seed'));
