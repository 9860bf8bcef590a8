import { IsNull, type EntityManager } from 'typeorm';
import { insertReturningId } from '../../db/insert-returning-id';
import { NoticeReply } from './entities/notice-reply.entity';
import { NoticeReplyLot } from './entities/notice-reply-lot.entity';
import { RecallFieldAction } from './entities/recall-field-action.entity';
import { RecallNotice } from './entities/recall-notice.entity';
import { ReturnedGoodsReceipt } from './entities/returned-goods-receipt.entity';

export async function findStrategy(
  manager: EntityManager,
  recallId: number,
): Promise<(RecallFieldAction & { setByName: string }) | null> {
  const row = await manager
    .getRepository(RecallFieldAction)
    .createQueryBuilder('strategy')
    .innerJoin('strategy.setByPerson', 'person')
    .addSelect('person.name', 'set_by_name')
    .where('strategy.recallId = :recallId', { recallId })
    .getRawAndEntities();
  const entity = row.entities[0];
  return entity ? Object.assign(entity, { setByName: String(row.raw[0].set_by_name) }) : null;
}

export async function saveStrategy(manager: EntityManager, strategy: Omit<RecallFieldAction, 'setAt'>): Promise<void> {
  await manager.getRepository(RecallFieldAction).save({ ...strategy, setAt: new Date() });
}

export interface NoticeRow {
  id: number;
  consignee_id: number;
  consignee: string;
  recipient: string | null;
  content: string;
  sha256: string;
  reply_token: string;
  prepared_at: Date;
  issued_at: Date | null;
  reminders_sent: number;
  last_reminder_at: Date | null;
  escalated_at: Date | null;
  replies: string | number;
  last_reply_at: Date | null;
  last_contact: string | null;
}

const noticeSelect = `SELECT n.id, n.consignee_id, c.name AS consignee, n.recipient, n.content, n.sha256, n.reply_token,
    n.prepared_at, n.issued_at, n.reminders_sent, n.last_reminder_at, n.escalated_at,
    (SELECT COUNT(*) FROM notice_reply r WHERE r.notice_id = n.id) AS replies,
    (SELECT MAX(r.replied_at) FROM notice_reply r WHERE r.notice_id = n.id) AS last_reply_at,
    (SELECT r.contact_name FROM notice_reply r WHERE r.notice_id = n.id ORDER BY r.id DESC LIMIT 1) AS last_contact
  FROM recall_notice n JOIN consignee c ON c.id = n.consignee_id`;

/** A recall's notices, by consignee name. */
export async function noticeRows(manager: EntityManager, recallId: number, lock = false): Promise<NoticeRow[]> {
  return manager.query(`${noticeSelect} WHERE n.recall_id = ? ORDER BY c.name, n.id${lock ? ' FOR UPDATE' : ''}`, [
    recallId,
  ]);
}

export async function noticeRow(manager: EntityManager, recallId: number, noticeId: number): Promise<NoticeRow | null> {
  const [row]: NoticeRow[] = await manager.query(`${noticeSelect} WHERE n.recall_id = ? AND n.id = ?`, [
    recallId,
    noticeId,
  ]);
  return row ?? null;
}

export interface ShippedLine {
  consignee_id: number;
  consignee: string;
  country: string;
  contact_email: string | null;
  lot_id: number;
  lot_number: string;
  part: string;
  gtin: string;
  shipped: string | number;
}

/** Units of these lots shipped to each consignee (the lines a notice lists). */
export async function shippedLines(manager: EntityManager, lotIds: number[]): Promise<ShippedLine[]> {
  if (!lotIds.length) return [];
  return manager.query(
    `SELECT s.consignee_id, c.name AS consignee, c.country, c.contact_email, s.lot_id, l.lot_number,
            CONCAT(p.part_number, ' ', p.description) AS part, p.gtin, SUM(s.qty) AS shipped
       FROM shipment s
       JOIN consignee c ON c.id = s.consignee_id
       JOIN production_lot l ON l.id = s.lot_id
       JOIN part p ON p.id = l.part_id
      WHERE s.lot_id IN (?)
      GROUP BY s.consignee_id, c.name, c.country, c.contact_email, s.lot_id, l.lot_number, p.part_number, p.description,
               p.gtin
      ORDER BY c.name, l.lot_number`,
    [lotIds],
  );
}

export async function insertNotice(
  manager: EntityManager,
  notice: Pick<RecallNotice, 'recallId' | 'consigneeId' | 'replyToken' | 'recipient' | 'content' | 'sha256'> & {
    preparedBy: number;
  },
): Promise<number> {
  return insertReturningId(manager, RecallNotice, notice);
}

/** Rewrites a notice not yet issued (the strategy or the scope changed before it went out). */
export async function rewriteNotice(
  manager: EntityManager,
  id: number,
  notice: Pick<RecallNotice, 'recipient' | 'content' | 'sha256' | 'preparedBy'>,
): Promise<void> {
  await manager.getRepository(RecallNotice).update({ id, issuedAt: IsNull() }, { ...notice, preparedAt: new Date() });
}

export async function markIssued(manager: EntityManager, ids: number[], at: Date): Promise<void> {
  if (!ids.length) return;
  await manager
    .getRepository(RecallNotice)
    .createQueryBuilder()
    .update()
    .set({ issuedAt: at })
    .where('id IN (:...ids) AND issued_at IS NULL', { ids })
    .execute();
}

