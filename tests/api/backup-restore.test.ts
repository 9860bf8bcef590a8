import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { gunzipSync, gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { backupDatabase, restoreDatabase } from '../../scripts/lib/backup';
import { localServerFor } from '../../scripts/lib/bootstrap-database';
import { createDataSource } from '../../server/src/db/connection-options';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';

describe('backup and restore', () => {
  const running = createTestApp();
  const server = localServerFor(running.config);
  const folder = mkdtempSync(`${tmpdir()}/ingotrace-backup-`);
  const restoredName = `${running.config.DB_NAME}_restored`;
  beforeAll(async () => {
    await server.start();
    await server.adminSql(`DROP DATABASE IF EXISTS \`${restoredName}\`;`);
  });
  afterAll(async () => {
    await server.adminSql(`DROP DATABASE IF EXISTS \`${restoredName}\`;`);
    rmSync(folder, { recursive: true, force: true });
    await running.close();
  });

  it(
    '[BACKUP-RESTORE] when backed up while records are being written and restored into a fresh database, then ' +
      'chain head, rows of every table and every document are identical',
    async () => {
      const saml = await SamlTestDriver.create(running.config);
      const { agent } = await saml.signIn(running.app, 'kiw-0301');
      const csrf = await csrfTokenOf(agent);
      // A writer keeps adding suppliers (each with its ledger event) for as long as the backup runs.
      let writing = true;
      let written = 0;
      const writer = (async () => {
        while (writing) {
          const response = await agent
            .post('/api/suppliers')
            .set('X-CSRF-Token', csrf)
            .send({
              name: `Backup writer ${written}`,
              country: 'Nowhere',
              approval: 'approved',
              reason: 'written during a backup',
            });
          expect(response.status).toBe(201);
          written += 1;
        }
      })();
      const file = `${folder}/test.sql.gz`;
      let manifest;
      try {
        manifest = await backupDatabase(server, running.config, file);
      } finally {
        writing = false;
        await writer;
      }
      expect(written).toBeGreaterThan(0);
      expect(manifest.documents.length).toBeGreaterThan(0);
      const result = await restoreDatabase(server, running.config, file, restoredName);
      expect(result.differences).toEqual([]);
      expect(result.ledger).toMatch(/^audit trail verified/);
      expect(result.ledger).toContain(manifest.chainHead.hash);

      // Independently of the manifest: each document's bytes, hashed here, are the same in both databases.
      const restored = createDataSource({ ...running.config, DB_NAME: restoredName }, 'app');
      await restored.initialize();
      try {
        const digest = (rows: Array<{ id: number; content: Buffer }>) =>
          rows.map((row) => `${row.id}:${createHash('sha256').update(row.content).digest('hex')}`);
        const restoredDocuments = digest(
          await restored.query('SELECT id, content FROM certificate_document ORDER BY id'),
        );
        const sourceDocuments = digest(
          await running.database.dataSource.query(
            'SELECT id, content FROM certificate_document WHERE id <= ? ORDER BY id',
            [
              Math.max(
                ...manifest.documents
                  .filter((document) => document.table === 'certificate_document')
                  .map((document) => document.id),
              ),
            ],
          ),
        );
        expect(restoredDocuments).toEqual(sourceDocuments);
      } finally {
        await restored.destroy();
      }
    },
  );

  it(
    '[RESTORE-REFUSE] when the dump was changed, or the target database already holds tables, then the restore ' +
      'refuses with a clear message',
    async () => {
      const file = `${folder}/test.sql.gz`;
      await expect(restoreDatabase(server, running.config, file, restoredName)).rejects.toThrow(
        `database ${restoredName} already holds tables`,
      );
      const changed = `${folder}/changed.sql.gz`;
      writeFileSync(
        changed,
        gzipSync(Buffer.concat([gunzipSync(readFileSync(file)), Buffer.from('\n-- one more line\n')])),
      );
      writeFileSync(`${changed}.manifest.json`, readFileSync(`${file}.manifest.json`));
      await expect(restoreDatabase(server, running.config, changed, `${restoredName}_x`)).rejects.toThrow(
        'does not match the SHA-256 in its manifest',
      );
    },
  );
});
