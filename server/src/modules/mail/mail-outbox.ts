import type { DataSource, EntityManager } from 'typeorm';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Logger } from 'pino';
import type { AppConfig } from '../../config/env';

export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  event: string;
  entity: { type: string; id: string | number };
}

/** Queues a mail inside the caller's transaction; nothing is sent unless the change commits. */
export async function queueMail(manager: EntityManager, mail: OutgoingMail): Promise<void> {
  const recipients = [...new Set(mail.to.filter(Boolean))];
  if (!recipients.length) return;
  await manager.query(
    'INSERT INTO mail_outbox (recipients, subject, body_text, event, entity_type, entity_id) VALUES (?, ?, ?, ?, ?, ?)',
    [
      recipients.join(', '),
      mail.subject.slice(0, 300),
      mail.text,
      mail.event,
      mail.entity.type,
      String(mail.entity.id),
    ],
  );
}

/** Active people who currently hold a role (identity-provider or administrator grant, not withdrawn). */
export async function addressesOfRole(manager: EntityManager, role: string): Promise<string[]> {
  const rows: Array<{ email: string }> = await manager.query(
    `SELECT DISTINCT p.email FROM person p JOIN person_role r ON r.person_id = p.id
      WHERE p.active = 1 AND r.role = ? AND NOT EXISTS (SELECT 1 FROM person_role_withdrawal w WHERE w.person_id = p.id AND w.role = r.role)
      ORDER BY p.email`,
    [role],
  );
  return rows.map((row) => row.email);
}

/** Waits before the next attempt: 30 s, 1, 2, 4 … minutes, at most an hour. */
export const retryDelayMs = (attempts: number) => Math.min(60 * 60_000, 30_000 * 2 ** Math.max(0, attempts - 1));

/** Sends the mails that are due; a failure is logged and retried later, never dropped. */
export async function deliverDueMail(
  dataSource: DataSource,
  transport: Transporter,
  from: string,
  logger: Logger,
  batch = 20,
): Promise<{ sent: number; failed: number }> {
  const due: Array<{ id: number; recipients: string; subject: string; body_text: string; attempts: number }> =
    await dataSource.query(
      'SELECT id, recipients, subject, body_text, attempts FROM mail_outbox WHERE sent_at IS NULL AND next_attempt_at <= ? ORDER BY id LIMIT ?',
      [new Date(), batch],
    );
  let sent = 0;
  let failed = 0;
  for (const mail of due) {
    // Claim the mail so that two workers never send it twice.
    const claim: { affectedRows: number } = await dataSource.query(
      'UPDATE mail_outbox SET next_attempt_at = ? WHERE id = ? AND sent_at IS NULL AND next_attempt_at <= ?',
      [new Date(Date.now() + 5 * 60_000), mail.id, new Date()],
    );
    if (claim.affectedRows !== 1) continue;
    try {
      await transport.sendMail({ from, to: mail.recipients, subject: mail.subject, text: mail.body_text });
      await dataSource.query(
        'UPDATE mail_outbox SET sent_at = ?, attempts = attempts + 1, last_error = NULL WHERE id = ?',
        [new Date(), mail.id],
      );
      sent++;
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      await dataSource.query(
        'UPDATE mail_outbox SET attempts = attempts + 1, next_attempt_at = ?, last_error = ? WHERE id = ?',
        [new Date(Date.now() + retryDelayMs(mail.attempts + 1)), message.slice(0, 1000), mail.id],
      );
      logger.warn(
        { mailId: mail.id, attempts: mail.attempts + 1, err: message },
        'mail delivery failed; it will be retried',
      );
      failed++;
    }
  }
  return { sent, failed };
}

/** Delivers queued mail every few seconds while the app runs. */
export function startMailWorker(
  config: AppConfig,
  dataSourceOf: () => DataSource | null,
  logger: Logger,
  intervalMs = 2_000,
): () => void {
  const transport = nodemailer.createTransport({
    host: config.SMTP_HOST,
    port: config.SMTP_PORT,
    secure: false,
    ignoreTLS: true,
  });
  let running = false;
  const timer = setInterval(() => {
    const dataSource = dataSourceOf();
    if (running || !dataSource?.isInitialized) return;
    running = true;
    deliverDueMail(dataSource, transport, config.MAIL_FROM, logger)
      .catch((error: unknown) => logger.warn({ err: error }, 'mail worker could not read the outbox'))
      .finally(() => (running = false));
  }, intervalMs);
  timer.unref();
  return () => {
    clearInterval(timer);
    transport.close();
  };
}