export interface TokenNoticeRow {
  id: number;
  recall_id: number;
  consignee_id: number;
  consignee: string;
  content: string;
  issued_at: Date | null;
  recall_number: string;
  mode: 'recall' | 'drill';
  status: 'open' | 'closed';
  action_asked: string | null;
}

/** The notice a reply link opens, with its recall's state; nothing else. */
export async function noticeByToken(
  manager: EntityManager,
  token: string,
  lock = false,
): Promise<TokenNoticeRow | null> {
  const [row]: TokenNoticeRow[] = await manager.query(
    `SELECT n.id, n.recall_id, n.consignee_id, c.name AS consignee, n.content, n.issued_at, r.recall_number, r.mode,
            r.status, f.action_asked
       FROM recall_notice n
       JOIN recall_investigation r ON r.id = n.recall_id
       JOIN consignee c ON c.id = n.consignee_id
       LEFT JOIN recall_field_action f ON f.recall_id = n.recall_id
      WHERE n.reply_token = ?${lock ? ' FOR UPDATE' : ''}`,
    [token],
  );
  return row ?? null;
}

export async function insertReply(
  manager: EntityManager,
  reply: { noticeId: number; contactName: string; clientAddress: string | null; repliedAt: Date },
  lots: Array<{ lotId: number; onHand: number; returned: number; destroyed: number; used: number }>,
): Promise<number> {
  const replyId = await insertReturningId(manager, NoticeReply, reply);
  await manager.getRepository(NoticeReplyLot).insert(lots.map((lot) => ({ ...lot, replyId })));
  return replyId;
}

export interface ReplyLotRow {
  reply_id: number;
  notice_id: number;
  contact_name: string;
  replied_at: Date;
  lot_id: number;
  on_hand: number;
  returned: number;
  destroyed: number;
  used: number;
}

/** Every reply to these notices with its lot counts, oldest first. */
export async function replyLotRows(manager: EntityManager, noticeIds: number[]): Promise<ReplyLotRow[]> {
  if (!noticeIds.length) return [];
  return manager.query(
    `SELECT r.id AS reply_id, r.notice_id, r.contact_name, r.replied_at, rl.lot_id, rl.on_hand, rl.returned,
            rl.destroyed, rl.used
       FROM notice_reply r JOIN notice_reply_lot rl ON rl.reply_id = r.id
      WHERE r.notice_id IN (?)
      ORDER BY r.id, rl.lot_id`,
    [noticeIds],
  );
}

export async function insertReturnedGoods(
  manager: EntityManager,
  receipt: Pick<ReturnedGoodsReceipt, 'recallId' | 'consigneeId' | 'lotId' | 'units' | 'note' | 'receivedBy'>,
): Promise<number> {
  return insertReturningId(manager, ReturnedGoodsReceipt, receipt);
}

export interface ReturnedGoodsRow {
  id: number;
  consignee_id: number;
  consignee: string;
  lot_id: number;
  lot_number: string;
  units: number;
  note: string | null;
  received_by: string;
  received_at: Date;
}

export async function returnedGoodsRows(manager: EntityManager, recallId: number): Promise<ReturnedGoodsRow[]> {
  return manager.query(
    `SELECT g.id, g.consignee_id, c.name AS consignee, g.lot_id, l.lot_number, g.units, g.note, p.name AS received_by,
            g.received_at
       FROM returned_goods_receipt g
       JOIN consignee c ON c.id = g.consignee_id
       JOIN production_lot l ON l.id = g.lot_id
       JOIN person p ON p.id = g.received_by
      WHERE g.recall_id = ?
      ORDER BY g.id`,
    [recallId],
  );
}

export interface ReminderCandidateRow {
  id: number;
  recall_id: number;
  recall_number: string;
  mode: 'recall' | 'drill';
  consignee: string;
  recipient: string | null;
  content: string;
  issued_at: Date;
  reminders_sent: number;
  last_reminder_at: Date | null;
  escalated_at: Date | null;
  reminder_every_days: number;
  escalate_after_reminders: number;
}

/** Issued notices of open recalls that have no reply yet, locked for the reminder run. */
export async function unansweredNotices(manager: EntityManager): Promise<ReminderCandidateRow[]> {
  return manager.query(
    `SELECT n.id, n.recall_id, r.recall_number, r.mode, c.name AS consignee, n.recipient, n.content, n.issued_at,
            n.reminders_sent, n.last_reminder_at, n.escalated_at, f.reminder_every_days, f.escalate_after_reminders
       FROM recall_notice n
       JOIN recall_investigation r ON r.id = n.recall_id AND r.status = 'open'
       JOIN recall_field_action f ON f.recall_id = n.recall_id
       JOIN consignee c ON c.id = n.consignee_id
      WHERE n.issued_at IS NOT NULL
        AND NOT EXISTS (SELECT 1 FROM notice_reply x WHERE x.notice_id = n.id)
      ORDER BY n.id
        FOR UPDATE SKIP LOCKED`,
  );
}

export async function markReminded(manager: EntityManager, id: number, at: Date): Promise<void> {
  await manager
    .getRepository(RecallNotice)
    .createQueryBuilder()
    .update()
    .set({ lastReminderAt: at, remindersSent: () => 'reminders_sent + 1' })
    .where('id = :id', { id })
    .execute();
}

export async function markEscalated(manager: EntityManager, ids: number[], at: Date): Promise<void> {
  if (!ids.length) return;
  await manager
    .getRepository(RecallNotice)
    .createQueryBuilder()
    .update()
    .set({ escalatedAt: at })
    .where('id IN (:...ids)', { ids })
    .execute();
}
