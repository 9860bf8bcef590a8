import nodemailer from 'nodemailer';
import { pino } from 'pino';
import { afterAll, describe, expect, it } from 'vitest';
import { deliverDueMail, queueMail, retryDelayMs } from '../../server/src/modules/mail/mail-outbox';
import { inTransaction } from '../../server/src/db/transaction';
import { createTestApp } from '../helpers/test-app';

describe('the mail outbox', () => {
  // The app's own worker stays off, so that only the test delivers.
  const running = createTestApp({}, { mailWorker: false });
  afterAll(() => running.close());

  it(
    '[MAIL-QUEUE] when the mail server refuses, then the mail stays queued with the error and is sent on a ' +
      'later attempt',
    async () => {
      const db = await running.database.connect();
      const subject = `Outbox test ${Date.now()}`;
      await inTransaction(db, (manager) =>
        queueMail(manager, {
          to: ['someone@kestrelmoor.example'],
          subject,
          text: 'body',
          event: 'test',
          entity: { type: 'test', id: 1 },
        }),
      );
      // Nothing listens on port 9 here: a real SMTP connection attempt that fails.
      const down = nodemailer.createTransport({
        host: '127.0.0.1',
        port: 9,
        secure: false,
        ignoreTLS: true,
        connectionTimeout: 2_000,
      });
      const silent = pino({ level: 'silent' });
      // Other tests' mails may be due too; only this one matters here.
      await db.query('UPDATE mail_outbox SET next_attempt_at = ? WHERE subject <> ? AND sent_at IS NULL', [
        new Date(Date.now() + 60_000),
        subject,
      ]);
      const failed = await deliverDueMail(db, down, 'Ingotrace <ingotrace@localhost>', silent);
      expect(failed).toEqual({ sent: 0, failed: 1 });
      const [row] = await db.query(
        'SELECT attempts, sent_at, last_error, next_attempt_at FROM mail_outbox WHERE subject = ?',
        [subject],
      );
      expect(row).toMatchObject({ attempts: 1, sent_at: null });
      expect(row.last_error).toMatch(/ECONNREFUSED/);
      expect(new Date(row.next_attempt_at).getTime()).toBeGreaterThan(Date.now());
      await db.query('UPDATE mail_outbox SET next_attempt_at = ? WHERE subject = ?', [
        new Date(Date.now() - 1000),
        subject,
      ]);
      const up = nodemailer.createTransport({
        host: '127.0.0.1',
        port: running.config.SMTP_PORT,
        secure: false,
        ignoreTLS: true,
      });
      expect(await deliverDueMail(db, up, 'Ingotrace <ingotrace@localhost>', silent)).toMatchObject({ sent: 1 });
      const [after] = await db.query('SELECT attempts, sent_at FROM mail_outbox WHERE subject = ?', [subject]);
      expect(after.attempts).toBe(2);
      expect(after.sent_at).not.toBeNull();
    },
  );

  it('when attempts repeat, then the wait doubles from 30 s up to an hour (common practice, no source)', () => {
    expect([1, 2, 3, 4, 10, 20].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, 240_000, 3_600_000, 3_600_000]);
  });
});
