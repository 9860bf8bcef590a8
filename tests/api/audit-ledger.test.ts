import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createConnection } from 'mysql2/promise';
import { afterAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { inTransaction } from '../../server/src/db/transaction';
import { appendLedgerEvent } from '../../server/src/modules/ledger/ledger.repository';
import { verifyLedger } from '../../server/src/modules/ledger/ledger-verification';
import { adminSql } from '../helpers/admin-sql';

function ingotrace(...args: string[]) {
  const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', ...args], { encoding: 'utf8', env: process.env });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

describe('the audit ledger', () => {
  const config = loadConfig({ ...process.env, DB_POOL_SIZE: '20' });
  const dataSource = createDataSource(config, 'app');
  afterAll(() => dataSource.destroy());

  it('[LEDGER-APPEND-ONLY] when the app account tries to UPDATE, DELETE or TRUNCATE the ledger, then MariaDB refuses', async () => {
    const connection = await createConnection({ host: '127.0.0.1', port: config.DB_PORT, user: config.DB_USER, password: config.DB_PASSWORD, database: config.DB_NAME });
    try {
      await expect(connection.query("UPDATE audit_event SET reason = 'x' WHERE seq = 1")).rejects.toThrow(/UPDATE command denied to user 'ingotrace_app'/);
      await expect(connection.query('DELETE FROM audit_event WHERE seq = 1')).rejects.toThrow(/DELETE command denied to user 'ingotrace_app'/);
      await expect(connection.query('TRUNCATE TABLE audit_event')).rejects.toThrow(/DROP command denied/);
      await expect(connection.query("UPDATE electronic_signature SET reason = 'x'")).rejects.toThrow(/UPDATE command denied/);
    } finally {
      await connection.end();
    }
  });

  it('[LEDGER-TRIGGERS] when even the schema owner tries to change or delete an event, then the triggers refuse', async () => {
    const connection = await createConnection({ host: '127.0.0.1', port: config.DB_PORT, user: config.DB_MIGRATION_USER, password: config.DB_MIGRATION_PASSWORD, database: config.DB_NAME });
    try {
      await expect(connection.query("UPDATE audit_event SET reason = 'x' WHERE seq = 1")).rejects.toThrow('audit_event is append-only: rows cannot be changed');
      await expect(connection.query('DELETE FROM audit_event WHERE seq = 1')).rejects.toThrow('audit_event is append-only: rows cannot be deleted');
    } finally {
      await connection.end();
    }
  });

  it('[LEDGER-NO-FORK] when 20 connections each write 50 events at once, then the chain does not fork and verifies', async () => {
    await dataSource.initialize();
    const before = await verifyLedger(dataSource.manager);
    expect(before.ok).toBe(true);
    await Promise.all(
      Array.from({ length: 20 }, async (_unused, writer) => {
        for (let index = 0; index < 50; index++) {
          await inTransaction(dataSource, (manager) =>
            appendLedgerEvent(manager, { actor: { id: null, name: `writer ${writer}`, role: null }, action: 'test.concurrent-write', entity: { type: 'test', id: `${writer}-${index}` }, after: { writer, index } }),
          );
        }
      }),
    );
    const after = await verifyLedger(dataSource.manager);
    expect(after.summary).toMatch(/^ledger verified/);
    expect(after.events).toBe(before.events + 1000);
    expect(after.chainHead.seq).toBe(before.chainHead.seq + 1000);
    const [{ seqs }] = await dataSource.query("SELECT COUNT(DISTINCT seq) AS seqs FROM audit_event WHERE action = 'test.concurrent-write'");
    expect(Number(seqs)).toBe(1000);
  });

  it('[LEDGER-VERIFY-CLI] when the CLI verifies the ledger, then it prints one summary line and exits 0', () => {
    const result = ingotrace('audit', 'verify');
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
    expect(result.stdout).toMatch(/^ledger verified: \d+ events, \d+ signatures, chain head \d+ [0-9a-f]{64} \(\d+ ms\)\n$/);
  });

  it('[LEDGER-TAMPER-NAMED] when an administrator changes one row behind the triggers, then verify names exactly that sequence number', async () => {
    const [victim] = await dataSource.query("SELECT seq, reason FROM audit_event WHERE action = 'test.concurrent-write' ORDER BY seq LIMIT 1 OFFSET 500");
    const seq = Number(victim.seq);
    const restoreTrigger = `CREATE TRIGGER audit_event_refuse_update BEFORE UPDATE ON audit_event FOR EACH ROW SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'audit_event is append-only: rows cannot be changed';`;
    await adminSql(`DROP TRIGGER audit_event_refuse_update; UPDATE audit_event SET reason = 'quietly edited' WHERE seq = ${seq}; ${restoreTrigger}`);
    try {
      const result = ingotrace('audit', 'verify');
      expect(result.code).toBe(1);
      expect(result.stderr).toBe(`ingotrace: ledger BROKEN at event ${seq}: its content no longer matches its hash\n`);
    } finally {
      await adminSql(`DROP TRIGGER audit_event_refuse_update; UPDATE audit_event SET reason = NULL WHERE seq = ${seq}; ${restoreTrigger}`);
    }
    expect(ingotrace('audit', 'verify').code).toBe(0);
  });

  it('[LEDGER-EXPORT-OFFLINE] when the ledger is exported, then the file verifies offline, and a changed event in it is named', () => {
    const folder = mkdtempSync(join(tmpdir(), 'ingotrace-export-'));
    const file = join(folder, 'ledger.json');
    const exported = ingotrace('audit', 'export', '--out', file);
    expect(exported.code).toBe(0);
    expect(exported.stdout).toMatch(/^exported \d+ events to .*ledger\.json, chain head \d+ [0-9a-f]{64}\n$/);
    const verified = ingotrace('audit', 'verify', '--file', file);
    expect(verified.code).toBe(0);
    expect(verified.stdout).toMatch(/^export verified: \d+ events/);

    const bundle = JSON.parse(readFileSync(file, 'utf8'));
    expect(Object.keys(bundle).sort()).toEqual(['chainHead', 'events', 'exportedAt', 'format']);
    const target = bundle.events[3];
    target.content.after = { tampered: true };
    const tamperedFile = join(folder, 'tampered.json');
    writeFileSync(tamperedFile, JSON.stringify(bundle));
    const refused = ingotrace('audit', 'verify', '--file', tamperedFile);
    expect(refused.code).toBe(1);
    expect(refused.stderr).toBe(`ingotrace: export BROKEN at event ${target.seq}: its content no longer matches its hash\n`);

    writeFileSync(join(folder, 'garbage.json'), '{"hello": 1}');
    const garbage = ingotrace('audit', 'verify', '--file', join(folder, 'garbage.json'));
    expect(garbage.code).toBe(1);
    expect(garbage.stderr).toContain('not an Ingotrace ledger export');
    const missing = ingotrace('audit', 'verify', '--file', join(folder, 'absent.json'));
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/^ingotrace: cannot read .*absent\.json/);
  });
});
