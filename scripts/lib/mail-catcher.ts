import { mkdirSync, rmSync } from 'node:fs';
import { resolve } from 'node:path';
import { MailDev } from 'maildev';
import type { AppConfig } from '../../server/src/config/env';

/** The local SMTP catcher: mail the product sends lands here and shows at the web address. */
export async function startMailCatcher(
  config: AppConfig,
  options: { empty?: boolean } = {},
): Promise<{ url: string; stop: () => Promise<void> }> {
  const mailDirectory = resolve(config.DATA_DIR, 'mail');
  if (options.empty) rmSync(mailDirectory, { recursive: true, force: true });
  mkdirSync(mailDirectory, { recursive: true });
  const maildev = new MailDev({
    smtp: config.SMTP_PORT,
    ip: '127.0.0.1',
    web: config.MAIL_WEB_PORT,
    webIp: '127.0.0.1',
    silent: true,
    mailDirectory,
  });
  await maildev.start();
  return { url: `http://127.0.0.1:${config.MAIL_WEB_PORT}`, stop: () => maildev.stop() };
}
