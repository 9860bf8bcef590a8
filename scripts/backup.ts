// npm run backup [-- --out FILE]: a consistent dump of the app's database, stored documents
// included, gzipped, with a manifest beside it (FILE.manifest.json) stating the ledger chain head,
// the rows of every table and the SHA-256 of every stored document. Starts the project's own
// MariaDB for the run if it is down.
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { loadConfig, loadDotEnv } from '../server/src/config/env';
import { localServerFor } from './lib/bootstrap-database';
import { backupDatabase } from './lib/backup';
import { fail, log } from './lib/run';

async function main(): Promise<void> {
  const { values } = parseArgs({ options: { out: { type: 'string' } } });
  loadDotEnv();
  const config = loadConfig();
  const stamp = new Date().toISOString().replace(/[-:]/g, '').replace(/\..*$/, '');
  const file = resolve(values.out ?? `${config.DATA_DIR}/backups/${config.DB_NAME}-${stamp}.sql.gz`);
  mkdirSync(dirname(file), { recursive: true });
  const server = localServerFor(config);
  await server.start();
  try {
    const manifest = await backupDatabase(server, config, file);
    const tables = Object.keys(manifest.rows).length;
    const rows = Object.values(manifest.rows).reduce((sum, count) => sum + count, 0);
    log(`backup written: ${file}`);
    log(
      `  ${tables} tables, ${rows} rows, ${manifest.documents.length} documents, ledger chain head ` +
        `${manifest.chainHead.seq} ${manifest.chainHead.hash}`,
    );
    log(`  manifest: ${file}.manifest.json (dump SHA-256 ${manifest.dumpSha256})`);
  } finally {
    await server.stop();
  }
}

main().catch(fail('backup'));
