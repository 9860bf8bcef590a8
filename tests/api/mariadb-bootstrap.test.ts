import { rmSync } from 'node:fs';
import request from 'supertest';
import { createConnection } from 'mysql2/promise';
import { afterAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/src/config/env';
import { accountsSql } from '../../server/src/db/table-privileges';
import { accountsFor, bootstrapDatabase } from '../../scripts/lib/bootstrap-database';
import { MariadbServer } from '../../scripts/lib/mariadb';
import { createTestApp } from '../helpers/test-app';

// A throwaway MariaDB server of its own, so that stopping it does not disturb the other tests.
const scratchPort = process.env.TEST_SCRATCH_DB_PORT ?? '3309';
const scratchDir = `${process.env.DATA_DIR ?? '.data/test'}/scratch`;
const overrides = { DB_PORT: scratchPort, DB_NAME: 'ingotrace_scratch', DATA_DIR: scratchDir };

async function healthOf(app: ReturnType<typeof createTestApp>) {
  const response = await request(app.app).get('/api/health');
  return { status: response.status, message: response.body.error?.message as string | undefined };
}

describe('the MariaDB bootstrap', () => {
  rmSync(scratchDir, { recursive: true, force: true });
  const config = loadConfig({ ...process.env, ...overrides });
  const server = new MariadbServer({ baseDir: `${scratchDir}/mariadb`, port: config.DB_PORT, relaxedDurability: true });
  const app = createTestApp(overrides);
  afterAll(async () => {
    await app.close();
    await server.stop(true);
  });

  it('when started on a new data folder, then it initialises it and answers on its own port', async () => {
    await server.start();
    expect(await server.isRunning()).toBe(true);
    const version = await server.adminSql('SELECT VERSION();', ['-N', '-B']);
    expect(version).toMatch(/MariaDB/);
    const port = await server.adminSql('SELECT @@port, @@bind_address;', ['-N', '-B']);
    expect(port.trim().split('\t')).toEqual([scratchPort, '127.0.0.1']);
  });

  it('when the accounts exist but nothing is migrated or granted, then health refuses with the reason', async () => {
    await server.adminSql(accountsSql(accountsFor(config)));
    const health = await healthOf(app);
    expect(health.status).toBe(503);
    expect(health.message).toMatch(/^Database refused the app account: ER_DBACCESS_DENIED_ERROR/);
  });

  it(
    'when bootstrapped, then migrations are current, ' + 'health is ok and the app account has only its grants',
    async () => {
      await bootstrapDatabase(config);
      expect(await healthOf(app)).toEqual({ status: 200, message: undefined });

      const connection = await createConnection({
        host: '127.0.0.1',
        port: config.DB_PORT,
        user: config.DB_USER,
        password: config.DB_PASSWORD,
        database: config.DB_NAME,
      });
      try {
        await expect(connection.query("UPDATE migrations SET name = 'x'")).rejects.toThrow(/UPDATE command denied/);
        await expect(connection.query('CREATE TABLE intruder (id INT)')).rejects.toThrow(/CREATE command denied/);
        await expect(connection.query('DROP TABLE organisation')).rejects.toThrow(/DROP command denied/);
        // No global privilege: neither a global read lock nor a flush (both need RELOAD).
        await expect(connection.query('FLUSH TABLES WITH READ LOCK')).rejects.toThrow(/RELOAD/);
        await expect(connection.query('FLUSH LOCAL TABLES organisation')).rejects.toThrow(/RELOAD/);
        const [rows] = await connection.query('SELECT COUNT(*) AS n FROM organisation');
        expect(rows).toEqual([{ n: 0 }]);
      } finally {
        await connection.end();
      }
    },
  );

  it('when a shipped migration has not run, then health names it', async () => {
    await server.adminSql(
      `DELETE FROM \`${config.DB_NAME}\`.migrations WHERE name = 'CreateOrganisation1764633600000';`,
    );
    const health = await healthOf(app);
    expect(health.status).toBe(503);
    expect(health.message).toBe('Database schema is behind: 1 migration(s) not run (CreateOrganisation1764633600000)');
    await server.adminSql(
      `INSERT INTO \`${config.DB_NAME}\`.migrations (timestamp, name) VALUES (1764633600000, ` +
        `'CreateOrganisation1764633600000');`,
    );
  });

  it(
    '[DB-RECOVER] when the server stops, then health says the database is unreachable, and after a restart it ' +
      'recovers by itself',
    async () => {
      await server.stop(true);
      expect(await server.isRunning()).toBe(false);
      const down = await healthOf(app);
      expect(down.status).toBe(503);
      expect(down.message).toMatch(/^Database unreachable/);

      await server.start();
      let health = await healthOf(app);
      for (let attempt = 0; attempt < 20 && health.status !== 200; attempt++) {
        await new Promise((done) => setTimeout(done, 250));
        health = await healthOf(app);
      }
      expect(health.status).toBe(200);
    },
  );
});
