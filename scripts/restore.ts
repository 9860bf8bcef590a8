// npm run restore -- --from FILE [--database NAME]: loads a backup made by `npm run backup` into a
// new database (by default the configured one, which must not hold tables), gives the app account
// its grants there, verifies the ledger chain and checks that chain head, rows per table and every
// document's SHA-256 are identical to the backup's manifest. Exits 1 naming each difference.
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { loadConfig, loadDotEnv } from '../server/src/config/env';
import { localServerFor } from './lib/bootstrap-database';
import { restoreDatabase } from './lib/backup';
import { fail, log } from './lib/run';

async function main(): Promise<void> {
  const { values } = parseArgs({ options: { from: { type: 'string' }, database: { type: 'string' } } });
  if (!values.from) throw new Error('name the backup: npm run restore -- --from FILE [--database NAME]');
  const file = resolve(values.from);
  if (!existsSync(file)) throw new Error(`${file} does not exist`);
  if (!existsSync(`${file}.manifest.json`))
    throw new Error(`${file}.manifest.json is missing; a backup is restored with its manifest`);
  loadDotEnv();
  const config = loadConfig();
  const database = values.database ?? config.DB_NAME;
  if (!/^[A-Za-z0-9_]{1,64}$/.test(database)) throw new Error('--database: letters, digits and _ only, at most 64');
  const server = localServerFor(config);
  await server.start();
  try {
    const result = await restoreDatabase(server, config, file, database);
    log(`restored ${file} into ${database}: ${result.ledger}`);
    if (result.differences.length) {
      for (const difference of result.differences) log(`  differs: ${difference}`);
      process.exitCode = 1;
    } else {
      log('  chain head, rows of every table and every document hash are identical to the backup');
    }
  } finally {
    await server.stop();
  }
}

main().catch(fail('restore'));
