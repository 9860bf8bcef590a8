// npm run test:faults: crashes under load, and what survives them. In its own MariaDB (port
// 3311, full durability) and with the app as a separate process, writers keep creating records
// (a supplier and its ledger event per write) while the database server is killed with SIGKILL
// and restarted, and then the app is killed with SIGKILL mid-request and mid-upload and
// restarted. Afterwards every acknowledged write must be present, no record may lack its ledger
// event (nor an event its record), the ledger chain must verify, the app must have answered
// health again by itself, and no half-received upload may have left anything behind.
import type { ChildProcess } from 'node:child_process';
import http from 'node:http';
import { readFileSync } from 'node:fs';
import type { Express } from 'express';
import { loadConfig, loadDotEnv, testProfileEnvironment } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { verifyLedger } from '../../server/src/modules/ledger/ledger-verification';
import { csrfTokenOf, SamlTestDriver } from '../../tests/helpers/saml-round-trip';
import { bootstrapDatabase } from '../lib/bootstrap-database';
import { fail, log } from '../lib/run';
import { seedIfEmpty } from '../seed/seed-if-empty';
import { reportChecks, startAppProcess, untilHealthy } from './app-process';

const WRITES = Number(process.env.FAULT_WRITES ?? 1000);
const WRITERS = 4;

loadDotEnv();
Object.assign(process.env, testProfileEnvironment(), {
  DATA_DIR: '.data/faults',
  DB_PORT: '3311',
  DB_NAME: 'ingotrace_faults',
  PORT: '8093',
  LOG_LEVEL: 'error',
  SMTP_PORT: '1029',
  MAIL_WEB_PORT: '1082',
  IDP_PORT: '7013',
});
const config = loadConfig();
const base = `http://127.0.0.1:${config.PORT}`;
const sleep = (ms: number) => new Promise((done) => setTimeout(done, ms));

function killHard(pid: number, what: string): void {
  process.kill(pid, 'SIGKILL');
  log(`  SIGKILL sent to ${what} (pid ${pid})`);
}

