import type { DataSource, EntityManager } from 'typeorm';

const retryableCodes = new Set(['ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT']);
const MAX_ATTEMPTS = 6;

function isRetryable(error: unknown): boolean {
  const candidate = error as { code?: string; driverError?: { code?: string } };
  return retryableCodes.has(candidate.code ?? '') || retryableCodes.has(candidate.driverError?.code ?? '');
}

/**
 * Runs work in one transaction; retries the whole transaction on a deadlock or lock-wait time-out
 * (on a Galera cluster a certification conflict also arrives as a deadlock, ERROR 1213).
 */
export async function inTransaction<T>(dataSource: DataSource, work: (manager: EntityManager) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await dataSource.transaction(work);
    } catch (error) {
      if (!isRetryable(error) || attempt >= MAX_ATTEMPTS) throw error;
      await new Promise((done) => setTimeout(done, Math.random() * 20 * attempt));
    }
  }
}
