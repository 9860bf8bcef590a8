// Backup and restore of the app's database, documents included (they are stored in it): a
// consistent mariadb-dump, gzipped, with a manifest of what it holds (ledger chain head, rows per
// table, every stored document's SHA-256), so that a restore can prove that it brought back
// exactly that.
import { createHash } from 'node:crypto';
import { spawn } from 'node:child_process';
import { createReadStream, createWriteStream, readFileSync, writeFileSync } from 'node:fs';
import { pipeline } from 'node:stream/promises';
import { createGunzip, createGzip } from 'node:zlib';
import type { DataSource } from 'typeorm';
import type { AppConfig } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { accountsSql, sqlString } from '../../server/src/db/table-privileges';
import { verifyLedger } from '../../server/src/modules/ledger/ledger-verification';
import { accountsFor, applyAppGrants } from './bootstrap-database';
import { readWitnessFile, witnessFilePath } from '../../server/src/modules/ledger/ledger-checkpoints';
import type { MariadbServer } from './mariadb';

/** Tables that hold working state rather than records (sessions, sign-in handshakes); their rows may differ. */
const workingStateTables = new Set(['http_session', 'saml_request', 'saml_assertion_used', 'reauthentication']);

/** Tables whose rows carry a document and its SHA-256. */
const documentTables = ['certificate_document', 'release_packet'];

export interface BackupManifest {
  format: 'ingotrace-backup/1';
  database: string;
  takenAt: string;
  dumpFile: string;
  dumpSha256: string;
  chainHead: { seq: number; hash: string };
  rows: Record<string, number>;
  /** Each stored document: its table, id, the SHA-256 it is stored under and that of its bytes. */
  documents: Array<{ table: string; id: number; sha256: string; contentSha256: string }>;
}

export type DatabaseContent = Pick<BackupManifest, 'chainHead' | 'rows' | 'documents'>;

/** What the database holds, read in the caller's transaction (one consistent snapshot). */
export async function readContent(dataSource: DataSource | import('typeorm').EntityManager): Promise<DatabaseContent> {
  const tables: Array<{ name: string }> = await dataSource.query(
    'SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type ' +
      "= 'BASE TABLE' ORDER BY table_name",
  );
  const rows: Record<string, number> = {};
  for (const { name } of tables) {
    if (workingStateTables.has(name)) continue;
    const [count] = await dataSource.query(`SELECT COUNT(*) AS n FROM \`${name}\``);
    rows[name] = Number(count.n);
  }
  const [head] = await dataSource.query('SELECT seq, hash FROM audit_chain_head WHERE id = 1');
  const documents: DatabaseContent['documents'] = [];
  for (const table of documentTables) {
    const found: Array<{ id: number; sha256: string; contentSha256: string }> = await dataSource.query(
      `SELECT id, sha256, SHA2(content, 256) AS contentSha256 FROM \`${table}\` ORDER BY id`,
    );
    documents.push(...found.map((row) => ({ table, ...row })));
  }
  return { chainHead: { seq: Number(head.seq), hash: head.hash }, rows, documents };
}

/** Differences between what a backup held and what a database holds, in words; empty when identical. */
export function compareContent(expected: DatabaseContent, actual: DatabaseContent): string[] {
  const differences: string[] = [];
  if (expected.chainHead.seq !== actual.chainHead.seq || expected.chainHead.hash !== actual.chainHead.hash) {
    differences.push(
      `ledger chain head: expected ${expected.chainHead.seq} ${expected.chainHead.hash}, found ` +
        `${actual.chainHead.seq} ${actual.chainHead.hash}`,
    );
  }
  for (const table of new Set([...Object.keys(expected.rows), ...Object.keys(actual.rows)])) {
    if (expected.rows[table] !== actual.rows[table])
      differences.push(
        `table ${table}: expected ${expected.rows[table] ?? 'no table'} rows, found ` +
          `${actual.rows[table] ?? 'no table'}`,
      );
  }
  const found = new Map(actual.documents.map((document) => [`${document.table}/${document.id}`, document]));
  for (const document of expected.documents) {
    const restored = found.get(`${document.table}/${document.id}`);
    if (!restored) differences.push(`document ${document.table}/${document.id} is missing`);
    else if (restored.contentSha256 !== document.contentSha256)
      differences.push(
        `document ${document.table}/${document.id}: its bytes differ (SHA-256 ${restored.contentSha256}, ` +
          `expected ${document.contentSha256})`,
      );
  }
  for (const document of actual.documents) {
    if (document.contentSha256 !== document.sha256)
      differences.push(
        `document ${document.table}/${document.id}: its bytes do not match the SHA-256 it is stored under`,
      );
  }
  return differences;
}

/** Runs a command, with its standard output sent through `output` and its input read from `input`. */
function run(
  command: string,
  args: string[],
  io: { output?: (stream: NodeJS.ReadableStream) => Promise<void>; input?: NodeJS.ReadableStream },
): Promise<void> {
  return new Promise((resolveRun, rejectRun) => {
    const child = spawn(command, args, {
      stdio: [io.input ? 'pipe' : 'ignore', io.output ? 'pipe' : 'ignore', 'pipe'],
    });
    let errors = '';
    child.stderr!.on('data', (chunk: Buffer) => (errors += chunk.toString()));
    const piping: Array<Promise<void>> = [];
    if (io.output) piping.push(io.output(child.stdout!));
    if (io.input) piping.push(pipeline(io.input, child.stdin!));
    child.once('error', rejectRun);
    child.once('close', (code) => {
      Promise.all(piping).then(
        () =>
          code === 0
            ? resolveRun()
            : rejectRun(new Error(`${command.split('/').at(-1)} exited with ${code}: ${errors.trim()}`)),
        rejectRun,
      );
    });
  });
}

