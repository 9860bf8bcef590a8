// Which database failures are worth trying again, and how. Two kinds pass by themselves:
// - a conflict: a deadlock or lock-wait time-out, which on a Galera cluster is also how a
//   certification conflict between two nodes arrives (ERROR 1213); the transaction was rolled back;
// - the database being unavailable for a moment: the connection was lost (the server, or the
//   cluster node behind the load balancer, went away) or a Galera node is not ready for use
//   (ERROR 1047 while it has no primary component or is still joining).

export type TransientKind = 'conflict' | 'unavailable';

const conflictCodes = new Set(['ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT']);
const unavailableCodes = new Set([
  'PROTOCOL_CONNECTION_LOST',
  'PROTOCOL_SEQUENCE_TIMEOUT',
  'ECONNRESET',
  'ECONNREFUSED',
  'EPIPE',
  'ETIMEDOUT',
  'ER_SERVER_SHUTDOWN',
  'ER_CONNECTION_KILLED',
  'ER_CON_COUNT_ERROR',
  // 1047: "WSREP has not yet prepared node for application use"
  'ER_UNKNOWN_COM_ERROR',
]);

interface DriverishError {
  code?: string;
  fatal?: boolean;
  message?: string;
  driverError?: DriverishError;
}

export function transientKind(error: unknown): TransientKind | null {
  for (const candidate of [error as DriverishError | undefined, (error as DriverishError | undefined)?.driverError]) {
    if (!candidate || typeof candidate !== 'object') continue;
    const code = candidate.code ?? '';
    if (conflictCodes.has(code)) return 'conflict';
    if (unavailableCodes.has(code) || candidate.fatal === true) return 'unavailable';
    if (/connection is in closed state|Pool is closed/i.test(candidate.message ?? '')) return 'unavailable';
  }
  return null;
}

/** True when the connection itself failed (as opposed to the server refusing the statement). */
export function connectionLost(error: unknown): boolean {
  if (transientKind(error) !== 'unavailable') return false;
  const codes = [(error as DriverishError).code, (error as DriverishError).driverError?.code];
  return !codes.includes('ER_UNKNOWN_COM_ERROR');
}

/**
 * The table a statement failed on because the server could not read its triggers ("Unknown
 * trigger has an error in its body"), or null. A Galera node (MariaDB 10.11, galera-4 26.4) was
 * seen to keep a table open with its triggers unreadable for 10–25 s after a transaction was
 * aborted by a certification conflict while it opened that table; every node-local FLUSH of the
 * table cleared it at once (npm run test:cluster -- --writes-through=all-nodes shows it).
 */
export function tableWithUnreadableTriggers(error: unknown): string | null {
  const candidate = error as DriverishError & { query?: string; sql?: string };
  const message = candidate?.message ?? candidate?.driverError?.message ?? '';
  if (!/trigger has an error in its body/i.test(message)) return null;
  const statement =
    candidate.query ?? candidate.sql ?? (candidate.driverError as { sql?: string } | undefined)?.sql ?? '';
  return (
    /^\s*(?:INSERT\s+(?:IGNORE\s+)?INTO|UPDATE|DELETE\s+FROM|REPLACE\s+INTO)\s+`?(\w+)`?/i.exec(statement)?.[1] ?? ''
  );
}

const MAX_CONFLICT_ATTEMPTS = 10;
/** How long a request keeps trying while the database is away: a Galera node's failure stalls writes for ~3–6 s. */
export const UNAVAILABLE_BUDGET_MS = 20_000;

/** Milliseconds to wait before the next attempt, or null to give up. */
export function retryDelay(kind: TransientKind | null, attempt: number, elapsedMs: number): number | null {
  // Full jitter, growing to at most 250 ms: writers that collided on the ledger's chain head
  // (on a Galera cluster, through different nodes) spread out instead of colliding again.
  if (kind === 'conflict')
    return attempt < MAX_CONFLICT_ATTEMPTS ? Math.random() * Math.min(250, 10 * 2 ** attempt) : null;
  if (kind === 'unavailable') {
    if (elapsedMs >= UNAVAILABLE_BUDGET_MS) return null;
    return Math.min(1_000, 50 * 2 ** Math.min(attempt, 5)) * (0.5 + Math.random() / 2);
  }
  return null;
}

const sleep = (ms: number) => new Promise((done) => setTimeout(done, ms));

/**
 * Runs an idempotent read, repeating it while the database is briefly unavailable or the read
 * timed out waiting (on a Galera node that waits for the cluster before reading, a read in a
 * stalled cluster ends with ER_LOCK_WAIT_TIMEOUT).
 */
export async function readWithRetry<T>(read: () => Promise<T>): Promise<T> {
  const started = Date.now();
  for (let attempt = 1; ; attempt++) {
    try {
      return await read();
    } catch (error) {
      const delay = retryDelay(transientKind(error), attempt, Date.now() - started);
      if (delay === null) throw error;
      await sleep(delay);
    }
  }
}
