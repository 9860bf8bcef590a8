import type { DataSource } from 'typeorm';
import { reminderDue } from '@shared/domain/recall/effectiveness';
import { plantDate } from '@shared/domain/plant-time';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor } from '../ledger/ledger.repository';
import { addressesOfRole, queueMail } from '../mail/mail-outbox';
import { linkTo } from '../mail/links';
import { findOrganisation } from '../organisation/organisation.repository';
import { markEscalated, markReminded, unansweredNotices, type ReminderCandidateRow } from './field-action.repository';
import { parseNotice } from './field-action.service';

const product: Actor = { id: null, name: 'Ingotrace', role: null };

/**
 * Reminds each consignee that has not answered once the recall's interval has passed since its
 * notice or its last reminder; after the set number of reminders, tells the recall team who has
 * still not answered and since when. Safe to run from several instances (rows are locked and skipped).
 */
export async function sendDueReminders(
  dataSource: DataSource,
  now = new Date(),
): Promise<{ reminded: number; escalated: number }> {
  return inTransaction(dataSource, async (manager) => {
    const candidates = await unansweredNotices(manager);
    const timeZone = (await findOrganisation(manager))?.timeZone ?? 'UTC';
    let reminded = 0;
    const toEscalate: ReminderCandidateRow[] = [];
    for (const row of candidates) {
      const due = reminderDue(
        { issuedAt: row.issued_at, lastReminderAt: row.last_reminder_at, replied: false },
        row.reminder_every_days,
        now,
      );
      let sent = row.reminders_sent;
      if (due && row.recipient) {
        const notice = parseNotice(row);
        await queueMail(manager, {
          to: [row.recipient],
          subject: `Reminder: ${notice.subject}`,
          text: [
            `We have not yet had your answer to our notice of ${plantDate(row.issued_at, timeZone)}. ` +
              'Please answer through your reply page, even if you have none of the units left.',
            '',
            notice.text,
          ].join('\n'),
          event: 'recall.reminder-sent',
          entity: { type: 'recall-notice', id: row.id },
        });
        await markReminded(manager, row.id, now);
        await appendLedgerEvent(manager, {
          actor: product,
          action: 'recall.reminder-sent',
          entity: { type: 'recall', id: row.recall_id },
          after: { consignee: row.consignee, recipient: row.recipient, reminder: row.reminders_sent + 1 },
        });
        sent++;
        reminded++;
      }
      if (!row.escalated_at && sent >= row.escalate_after_reminders) toEscalate.push(row);
    }
    const recalls = [...new Set(toEscalate.map((row) => row.recall_id))];
    for (const recallId of recalls) {
      const rows = toEscalate.filter((row) => row.recall_id === recallId);
      const recallNumber = rows[0]!.recall_number;
      const team = [
        ...(await addressesOfRole(manager, 'recall-coordinator')),
        ...(await addressesOfRole(manager, 'qa-approver')),
      ];
      await queueMail(manager, {
        to: team,
        subject: `${recallNumber}: consignees have not answered after reminders`,
        text: [
          `These consignees have not answered the notice of ${recallNumber} after the reminders set:`,
          ...rows.map(
            (row) =>
              `  - ${row.consignee}: notified ${plantDate(row.issued_at, timeZone)}, ` +
              `${Math.max(row.reminders_sent, row.escalate_after_reminders)} reminder(s)`,
          ),
          '',
          `Open the investigation: ${linkTo(`/recalls/${recallId}`)}`,
        ].join('\n'),
        event: 'recall.escalated',
        entity: { type: 'recall', id: recallId },
      });
      await markEscalated(
        manager,
        rows.map((row) => row.id),
        now,
      );
      await appendLedgerEvent(manager, {
        actor: product,
        action: 'recall.escalated',
        entity: { type: 'recall', id: recallId },
        after: { consignees: rows.map((row) => row.consignee) },
      });
    }
    return { reminded, escalated: toEscalate.length };
  });
}

/** Looks for due reminders every few minutes while the app runs. */
export function startReminderWorker(
  dataSourceOf: () => DataSource | null,
  onError: (error: unknown) => void,
  intervalMs = 5 * 60_000,
): () => void {
  let running = false;
  const timer = setInterval(() => {
    const dataSource = dataSourceOf();
    if (running || !dataSource?.isInitialized) return;
    running = true;
    sendDueReminders(dataSource)
      .catch(onError)
      .finally(() => (running = false));
  }, intervalMs);
  timer.unref();
  return () => clearInterval(timer);
}
