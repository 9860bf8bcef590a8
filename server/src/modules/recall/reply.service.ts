import type { z } from 'zod';
import type { DataSource, EntityManager } from 'typeorm';
import { replyProblems } from '@shared/domain/recall/effectiveness';
import type { noticeReplyInputSchema, ReplyPage } from '@shared/schemas/field-action';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type RequestOrigin } from '../ledger/ledger.repository';
import { findOrganisation } from '../organisation/organisation.repository';
import { insertReply, noticeByToken, replyLotRows, type TokenNoticeRow } from './field-action.repository';
import { parseNotice } from './field-action.service';

/** One answer for every refusal, so that a link that is wrong, not yet issued or expired tells nothing apart. */
const notAvailable = () =>
  new AppError('NOT_FOUND', 'This reply link is not valid, or the recall it belongs to has closed');

/** The notice behind a link, only while it is issued and its recall open. */
async function openNotice(manager: EntityManager, token: string, lock = false): Promise<TokenNoticeRow> {
  const row = await noticeByToken(manager, token, lock);
  if (!row || !row.issued_at || row.status !== 'open') throw notAvailable();
  return row;
}

async function pageOf(manager: EntityManager, row: TokenNoticeRow): Promise<ReplyPage> {
  const notice = parseNotice(row);
  const lines = await replyLotRows(manager, [row.id]);
  const lastId = lines.at(-1)?.reply_id;
  const last = lines.filter((line) => line.reply_id === lastId);
  const head = last[0];
  const organisation = await findOrganisation(manager);
  return {
    recallNumber: row.recall_number,
    firm: organisation?.name ?? '',
    timeZone: organisation?.timeZone ?? 'UTC',
    consignee: row.consignee,
    drill: row.mode === 'drill',
    actionAsked: row.action_asked ?? '',
    lots: notice.lots,
    lastReply: head
      ? {
          contactName: head.contact_name,
          repliedAt: new Date(head.replied_at).toISOString(),
          lots: last.map((line) => ({
            lotId: line.lot_id,
            onHand: line.on_hand,
            returned: line.returned,
            destroyed: line.destroyed,
            used: line.used,
          })),
        }
      : null,
  };
}

export async function replyPage(dataSource: DataSource, token: string): Promise<ReplyPage> {
  return pageOf(dataSource.manager, await openNotice(dataSource.manager, token));
}

/**
 * Stores a consignee's answer (a correction is a new answer; the earlier one stays in the record)
 * and writes it to the audit trail under the name the consignee gave.
 */
export async function submitReply(
  dataSource: DataSource,
  token: string,
  input: z.output<typeof noticeReplyInputSchema>,
  origin: RequestOrigin,
): Promise<ReplyPage> {
  return inTransaction(dataSource, async (manager) => {
    const row = await openNotice(manager, token, true);
    const notice = parseNotice(row);
    const problems = replyProblems(notice.lots, input.lots);
    if (Object.keys(problems).length)
      throw AppError.rule('Some of the counts do not fit your notice; see the marked lots', problems);
    const repliedAt = new Date();
    const replyId = await insertReply(
      manager,
      { noticeId: row.id, contactName: input.contactName, clientAddress: origin.clientAddress, repliedAt },
      input.lots,
    );
    const byLot = new Map(notice.lots.map((lot) => [lot.lotId, lot.lotNumber]));
    await appendLedgerEvent(manager, {
      actor: { id: null, name: `${input.contactName} (${row.consignee}, by reply link)`, role: 'consignee' },
      action: 'recall.notice-replied',
      entity: { type: 'recall', id: row.recall_id },
      after: {
        replyId,
        consignee: row.consignee,
        contactName: input.contactName,
        lots: input.lots.map(({ lotId, ...counts }) => ({ lotNumber: byLot.get(lotId), ...counts })),
      },
      origin,
    });
    return pageOf(manager, row);
  });
}