const sha256Of = (file: string) => createHash('sha256').update(readFileSync(file)).digest('hex');

/**
 * Dumps the database to `file` (gzipped SQL) and writes `file`.manifest.json. Record writes wait
 * for a moment while both snapshots open: every record is written with its ledger event under
 * the lock of the chain head, which the backup holds until the dump's own snapshot has begun, so
 * that the manifest describes exactly what the dump holds.
 */
export async function backupDatabase(server: MariadbServer, config: AppConfig, file: string): Promise<BackupManifest> {
  const lockHolder = createDataSource(config, 'migration');
  const reader = createDataSource(config, 'migration');
  await Promise.all([lockHolder.initialize(), reader.initialize()]);
  const lock = lockHolder.createQueryRunner();
  const snapshot = reader.createQueryRunner();
  let snapshotOpen = false;
  try {
    await lock.startTransaction();
    await lock.query('SELECT seq FROM audit_chain_head WHERE id = 1 FOR UPDATE');
    await snapshot.query('SET SESSION TRANSACTION ISOLATION LEVEL REPEATABLE READ');
    await snapshot.query('START TRANSACTION WITH CONSISTENT SNAPSHOT');
    snapshotOpen = true;
    const dumping = run(
      server.tool('mariadb-dump'),
      server.clientArgs([
        '--single-transaction',
        '--quick',
        '--hex-blob',
        '--triggers',
        '--routines',
        '--skip-lock-tables',
        config.DB_NAME,
      ]),
      {
        output: (stream) => pipeline(stream, createGzip(), createWriteStream(file)),
      },
    );
    // Should the dump fail before its snapshot opens, the wait below must not outlive it.
    dumping.catch(() => undefined);
    await waitForDumpSnapshot(server);
    await lock.commitTransaction();
    const content = await readContent(snapshot.manager);
    await snapshot.query('COMMIT');
    snapshotOpen = false;
    await dumping;
    const manifest: BackupManifest = {
      format: 'ingotrace-backup/1',
      database: config.DB_NAME,
      takenAt: new Date().toISOString(),
      dumpFile: file.split('/').at(-1)!,
      dumpSha256: sha256Of(file),
      ...content,
    };
    writeFileSync(`${file}.manifest.json`, `${JSON.stringify(manifest, null, 2)}\n`);
    return manifest;
  } finally {
    if (lock.isTransactionActive) await lock.rollbackTransaction();
    if (snapshotOpen) await snapshot.query('ROLLBACK');
    await lock.release();
    await snapshot.release();
    await Promise.all([lockHolder.destroy(), reader.destroy()]);
  }
}

/** Waits until mariadb-dump's transaction (the administrator's, over the socket) has opened its snapshot. */
async function waitForDumpSnapshot(server: MariadbServer): Promise<void> {
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    const open = await server.adminSql(
      'SELECT COUNT(*) FROM information_schema.innodb_trx t JOIN information_schema.processlist p ON p.id = ' +
        "t.trx_mysql_thread_id WHERE p.host = 'localhost' AND p.user = SUBSTRING_INDEX(CURRENT_USER(), '@', 1) " +
        "AND p.id <> CONNECTION_ID() AND t.trx_isolation_level = 'REPEATABLE READ';",
      ['-N', '-B'],
    );
    if (Number(open.trim()) > 0) return;
    await new Promise((done) => setTimeout(done, 20));
  }
  throw new Error('mariadb-dump did not start its transaction within 30 s');
}

/**
 * Loads a backup into `database` (created; refused when it exists and holds tables), gives the
 * app account its grants there, verifies the ledger chain and compares what it holds with the
 * backup's manifest. Returns the differences (none when the restore is exact).
 */
export async function restoreDatabase(
  server: MariadbServer,
  config: AppConfig,
  file: string,
  database: string,
): Promise<{ differences: string[]; ledger: string }> {
  const manifest = JSON.parse(readFileSync(`${file}.manifest.json`, 'utf8')) as BackupManifest;
  if (manifest.format !== 'ingotrace-backup/1')
    throw new Error(`${file}.manifest.json is not an Ingotrace backup manifest`);
  if (sha256Of(file) !== manifest.dumpSha256)
    throw new Error(`${file} does not match the SHA-256 in its manifest; the file was changed or cut short`);
  const tables = await server.adminSql(
    `SELECT COUNT(*) FROM information_schema.tables WHERE table_schema = ${sqlString(database)};`,
    ['-N', '-B'],
  );
  if (Number(tables.trim()) > 0)
    throw new Error(`database ${database} already holds tables; restore into a new database, or drop it first`);
  const target = { ...config, DB_NAME: database };
  await server.adminSql(accountsSql(accountsFor(target)));
  await run(server.tool('mariadb'), server.clientArgs([database]), {
    input: createReadStream(file).pipe(createGunzip()),
  });
  await applyAppGrants(server, target);
  const restored = createDataSource(target, 'app');
  await restored.initialize();
  try {
    // Checkpoints of the target's own ledger: a restore over a ledger checkpointed after the backup is reported as cut
    // off.
    const verification = await verifyLedger(restored.manager, {
      checkpoints: readWitnessFile(witnessFilePath(target)),
    });
    const differences = compareContent(manifest, await readContent(restored));
    if (!verification.ok) differences.unshift(`ledger: ${verification.summary}`);
    return { differences, ledger: verification.summary };
  } finally {
    await restored.destroy();
  }
}