async function main(): Promise<void> {
  const server = await bootstrapDatabase(config, { reset: true });
  const admin = createDataSource(config, 'migration');
  let app: ChildProcess | null = null;
  try {
    await seedIfEmpty(config);
    const saml = await SamlTestDriver.create(config);
    app = startAppProcess();
    log(`app started; healthy after ${await untilHealthy(base)} ms`);

    const approver = await saml.signIn(base as unknown as Express, 'kiw-0301');
    const engineer = await saml.signIn(base as unknown as Express, 'kiw-0101');
    const approverCsrf = await csrfTokenOf(approver.agent);
    const engineerCsrf = await csrfTokenOf(engineer.agent);

    // Writers: each write is acknowledged only when the app answered 201.
    const acknowledged: string[] = [];
    let attempts = 0;
    let failures = 0;
    let next = 0;
    const writer = async () => {
      while (acknowledged.length < WRITES) {
        const name = `Fault writer ${next++}`;
        attempts += 1;
        try {
          const response = await fetch(`${base}/api/suppliers`, {
            method: 'POST',
            headers: { cookie: approver.cookie, 'x-csrf-token': approverCsrf, 'content-type': 'application/json' },
            body: JSON.stringify({
              name,
              country: 'Nowhere',
              approval: 'approved',
              reason: 'written while faults are injected',
            }),
            signal: AbortSignal.timeout(10_000),
          });
          if (response.status === 201) acknowledged.push(name);
          else {
            failures += 1;
            await sleep(20);
          }
        } catch {
          failures += 1;
          await sleep(50);
        }
      }
    };
    const writing = Promise.all(Array.from({ length: WRITERS }, writer));
    const reached = async (count: number) => {
      while (acknowledged.length < count) await sleep(10);
    };

    // 1. The database server, mid-write.
    await reached(Math.floor(WRITES * 0.3));
    const dbPid = Number(readFileSync(`${config.DATA_DIR}/mariadb/mariadbd.pid`, 'utf8').trim());
    killHard(dbPid, 'mariadbd');
    await sleep(1_000);
    const restartedAt = Date.now();
    await server.start();
    const dbRecoveryMs = await untilHealthy(base);
    log(
      `  MariaDB restarted in ${Date.now() - restartedAt - dbRecoveryMs} ms; the app answered health ` +
        `${dbRecoveryMs} ms later`,
    );

    // 2. The app, mid-request.
    await reached(Math.floor(WRITES * 0.6));
    killHard(app.pid!, 'the app');
    await sleep(300);
    app = startAppProcess();
    const appRecoveryMs = await untilHealthy(base);
    log(`  app restarted; healthy after ${appRecoveryMs} ms (the session in MariaDB still signs the writers in)`);

    // 3. The app, mid-upload of a certificate that never finishes arriving.
    const [heat] = await admin.initialize().then(() => admin.query('SELECT id FROM heat ORDER BY id LIMIT 1'));
    const documentsBefore = Number((await admin.query('SELECT COUNT(*) AS n FROM certificate_document'))[0].n);
    const boundary = 'faultboundary';
    const upload = http.request(`${base}/api/heats/${heat.id}/certificates`, {
      method: 'POST',
      headers: {
        cookie: engineer.cookie,
        'x-csrf-token': engineerCsrf,
        'content-type': `multipart/form-data; boundary=${boundary}`,
        'content-length': String(4 * 1024 * 1024),
      },
    });
    upload.on('error', () => undefined);
    upload.write(
      `--${boundary}\r\nContent-Disposition: form-data; name="certificate"; ` +
        `filename="half.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.4\n`,
    );
    for (let chunk = 0; chunk < 4; chunk += 1) {
      upload.write(Buffer.alloc(256 * 1024, 0x20));
      await sleep(100);
    }
    await reached(Math.floor(WRITES * 0.8));
    killHard(app.pid!, 'the app, mid-upload');
    upload.destroy();
    await sleep(300);
    app = startAppProcess();
    const uploadRecoveryMs = await untilHealthy(base);
    log(`  app restarted after the cut upload; healthy after ${uploadRecoveryMs} ms`);

    await writing;
    log(
      `writes: ${attempts} attempted, ${acknowledged.length} acknowledged, ${failures} failed or refused ` +
        `while something was down`,
    );

    // The checks.
    const stored = new Set<string>(
      (await admin.query("SELECT name FROM supplier WHERE name LIKE 'Fault writer %'")).map(
        (row: { name: string }) => row.name,
      ),
    );
    const missing = acknowledged.filter((name) => !stored.has(name));
    const withoutEvent = await admin.query(
      'SELECT s.id FROM supplier s WHERE NOT EXISTS (SELECT 1 FROM audit_event e WHERE e.action = ' +
        "'supplier.created' AND e.entity_type = 'supplier' AND e.entity_id = CAST(s.id AS CHAR))",
    );
    const eventWithoutRecord = await admin.query(
      "SELECT e.seq FROM audit_event e WHERE e.action = 'supplier.created' AND NOT EXISTS (SELECT 1 FROM " +
        'supplier s WHERE CAST(s.id AS CHAR) = e.entity_id)',
    );
    const documentsAfter = Number((await admin.query('SELECT COUNT(*) AS n FROM certificate_document'))[0].n);
    const orphanDocuments = await admin.query(
      'SELECT d.id FROM certificate_document d WHERE NOT EXISTS (SELECT 1 FROM heat_certificate c WHERE ' +
        'c.document_id = d.id) AND NOT EXISTS (SELECT 1 FROM operation_file f WHERE f.document_id = d.id)',
    );
    const ledger = await verifyLedger(admin.manager);
    const results = [
      [
        `acknowledged writes found: ${acknowledged.length - missing.length} of ${acknowledged.length}`,
        missing.length === 0,
      ],
      [`suppliers without their ledger event: ${withoutEvent.length}`, withoutEvent.length === 0],
      [`ledger events without their supplier: ${eventWithoutRecord.length}`, eventWithoutRecord.length === 0],
      [
        `documents before/after the cut upload: ${documentsBefore}/${documentsAfter}; documents linked to ` +
          `nothing: ${orphanDocuments.length}`,
        documentsAfter === documentsBefore && orphanDocuments.length === 0,
      ],
      [ledger.summary, ledger.ok],
      [
        `health again after the database restart: ${dbRecoveryMs} ms; after app restarts: ${appRecoveryMs} ` +
          `and ${uploadRecoveryMs} ms`,
        dbRecoveryMs < 30_000,
      ],
    ] as const;
    reportChecks(results);
  } finally {
    if (app && app.exitCode === null) app.kill('SIGKILL');
    if (admin.isInitialized) await admin.destroy();
    await server.stop();
  }
}

main()
  .then(() => process.exit(process.exitCode ?? 0))
  .catch(fail('test:faults'));
