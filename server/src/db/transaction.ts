import type { DataSource, EntityManager } from 'typeorm';
import { AppError } from '../errors';
import { connectionLost, retryDelay, tableWithUnreadableTriggers, transientKind } from './transient-errors';

/**
 * Runs work in one transaction and repeats the whole transaction after a conflict (deadlock,
 * lock-wait time-out, Galera certification conflict) or while the database is briefly
 * unavailable (including a cluster node whose table triggers are briefly unreadable). A connection lost while COMMIT
 * was on its way is not repeated: the change may or
 * may not have been saved, and saving it twice would be worse than saying so.
 */
export async function inTransaction<T>(
  dataSource: DataSource,
  work: (manager: EntityManager) => Promise<T>,
): Promise<T> {
  const started = Date.now();
  for (let attempt = 1; ; attempt++) {
    const runner = dataSource.createQueryRunner();
    let committing = false;
    try {
      await runner.connect();
      await runner.startTransaction();
      const result = await work(runner.manager);
      committing = true;
      await runner.commitTransaction();
      return result;
    } catch (error) {
      if (runner.isTransactionActive) await runner.rollbackTransaction().catch(() => undefined);
      if (committing && connectionLost(error)) {
        throw new AppError(
          'SERVICE_UNAVAILABLE',
          'The connection to the database was lost while this change was being committed; look whether it was ' +
            'saved before repeating it',
        );
      }
      // A Galera node can keep a table's triggers unreadable for some seconds after a certification
      // conflict; the app holds no RELOAD to clear it, so it waits as for a briefly unavailable database.
      const brokenTriggers = tableWithUnreadableTriggers(error) !== null;
      if (brokenTriggers)
        process.emitWarning(
          'a database node reports a table with unreadable triggers; waiting for it to clear',
          'DatabaseNodeWarning',
        );
      const delay = retryDelay(brokenTriggers ? 'unavailable' : transientKind(error), attempt, Date.now() - started);
      if (delay === null) throw error;
      await new Promise((done) => setTimeout(done, delay));
    } finally {
      await runner.release().catch(() => undefined);
    }
  }
}
