import session from 'express-session';
import type { RequestHandler } from 'express';
import type { DataSource } from 'typeorm';
import type { AppConfig } from '../../config/env';
import { AppError } from '../../errors';
import { MariaDbSessionStore } from './session-store.repository';

export const SESSION_COOKIE = 'ingotrace_session';

export interface SessionSupport {
  middleware: RequestHandler;
  /** Ends sessions past the idle or absolute time-out, with a clear message. */
  enforceTimeouts: RequestHandler;
  close(): Promise<void>;
}

/** express-session stored in MariaDB (so any app instance can serve any person). */
export function createSessionSupport(config: AppConfig, connect: () => Promise<DataSource>): SessionSupport {
  const absoluteMs = config.SESSION_ABSOLUTE_HOURS * 3600_000;
  const idleMs = config.SESSION_IDLE_MINUTES * 60_000;
  const store = new MariaDbSessionStore(connect, { expirationMs: absoluteMs, sweepIntervalMs: 15 * 60_000 });
  const middleware = session({
    name: SESSION_COOKIE,
    secret: config.SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    // No rolling cookie: the limits are enforced from the session's own times (below), and a
    // rolling cookie would rewrite the session row on every request.
    rolling: false,
    proxy: true,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.PUBLIC_URL.startsWith('https:'),
      maxAge: absoluteMs,
      path: '/',
    },
  });
  const enforceTimeouts: RequestHandler = (req, _res, next) => {
    if (!req.user || !req.session) return next();
    const now = Date.now();
    const signedInAt = req.session.signedInAt ?? now;
    const lastSeenAt = req.session.lastSeenAt ?? now;
    let reason: string | null = null;
    if (now - signedInAt > absoluteMs)
      reason = `Your session reached its limit of ${config.SESSION_ABSOLUTE_HOURS} hours; sign in again`;
    else if (now - lastSeenAt > idleMs)
      reason = `Your session ended after ${config.SESSION_IDLE_MINUTES} minutes without activity; sign in again`;
    if (reason) {
      const message = reason;
      req.session.destroy(() => next(new AppError('UNAUTHENTICATED', message)));
      return;
    }
    // Activity is recorded at most every 30 s (or a tenth of the idle limit), not on every request:
    // each record is a write of the session row.
    if (now - lastSeenAt >= Math.min(30_000, idleMs / 10) || req.session.lastSeenAt === undefined)
      req.session.lastSeenAt = now;
    next();
  };
  return { middleware, enforceTimeouts, close: async () => store.close() };
}
