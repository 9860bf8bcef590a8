import type { RequestHandler } from 'express';
import { rateLimit, type IncrementResponse, type Options, type Store } from 'express-rate-limit';
import type { DataSource, EntityManager } from 'typeorm';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../errors';
import { countHit, forgetBucket, refundHit, sweepWindows } from '../modules/auth/rate-limit-windows.repository';

const WINDOW_MS = 15 * 60_000;

/**
 * express-rate-limit's store in MariaDB (table rate_limit_window): hits per bucket and fixed
 * window, so that the limits hold across every app instance. Old windows are swept now and then.
 */
export class MariaDbRateLimitStore implements Store {
  localKeys = false;
  prefix: string;
  private windowMs = WINDOW_MS;
  private calls = 0;

  constructor(
    private readonly connect: () => Promise<DataSource>,
    name: string,
  ) {
    this.prefix = `${name}:`;
  }

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  private windowStart(now = Date.now()): number {
    return Math.floor(now / this.windowMs) * this.windowMs;
  }

  async increment(key: string): Promise<IncrementResponse> {
    const { manager } = await this.connect();
    const start = this.windowStart();
    const hits = await countHit(manager, this.bucket(key), start);
    if (++this.calls % 100 === 0) await sweepWindows(manager, start - this.windowMs);
    return { totalHits: hits, resetTime: new Date(start + this.windowMs) };
  }

  async decrement(key: string): Promise<void> {
    const { manager } = await this.connect();
    await refundHit(manager, this.bucket(key), this.windowStart());
  }

  async resetKey(key: string): Promise<void> {
    const { manager } = await this.connect();
    await forgetBucket(manager, this.bucket(key));
  }

  private bucket(key: string): string {
    return `${this.prefix}${key}`.slice(0, 200);
  }
}

/**
 * Gives back one counted attempt (a re-authentication the person cancelled, or that the identity
 * provider refused): failures of the sign-in window must not lock a person out of signing.
 */
export async function refundRateLimit(manager: EntityManager, name: string, key: string): Promise<void> {
  await refundHit(manager, `${name}:${key}`.slice(0, 200), Math.floor(Date.now() / WINDOW_MS) * WINDOW_MS);
}

interface LimitOptions {
  name: string;
  limit: number;
  connect: () => Promise<DataSource>;
  /** Whom the limit counts: a client address, or the signed-in person. */
  key: 'address' | 'person';
  /** What the person is told, given the minutes until the window ends. */
  message: (minutes: number) => string;
  /** Answer in the one JSON error shape (API) or by sending the browser to the sign-in page with the reason. */
  answer: 'json' | 'sign-in-page';
}

/**
 * A rate limit over 15-minute windows, counted in MariaDB, answering 429 (or, for a browser's sign-in, the sign-in
 * page) with Retry-After.
 */
export function limitRate(options: LimitOptions): RequestHandler {
  return rateLimit({
    windowMs: WINDOW_MS,
    limit: options.limit,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    store: new MariaDbRateLimitStore(options.connect, options.name),
    // The app trusts only a proxy on loopback for the client address (app.set('trust proxy')).
    keyGenerator: (req) =>
      options.key === 'person' && req.user ? `person-${(req.user as Person).id}` : `address-${req.ip ?? 'unknown'}`,
    validate: { keyGeneratorIpFallback: false },
    // A counter that cannot be reached must not lock everyone out, nor let the request through unlimited: it fails like
    // any other database error.
    passOnStoreError: false,
    handler: (req, res, next, limitOptions) => {
      const resetTime = (req as unknown as { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime;
      const minutes = Math.max(
        1,
        Math.ceil(((resetTime?.getTime() ?? Date.now() + limitOptions.windowMs) - Date.now()) / 60_000),
      );
      const message = options.message(minutes);
      if (options.answer === 'sign-in-page') {
        res
          .set('Retry-After', String(minutes * 60))
          .redirect(303, `/sign-in?refused=too-many-attempts&minutes=${minutes}`);
        return;
      }
      res.set('Retry-After', String(minutes * 60));
      next(new AppError('RATE_LIMITED', message));
    },
  });
}
