import type { DataSource, EntityManager } from 'typeorm';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Logger } from 'pino';
import type { AppConfig } from '../../config/env';
import { claimMail, dueMail, insertMail, markMailFailed, markMailSent } from './mail-outbox.repository';

export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  event: string;
  entity: { type: string; id: string | number };
  /** One file sent with the mail (a notice as a PDF). */
  attachment?: { name: string; contentType: string; content: Buffer };
}

/** Queues a mail inside the caller's transaction; nothing is sent unless the change commits. */
export async function queueMail(manager: EntityManager, mail: OutgoingMail): Promise<void> {
  const recipients = [...new Set(mail.to.filter(Boolean))];
  if (!recipients.length) return;
  await insertMail(manager, {
    recipients: recipients.join(', '),
    subject: mail.subject.slice(0, 300),
    bodyText: mail.text,
    event: mail.event,
    entityType: mail.entity.type,
    entityId: String(mail.entity.id),
    ...(mail.attachment
      ? {
          attachmentName: mail.attachment.name,
          attachmentType: mail.attachment.contentType,
          attachment: mail.attachment.content,
        }
      : {}),
  });
}

export { addressesOfRole } from './mail-outbox.repository';

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
  const { manager } = dataSource;
  const due = await dueMail(manager, new Date(), batch);
  let sent = 0;
  let failed = 0;
  for (const mail of due) {
    // Claim the mail so that two workers never send it twice.
    if (!(await claimMail(manager, mail.id, new Date(), new Date(Date.now() + 5 * 60_000)))) continue;
    try {
      await transport.sendMail({
        from,
        to: mail.recipients,
        subject: mail.subject,
        text: mail.bodyText,
        ...(mail.attachment && mail.attachmentName
          ? {
              attachments: [
                {
                  filename: mail.attachmentName,
                  content: mail.attachment,
                  contentType: mail.attachmentType ?? 'application/octet-stream',
                },
              ],
            }
          : {}),
      });
      await markMailSent(manager, mail.id, mail.attempts + 1);
      sent++;
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      await markMailFailed(manager, mail.id, {
        attempts: mail.attempts + 1,
        nextAttemptAt: new Date(Date.now() + retryDelayMs(mail.attempts + 1)),
        lastError: message.slice(0, 1000),
      });
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
