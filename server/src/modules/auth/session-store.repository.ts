import session from 'express-session';
import type { SessionData } from 'express-session';
import type { DataSource } from 'typeorm';
import type { Person } from '@shared/schemas/people';
import { personFromRow, personWithRolesColumns, type PersonWithRolesRow } from '../people/people.repository';

type Callback<T = void> = (error?: unknown, value?: T) => void;

/** What passport keeps in a session: the person's id, or (just read) the person. */
interface PassportData {
  passport?: { user?: number | Person };
}

/**
 * express-session's store in MariaDB (table http_session), over the app's own connection pool.
 * Reading a session also reads its signed-in person with their roles in the same statement, so
 * that a signed-in request costs one round trip before its own work, and a role change or a
 * deactivation still takes effect at the person's next request. Only the person's id is stored.
 * Sessions are never "touched": their expiry is the absolute limit set at sign-in, and the idle
 * limit is kept by the session's own lastSeenAt.
 */
export class MariaDbSessionStore extends session.Store {
  private readonly sweeper: NodeJS.Timeout;

  constructor(
    private readonly connect: () => Promise<DataSource>,
    private readonly options: { expirationMs: number; sweepIntervalMs: number },
  ) {
    super();
    this.sweeper = setInterval(() => void this.sweep().catch(() => undefined), options.sweepIntervalMs);
    this.sweeper.unref();
  }

  override get(sid: string, callback: Callback<SessionData | null>): void {
    this.connect()
      .then((dataSource) =>
        dataSource.query(
          `SELECT s.data, ${personWithRolesColumns} FROM http_session s
             LEFT JOIN person p ON p.id = CAST(JSON_VALUE(s.data, '$.passport.user') AS UNSIGNED)
            WHERE s.session_id = ? AND s.expires >= UNIX_TIMESTAMP()`,
          [sid],
        ),
      )
      .then((rows: Array<PersonWithRolesRow & { data: string; id: number | null }>) => {
        const row = rows[0];
        if (!row) return callback(null, null);
        const data = JSON.parse(row.data) as SessionData & PassportData;
        if (data.passport && row.id !== null) data.passport.user = personFromRow(row);
        callback(null, data);
      }, callback);
  }

  override set(sid: string, data: SessionData, callback?: Callback): void {
    const stored = { ...(data as SessionData & PassportData) };
    const user = stored.passport?.user;
    if (user && typeof user === 'object') stored.passport = { ...stored.passport, user: user.id };
    const expires = Math.round(
      (data.cookie.expires ? new Date(data.cookie.expires).getTime() : Date.now() + this.options.expirationMs) / 1000,
    );
    this.connect()
      .then((dataSource) =>
        dataSource.query(
          'INSERT INTO http_session (session_id, expires, data) VALUES (?, ?, ?) ON DUPLICATE KEY UPDATE ' +
            'expires = VALUES(expires), data = VALUES(data)',
          [sid, expires, JSON.stringify(stored)],
        ),
      )
      .then(
        () => callback?.(),
        (error: unknown) => callback?.(error),
      );
  }

  override destroy(sid: string, callback?: Callback): void {
    this.connect()
      .then((dataSource) => dataSource.query('DELETE FROM http_session WHERE session_id = ?', [sid]))
      .then(
        () => callback?.(),
        (error: unknown) => callback?.(error),
      );
  }

  override touch(_sid: string, _data: SessionData, callback?: Callback): void {
    callback?.();
  }

  /** Deletes sessions past their absolute limit. */
  async sweep(): Promise<void> {
    const dataSource = await this.connect();
    await dataSource.query('DELETE FROM http_session WHERE expires < UNIX_TIMESTAMP()');
  }

  close(): void {
    clearInterval(this.sweeper);
  }
}
