// Which driver errors count as passing. Error codes and numbers from MariaDB's error code
// reference (1213 ER_LOCK_DEADLOCK, 1205 ER_LOCK_WAIT_TIMEOUT, 1047 ER_UNKNOWN_COM_ERROR, 1053
// ER_SERVER_SHUTDOWN, 1927 ER_CONNECTION_KILLED) and the codes mysql2 gives a lost connection.
import { describe, expect, it } from 'vitest';
import {
  connectionLost,
  retryDelay,
  transientKind,
  UNAVAILABLE_BUDGET_MS,
} from '../../../server/src/db/transient-errors';

describe('transient database errors', () => {
  it('classifies conflicts, unavailability and everything else', () => {
    expect(transientKind({ code: 'ER_LOCK_DEADLOCK', errno: 1213 })).toBe('conflict');
    expect(transientKind({ driverError: { code: 'ER_LOCK_WAIT_TIMEOUT', errno: 1205 } })).toBe('conflict');
    expect(
      transientKind({
        code: 'ER_UNKNOWN_COM_ERROR',
        errno: 1047,
        message: 'WSREP has not yet prepared node for application use',
      }),
    ).toBe('unavailable');
    expect(transientKind({ code: 'PROTOCOL_CONNECTION_LOST', fatal: true })).toBe('unavailable');
    expect(transientKind({ code: 'ER_CONNECTION_KILLED', errno: 1927 })).toBe('unavailable');
    expect(transientKind({ code: 'ECONNREFUSED' })).toBe('unavailable');
    expect(transientKind(new Error("Can't add new command when connection is in closed state"))).toBe('unavailable');
    expect(transientKind({ code: 'ER_DUP_ENTRY', errno: 1062 })).toBeNull();
    expect(transientKind({ code: 'ER_TABLEACCESS_DENIED_ERROR', errno: 1142 })).toBeNull();
    expect(transientKind(new Error('anything else'))).toBeNull();
  });

  it('treats a node that refuses statements (1047) as unavailable but not as a lost connection', () => {
    expect(connectionLost({ code: 'ER_UNKNOWN_COM_ERROR' })).toBe(false);
    expect(connectionLost({ code: 'PROTOCOL_CONNECTION_LOST', fatal: true })).toBe(true);
    expect(connectionLost({ code: 'ER_LOCK_DEADLOCK' })).toBe(false);
  });

  it(
    'repeats a conflict up to ten attempts and waits out unavailability for the time budget (common practice, ' +
      'no source)',
    () => {
      expect(retryDelay('conflict', 9, 0)).toBeLessThanOrEqual(250);
      expect(retryDelay('conflict', 10, 0)).toBeNull();
      expect(retryDelay('unavailable', 40, UNAVAILABLE_BUDGET_MS - 1)).toBeLessThanOrEqual(1_000);
      expect(retryDelay('unavailable', 1, UNAVAILABLE_BUDGET_MS)).toBeNull();
      expect(retryDelay(null, 1, 0)).toBeNull();
    },
  );
});
