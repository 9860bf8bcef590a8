import { effectivenessSource, levelDescriptions } from '@shared/domain/recall/effectiveness';
import { appendLedgerEvent } from '../ledger/ledger.repository';
import { queueMail } from '../mail/mail-outbox';
import { findOrganisation } from '../organisation/organisation.repository';
import type { SignableRecordType } from '../signatures/signable-records';
import { findStrategy, markIssued, noticeRows } from './field-action.repository';
import { parseNotice } from './field-action.service';
import { noticePdf } from './notice-document';
import { findRecallRow } from './recall.repository';

/**
 * Issuing a recall's notices is an electronic signature by a recall coordinator over every notice
 * prepared and not yet issued (each named by its hash); the signature sends them, each with its
 * PDF, through the mail outbox. A consignee without an e-mail address stops the issue.
 */
export const recallNoticesRecordType: SignableRecordType<{
  status: string;
  waiting: number;
  withoutAddress: string[];
  hasStrategy: boolean;
}> = {
  type: 'recall-notices',
  label: 'consignee notices',
  action: 'recall.notify',
  readAction: 'recall.read',
  meanings: ['issued'],
  async load(manager, recordId) {
    if (!/^\d{1,10}$/.test(recordId)) return null;
    const recall = await findRecallRow(manager, Number(recordId));
    if (!recall) return null;
    const strategy = await findStrategy(manager, recall.id);
    const waiting = (await noticeRows(manager, recall.id)).filter((row) => !row.issued_at);
    return {
      title: `Consignee notices of ${recall.mode === 'drill' ? 'drill' : 'recall'} ${recall.recall_number}`,
      content: {
        investigation: recall.recall_number,
        mode: recall.mode,
        effectivenessLevel: strategy
          ? `${levelDescriptions[strategy.effectivenessLevel]}` +
            `${strategy.effectivenessLevel === 'B' ? ` (${strategy.levelBPercent} %)` : ''} — ${effectivenessSource}`
          : null,
        actionAsked: strategy?.actionAsked ?? null,
        notices: waiting.map((row) => {
          const notice = parseNotice(row);
          return {
            consignee: row.consignee,
            recipient: row.recipient,
            lots: notice.lots.map((lot) => `${lot.lotNumber}: ${lot.shipped} units`),
            noticeSha256: row.sha256,
          };
        }),
      },
      authorIds: [],
      status: recall.status,
      waiting: waiting.length,
      withoutAddress: waiting.filter((row) => !row.recipient).map((row) => row.consignee),
      hasStrategy: strategy !== null,
    };
  },
  refusal({ record }) {
    if (record.status !== 'open') return 'The investigation is closed; no notice goes out any more';
    if (!record.hasStrategy) return 'Set the field action first';
    if (!record.waiting) return 'No notice is waiting to be issued; prepare the notices first';
    if (record.withoutAddress.length)
      return (
        `${record.withoutAddress.join(', ')} ${record.withoutAddress.length > 1 ? 'have' : 'has'} no e-mail ` +
        `address on record; record it on the Consignees screen, then prepare the notices again`
      );
    return null;
  },
  async afterSign(manager, { recordId, signer, origin }) {
    const recallId = Number(recordId);
    const organisation = await findOrganisation(manager);
    const waiting = (await noticeRows(manager, recallId, true)).filter((row) => !row.issued_at);
    const issuedAt = new Date();
    for (const row of waiting) {
      const notice = parseNotice(row);
      await queueMail(manager, {
        to: [row.recipient ?? ''],
        subject: notice.subject,
        text: notice.text,
        event: 'recall.notice-issued',
        entity: { type: 'recall-notice', id: row.id },
        attachment: {
          name: `${notice.recallNumber}-notice.pdf`,
          contentType: 'application/pdf',
          content: await noticePdf(notice, organisation?.name ?? '', row.sha256),
        },
      });
      await appendLedgerEvent(manager, {
        actor: { id: signer.id, name: signer.name, role: signer.role },
        action: 'recall.notice-issued',
        entity: { type: 'recall', id: recallId },
        after: { consignee: row.consignee, recipient: row.recipient, noticeSha256: row.sha256 },
        origin,
      });
    }
    await markIssued(
      manager,
      waiting.map((row) => row.id),
      issuedAt,
    );
  },
};
