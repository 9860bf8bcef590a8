import type { DataSource, EntityManager } from 'typeorm';
import { AppError } from '../errors';
import { connectionLost, retryDelay, tableWithUnreadableTriggers, transientKind } from './transient-errors';

/**
 * Runs work in one transaction and repeats the whole transaction after a conflict (deadlock,
 * lock-wait time-out, Galera certification conflict) or while the database is briefly
 * unavailable. A connection lost while COMMIT was on its way is not repeated: the change may or
 * may not have been saved, and saving it twice would be worse than saying so.
 */
export async function inTransaction<T>(dataSource: DataSource, work: (manager: EntityManager) => Promise<T>): Promise<T> {
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
          'The connection to the database was lost while this change was being committed; look whether it was saved before repeating it',
        );
      }
      const brokenTable = tableWithUnreadableTriggers(error);
      if (brokenTable !== null) {
        // Clear this node's copy of the table ('' names none: clear all), then go again.
        const target = brokenTable ? `\`${brokenTable}\`` : '';
        await runner.query(`SET STATEMENT lock_wait_timeout = 5 FOR FLUSH LOCAL TABLES ${target}`).catch(() => undefined);
        process.emitWarning(`cleared table ${brokenTable || '(all tables)'} on its database node, whose copy had unreadable triggers`, 'DatabaseNodeWarning');
      }
      const delay = retryDelay(brokenTable !== null ? 'conflict' : transientKind(error), attempt, Date.now() - started);
      if (delay === null) throw error;
      await new Promise((done) => setTimeout(done, delay));
    } finally {
      await runner.release().catch(() => undefined);
    }
  }
}
