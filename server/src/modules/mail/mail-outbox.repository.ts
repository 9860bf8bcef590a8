import { IsNull, LessThanOrEqual, type EntityManager } from 'typeorm';
import { MailOutbox } from './entities/mail-outbox.entity';

export async function insertMail(
  manager: EntityManager,
  mail: Pick<MailOutbox, 'recipients' | 'subject' | 'bodyText' | 'event' | 'entityType' | 'entityId'> &
    Partial<Pick<MailOutbox, 'attachmentName' | 'attachmentType' | 'attachment'>>,
): Promise<void> {
  await manager.getRepository(MailOutbox).insert(mail);
}

/** Active people who currently hold a role (identity-provider or administrator grant, not withdrawn). */
export async function addressesOfRole(manager: EntityManager, role: string): Promise<string[]> {
  const rows: Array<{ email: string }> = await manager.query(
    `SELECT DISTINCT p.email FROM person p JOIN person_role r ON r.person_id = p.id
      WHERE p.active = 1 AND r.role = ?
        AND NOT EXISTS (SELECT 1 FROM person_role_withdrawal w WHERE w.person_id = p.id AND w.role = r.role)
      ORDER BY p.email`,
    [role],
  );
  return rows.map((row) => row.email);
}

/** Mail not yet sent whose next attempt is due, oldest first. */
export function dueMail(manager: EntityManager, now: Date, batch: number) {
  return manager.getRepository(MailOutbox).find({
    select: {
      id: true,
      recipients: true,
      subject: true,
      bodyText: true,
      attempts: true,
      attachmentName: true,
      attachmentType: true,
      attachment: true,
    },
    where: { sentAt: IsNull(), nextAttemptAt: LessThanOrEqual(now) },
    order: { id: 'ASC' },
    take: batch,
  });
}

/** Claims a due mail for a few minutes, so that two workers never send it twice; false when another has it. */
export async function claimMail(manager: EntityManager, id: number, now: Date, until: Date): Promise<boolean> {
  const result = await manager
    .getRepository(MailOutbox)
    .update({ id, sentAt: IsNull(), nextAttemptAt: LessThanOrEqual(now) }, { nextAttemptAt: until });
  return result.affected === 1;
}

export async function markMailSent(manager: EntityManager, id: number, attempts: number): Promise<void> {
  await manager.getRepository(MailOutbox).update({ id }, { sentAt: new Date(), attempts, lastError: null });
}

export async function markMailFailed(
  manager: EntityManager,
  id: number,
  failure: { attempts: number; nextAttemptAt: Date; lastError: string },
): Promise<void> {
  await manager.getRepository(MailOutbox).update({ id }, failure);
}
