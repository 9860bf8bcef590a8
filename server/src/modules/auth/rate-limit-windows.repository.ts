import type { EntityManager } from 'typeorm';

/**
 * Hits per rate-limit bucket and fixed window (table rate_limit_window). Raw SQL: the counting
 * is one INSERT … ON DUPLICATE KEY UPDATE, so that concurrent requests on every app instance add up.
 */

/** Counts one hit in the bucket's window and gives the window's hits so far. */
export async function countHit(manager: EntityManager, bucket: string, windowStart: number): Promise<number> {
  await manager.query(
    'INSERT INTO rate_limit_window (bucket, window_start, hits) VALUES (?, ?, 1) ON DUPLICATE KEY UPDATE hits ' +
      '= hits + 1',
    [bucket, windowStart],
  );
  const [row]: Array<{ hits: number }> = await manager.query(
    'SELECT hits FROM rate_limit_window WHERE bucket = ? AND window_start = ?',
    [bucket, windowStart],
  );
  return Number(row?.hits ?? 1);
}

/** Gives back one hit of the bucket's window (never below zero). */
export async function refundHit(manager: EntityManager, bucket: string, windowStart: number): Promise<void> {
  await manager.query(
    'UPDATE rate_limit_window SET hits = GREATEST(hits, 1) - 1 WHERE bucket = ? AND window_start = ?',
    [bucket, windowStart],
  );
}

export async function forgetBucket(manager: EntityManager, bucket: string): Promise<void> {
  await manager.query('DELETE FROM rate_limit_window WHERE bucket = ?', [bucket]);
}

/** Deletes windows that ended before the given start. */
export async function sweepWindows(manager: EntityManager, before: number): Promise<void> {
  await manager.query('DELETE FROM rate_limit_window WHERE window_start < ?', [before]);
}
