// What inTransaction repeats and what it refuses to repeat, against the real MariaDB: the
// connection is cut from outside with KILL, as a crashed server or a failed cluster node cuts it.
import { afterAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { inTransaction } from '../../server/src/db/transaction';
import { AppError } from '../../server/src/errors';
import { appendLedgerEvent } from '../../server/src/modules/ledger/ledger.repository';
import { adminSql } from '../helpers/admin-sql';

describe('transactions when the connection is lost', () => {
  const config = loadConfig();
  const dataSource = createDataSource(config, 'app');
  afterAll(() => dataSource.destroy());
  const actor = { id: null, name: 'retry test', role: null };
  const eventsFor = async (id: string) =>
    Number(
      (
        await dataSource.query("SELECT COUNT(*) AS n FROM audit_event WHERE action = 'test.retry' AND entity_id = ?", [
          id,
        ])
      )[0].n,
    );

  it(
    '[TXN-RETRY] when the connection is cut before COMMIT, then the whole transaction runs again on a new ' +
      'connection and is saved once',
    async () => {
      await dataSource.initialize();
      const id = `before-commit-${Date.now()}`;
      let attempts = 0;
      await inTransaction(dataSource, async (manager) => {
        attempts += 1;
        await appendLedgerEvent(manager, {
          actor,
          action: 'test.retry',
          entity: { type: 'test', id },
          after: { attempts },
        });
        if (attempts === 1) {
          const [{ connection }] = await manager.query('SELECT CONNECTION_ID() AS connection');
          await adminSql(`KILL ${Number(connection)}`);
          await manager.query('SELECT 1');
        }
      });
      expect(attempts).toBe(2);
      expect(await eventsFor(id)).toBe(1);
    },
  );

  it(
    '[TXN-COMMIT-CUT] when the connection is cut while COMMIT is on its way, then nothing is repeated and the ' +
      'caller is told to look before repeating',
    async () => {
      const id = `at-commit-${Date.now()}`;
      let attempts = 0;
      const outcome = inTransaction(dataSource, async (manager) => {
        attempts += 1;
        await appendLedgerEvent(manager, {
          actor,
          action: 'test.retry',
          entity: { type: 'test', id },
          after: { attempts },
        });
        const [{ connection }] = await manager.query('SELECT CONNECTION_ID() AS connection');
        await adminSql(`KILL ${Number(connection)}`);
      });
      const error = await outcome.catch((caught: unknown) => caught);
      expect(error).toBeInstanceOf(AppError);
      expect((error as AppError).status).toBe(503);
      expect((error as AppError).message).toMatch(/look whether it was saved before repeating it/);
      expect(attempts).toBe(1);
      // The server rolled the cut transaction back: the event is absent, not half-written.
      expect(await eventsFor(id)).toBe(0);
    },
  );

  it('when the work itself fails, then it is not repeated', async () => {
    let attempts = 0;
    await expect(
      inTransaction(dataSource, async () => {
        attempts += 1;
        throw AppError.rule('not a database failure');
      }),
    ).rejects.toThrow('not a database failure');
    expect(attempts).toBe(1);
  });
});
