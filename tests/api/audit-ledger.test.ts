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
import { canonicalJson, ledgerHashInput } from '../../shared/domain/ledger-hash';
import { sha256Hex } from '../../server/src/modules/ledger/ledger.repository';
import { checkpointStatement } from '../../server/src/modules/ledger/ledger-checkpoints';
import { eventStatement, keyIdOf, ledgerSigner } from '../../server/src/modules/ledger/ledger-signing-key';
import { generateKeyPairSync, sign } from 'node:crypto';
import { adminSql } from '../helpers/admin-sql';

function ingotrace(...args: string[]) {
  const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', ...args], { encoding: 'utf8', env: process.env });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

describe('the audit ledger', () => {
  const config = loadConfig({ ...process.env, DB_POOL_SIZE: '20' });
  const dataSource = createDataSource(config, 'app');
  afterAll(() => dataSource.destroy());

  it(
    '[LEDGER-APPEND-ONLY] when the app account tries to UPDATE, DELETE or TRUNCATE the ledger, then MariaDB ' +
      'refuses',
    async () => {
      const connection = await createConnection({
        host: '127.0.0.1',
        port: config.DB_PORT,
        user: config.DB_USER,
        password: config.DB_PASSWORD,
        database: config.DB_NAME,
      });
      try {
        await expect(connection.query("UPDATE audit_event SET reason = 'x' WHERE seq = 1")).rejects.toThrow(
          /UPDATE command denied to user 'ingotrace_app'/,
        );
        await expect(connection.query('DELETE FROM audit_event WHERE seq = 1')).rejects.toThrow(
          /DELETE command denied to user 'ingotrace_app'/,
        );
        await expect(connection.query('TRUNCATE TABLE audit_event')).rejects.toThrow(/DROP command denied/);
        await expect(connection.query("UPDATE electronic_signature SET reason = 'x'")).rejects.toThrow(
          /UPDATE command denied/,
        );
      } finally {
        await connection.end();
      }
    },
  );

  it(
    '[LEDGER-TRIGGERS] when even the schema owner tries to ' + 'change or delete an event, then the triggers refuse',
    async () => {
      const connection = await createConnection({
        host: '127.0.0.1',
        port: config.DB_PORT,
        user: config.DB_MIGRATION_USER,
        password: config.DB_MIGRATION_PASSWORD,
        database: config.DB_NAME,
      });
      try {
        await expect(connection.query("UPDATE audit_event SET reason = 'x' WHERE seq = 1")).rejects.toThrow(
          'audit_event is append-only: rows cannot be changed',
        );
        await expect(connection.query('DELETE FROM audit_event WHERE seq = 1')).rejects.toThrow(
          'audit_event is append-only: rows cannot be deleted',
        );
      } finally {
        await connection.end();
      }
    },
  );

  it(
    '[LEDGER-NO-FORK] when 20 connections each write 50 events at once, then the chain does not fork and ' + 'verifies',
    async () => {
      await dataSource.initialize();
      const before = await verifyLedger(dataSource.manager);
      expect(before.ok).toBe(true);
      await Promise.all(
        Array.from({ length: 20 }, async (_unused, writer) => {
          for (let index = 0; index < 50; index++) {
            await inTransaction(dataSource, (manager) =>
              appendLedgerEvent(manager, {
                actor: { id: null, name: `writer ${writer}`, role: null },
                action: 'test.concurrent-write',
                entity: { type: 'test', id: `${writer}-${index}` },
                after: { writer, index },
              }),
            );
          }
        }),
      );
      const after = await verifyLedger(dataSource.manager);
      expect(after.summary).toMatch(/^audit trail verified/);
      expect(after.events).toBe(before.events + 1000);
      expect(after.chainHead.seq).toBe(before.chainHead.seq + 1000);
      const [{ seqs }] = await dataSource.query(
        "SELECT COUNT(DISTINCT seq) AS seqs FROM audit_event WHERE action = 'test.concurrent-write'",
      );
      expect(Number(seqs)).toBe(1000);
    },
  );

  it('[LEDGER-VERIFY-CLI] when the CLI verifies the ledger, then it prints one summary line and exits 0', () => {
    const result = ingotrace('audit', 'verify');
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
    expect(result.stdout).toMatch(
      /^audit trail verified: \d+ events, \d+ signatures, chain head \d+ [0-9a-f]{64}; \d+ events signed with key [0-9a-f]{16}, \d+ checkpoints hold \(\d+ ms\)\n$/,
    );
  });

  it(
    '[LEDGER-TAMPER-NAMED] when an administrator changes one row behind the triggers, then verify names exactly ' +
      'that sequence number',
    async () => {
      const [victim] = await dataSource.query(
        "SELECT seq, reason FROM audit_event WHERE action = 'test.concurrent-write' ORDER BY seq LIMIT 1 OFFSET 500",
      );
      const seq = Number(victim.seq);
      const restoreTrigger =
        `CREATE TRIGGER audit_event_refuse_update BEFORE UPDATE ON audit_event FOR EACH ROW SIGNAL SQLSTATE ` +
        `'45000' SET MESSAGE_TEXT = 'audit_event is append-only: rows cannot be changed';`;
      await adminSql(
        `DROP TRIGGER audit_event_refuse_update; UPDATE audit_event SET reason = 'quietly edited' WHERE seq = ` +
          `${seq}; ${restoreTrigger}`,
      );
      try {
        const result = ingotrace('audit', 'verify');
        expect(result.code).toBe(1);
        expect(result.stderr).toBe(
          `ingotrace: audit trail BROKEN at event ${seq}: its content no longer matches its hash\n`,
        );
      } finally {
        await adminSql(
          `DROP TRIGGER audit_event_refuse_update; UPDATE audit_event SET reason = NULL WHERE seq = ${seq}; ` +
            `${restoreTrigger}`,
        );
      }
      expect(ingotrace('audit', 'verify').code).toBe(0);
    },
  );

  it(
    '[LEDGER-EXPORT-OFFLINE] when the ledger is exported, then the file verifies offline, and a changed event ' +
      'in it is named',
    () => {
      const folder = mkdtempSync(join(tmpdir(), 'ingotrace-export-'));
      const file = join(folder, 'ledger.json');
      const exported = ingotrace('audit', 'export', '--out', file);
      expect(exported.code).toBe(0);
      expect(exported.stdout).toMatch(/^exported \d+ events to .*ledger\.json, chain head \d+ [0-9a-f]{64}\n$/);
      const verified = ingotrace('audit', 'verify', '--file', file);
      expect(verified.code).toBe(0);
      expect(verified.stdout).toMatch(/^export verified: \d+ events/);

      const bundle = JSON.parse(readFileSync(file, 'utf8'));
      expect(Object.keys(bundle).sort()).toEqual(['chainHead', 'events', 'exportedAt', 'format', 'keyId', 'publicKey']);
      const target = bundle.events[3];
      target.content.after = { tampered: true };
      const tamperedFile = join(folder, 'tampered.json');
      writeFileSync(tamperedFile, JSON.stringify(bundle));
      const refused = ingotrace('audit', 'verify', '--file', tamperedFile);
      expect(refused.code).toBe(1);
      expect(refused.stderr).toBe(
        `ingotrace: export BROKEN at event ${target.seq}: its content no longer matches its hash\n`,
      );

      writeFileSync(join(folder, 'garbage.json'), '{"hello": 1}');
      const garbage = ingotrace('audit', 'verify', '--file', join(folder, 'garbage.json'));
      expect(garbage.code).toBe(1);
      expect(garbage.stderr).toContain('not an Ingotrace audit trail export');
      const missing = ingotrace('audit', 'verify', '--file', join(folder, 'absent.json'));
      expect(missing.code).toBe(2);
      expect(missing.stderr).toMatch(/^ingotrace: cannot read .*absent\.json/);
    },
  );

  /**
   * Appends one event as an intruder holding the app's database account would: a correctly recomputed chain, and
   * whatever signature he can make.
   */
  async function forgeAppend(signature: (hash: string) => { signature: string | null; keyId: string | null }) {
    const connection = await createConnection({
      host: '127.0.0.1',
      port: config.DB_PORT,
      user: config.DB_USER,
      password: config.DB_PASSWORD,
      database: config.DB_NAME,
      timezone: 'Z',
    });
    try {
      const [[head]] = (await connection.query('SELECT seq, hash FROM audit_chain_head WHERE id = 1')) as unknown as [
        Array<{ seq: string; hash: string }>,
      ];
      const occurredAt = new Date();
      const content = {
        seq: Number(head!.seq) + 1,
        occurredAt: occurredAt.toISOString(),
        actor: { id: null, name: 'Joaquín Ferreira', role: 'qa-approver' },
        action: 'heat.accepted',
        entity: { type: 'heat', id: '1' },
        before: null,
        after: { status: 'accepted' },
        reason: null,
        requestId: null,
        clientAddress: null,
      };
      const hash = sha256Hex(ledgerHashInput(head!.hash, content));
      const signed = signature(hash);
      await connection.query(
        'INSERT INTO audit_event (seq, occurred_at, actor_id, actor_name, actor_role, action, entity_type, ' +
          'entity_id, before_json, after_json, reason, request_id, client_address, previous_hash, hash, ' +
          'signature, key_id) VALUES (?, ?, NULL, ?, ?, ?, ?, ?, NULL, ?, NULL, NULL, NULL, ?, ?, ?, ?)',
        [
          content.seq,
          occurredAt,
          content.actor.name,
          content.actor.role,
          content.action,
          content.entity.type,
          content.entity.id,
          canonicalJson(content.after),
          head!.hash,
          hash,
          signed.signature,
          signed.keyId,
        ],
      );
      await connection.query('UPDATE audit_chain_head SET seq = ?, hash = ? WHERE id = 1', [content.seq, hash]);
      return { seq: content.seq, previous: head! };
    } finally {
      await connection.end();
    }
  }
  /**
   * Takes a forged event out again (behind the triggers, as the database administrator) so the shared ledger verifies
   * for the other suites.
   */
  async function removeForged(forged: { seq: number; previous: { seq: string; hash: string } }) {
    const restoreTrigger =
      `CREATE TRIGGER audit_event_refuse_delete BEFORE DELETE ON audit_event FOR EACH ROW SIGNAL SQLSTATE ` +
      `'45000' SET MESSAGE_TEXT = 'audit_event is append-only: rows cannot be deleted';`;
    await adminSql(
      `DROP TRIGGER audit_event_refuse_delete; DELETE FROM audit_event WHERE seq = ${forged.seq}; ` +
        `${restoreTrigger} UPDATE audit_chain_head SET seq = ${forged.previous.seq}, hash = ` +
        `'${forged.previous.hash}' WHERE id = 1;`,
    );
  }

  it(
    '[LEDGER-FORGED-APPEND] when an event is appended through the app’s database account with a correctly ' +
      'recomputed chain, then verification names it: unsigned, or signed with a key that is not the ledger’s',
    async () => {
      const unsigned = await forgeAppend(() => ({ signature: null, keyId: null }));
      try {
        const result = ingotrace('audit', 'verify');
        expect(result.code).toBe(1);
        expect(result.stderr).toMatch(
          new RegExp(
            `^ingotrace: audit trail BROKEN at event ${unsigned.seq}: it is not signed, although the audit ` +
              `trail is signed from event \\d+ on\\n$`,
          ),
        );
      } finally {
        await removeForged(unsigned);
      }
      const intruderKey = generateKeyPairSync('ed25519').privateKey;
      const realKeyId = ledgerSigner().keyId;
      const wrongKey = await forgeAppend((hash) => ({
        signature: sign(null, Buffer.from(eventStatement(hash)), intruderKey).toString('base64'),
        keyId: realKeyId,
      }));
      try {
        expect(ingotrace('audit', 'verify').stderr).toBe(
          `ingotrace: audit trail BROKEN at event ${wrongKey.seq}: its signature does not verify with the audit ` +
            `trail's public key\n`,
        );
      } finally {
        await removeForged(wrongKey);
      }
      expect(ingotrace('audit', 'verify').code).toBe(0);
    },
  );

  it(
    '[LEDGER-EXPORT-FORGED] when an exported bundle is recomputed without the key, or re-signed whole with ' +
      'another key, then offline verification with the published key fails and names where',
    () => {
      const folder = mkdtempSync(join(tmpdir(), 'ingotrace-forged-'));
      const file = join(folder, 'ledger.json');
      expect(ingotrace('audit', 'export', '--out', file).code).toBe(0);
      const bundle = JSON.parse(readFileSync(file, 'utf8'));
      // Change one event and recompute every hash after it, keeping the signatures (the key is not at hand).
      const from = 5;
      bundle.events[from].content.reason = 'rewritten';
      for (let index = from; index < bundle.events.length; index++) {
        const event = bundle.events[index];
        event.previousHash = index === 0 ? '0'.repeat(64) : bundle.events[index - 1].hash;
        event.hash = sha256Hex(ledgerHashInput(event.previousHash, event.content));
      }
      bundle.chainHead = { seq: bundle.events.at(-1).seq, hash: bundle.events.at(-1).hash };
      const rehashed = join(folder, 'rehashed.json');
      writeFileSync(rehashed, JSON.stringify(bundle));
      expect(ingotrace('audit', 'verify', '--file', rehashed).stderr).toBe(
        `ingotrace: export BROKEN at event ${bundle.events[from].seq}: its signature does not verify with the ` +
          `audit trail's public key\n`,
      );
      // Re-sign everything with a key of one's own and put its public key in the file.
      const { privateKey, publicKey } = generateKeyPairSync('ed25519');
      const publicPem = publicKey.export({ type: 'spki', format: 'pem' }).toString();
      for (const event of bundle.events) {
        event.signature = sign(null, Buffer.from(eventStatement(event.hash)), privateKey).toString('base64');
        event.keyId = keyIdOf(publicPem);
      }
      bundle.publicKey = publicPem;
      bundle.keyId = keyIdOf(publicPem);
      const resigned = join(folder, 'resigned.json');
      writeFileSync(resigned, JSON.stringify(bundle));
      const refused = ingotrace('audit', 'verify', '--file', resigned);
      expect(refused.code).toBe(1);
      expect(refused.stderr).toMatch(
        new RegExp(
          `^ingotrace: export BROKEN at event 1: it is signed with another key \\(key ${keyIdOf(publicPem)}, ` +
            `this audit trail's key is ${ledgerSigner().keyId}\\)\\n$`,
        ),
      );
      // Even taking the forger's key as the trusted one, the installation's signed checkpoints refuse the file;
      // only with the forger's key and no witness would it pass — which is why the firm publishes its key and keeps its
      // checkpoints.
      writeFileSync(join(folder, 'forger.pub.pem'), publicPem);
      expect(
        ingotrace('audit', 'verify', '--file', resigned, '--public-key', join(folder, 'forger.pub.pem')).stderr,
      ).toMatch(/is not signed with the audit trail's key\n$/);
      writeFileSync(join(folder, 'no-witness.jsonl'), '');
      expect(
        ingotrace(
          'audit',
          'verify',
          '--file',
          resigned,
          '--public-key',
          join(folder, 'forger.pub.pem'),
          '--witness',
          join(folder, 'no-witness.jsonl'),
        ).code,
      ).toBe(0);
    },
  );

  it(
    '[LEDGER-CUT-OFF] when a checkpoint names an event the ledger no longer holds, or holds with another hash, ' +
      'then verification names it',
    () => {
      const folder = mkdtempSync(join(tmpdir(), 'ingotrace-witness-'));
      const signer = ledgerSigner();
      const checkpoint = (seq: number, hash: string) => {
        const statement = { seq, hash, at: new Date().toISOString(), keyId: signer.keyId, reason: 'daily' };
        return JSON.stringify({ ...statement, signature: signer.signStatement(checkpointStatement(statement)) });
      };
      const beyond = join(folder, 'beyond.jsonl');
      writeFileSync(beyond, `${checkpoint(10_000_000, 'a'.repeat(64))}\n`);
      expect(ingotrace('audit', 'verify', '--witness', beyond).stderr).toMatch(
        /^ingotrace: audit trail BROKEN at event 10000000: the checkpoint of .* names this event, which the audit trail no longer holds: it was cut off after the checkpoint\n$/,
      );
      const rewritten = join(folder, 'rewritten.jsonl');
      writeFileSync(rewritten, `${checkpoint(2, 'b'.repeat(64))}\n`);
      expect(ingotrace('audit', 'verify', '--witness', rewritten).stderr).toMatch(
        /^ingotrace: audit trail BROKEN at event 2: the checkpoint of .* gives this event another hash: the audit trail was rewritten after the checkpoint\n$/,
      );
      const unsignedCheckpoint = join(folder, 'unsigned.jsonl');
      writeFileSync(
        unsignedCheckpoint,
        JSON.stringify({
          seq: 2,
          hash: 'b'.repeat(64),
          at: new Date().toISOString(),
          keyId: signer.keyId,
          reason: 'daily',
          signature: 'AAAA',
        }) + '\n',
      );
      expect(ingotrace('audit', 'verify', '--witness', unsignedCheckpoint).stderr).toMatch(
        /checkpoint of .* is not signed with the audit trail's key/,
      );
    },
  );
});
