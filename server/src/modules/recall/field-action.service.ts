import { randomBytes } from 'node:crypto';
import type { z } from 'zod';
import type { DataSource, EntityManager } from 'typeorm';
import { canonicalJson } from '@shared/domain/ledger-hash';
import { assessEffectiveness, type Effectiveness, type NoticeFacts } from '@shared/domain/recall/effectiveness';
import { lotLines, mergeNotice, type NoticeLot } from '@shared/domain/recall/notice-template';
import { buildElementString } from '@shared/domain/gs1/element-string';
import { plantDate } from '@shared/domain/plant-time';
import {
  noticeContentSchema,
  type FieldActionView,
  type NoticeContent,
  type NoticePreview,
  fieldActionInputSchema,
  returnedGoodsInputSchema,
} from '@shared/schemas/field-action';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, sha256Hex, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { linkTo } from '../mail/links';
import { findOrganisation } from '../organisation/organisation.repository';
import { placeHolds } from './lot-holds';
import { findRecallRow, rerunSnapshots, type RecallRow } from './recall.repository';
import { snapshotContent } from './recall.service';
import {
  findStrategy,
  insertNotice,
  insertReturnedGoods,
  noticeRow,
  noticeRows,
  replyLotRows,
  returnedGoodsRows,
  rewriteNotice,
  saveStrategy,
  shippedLines,
  type NoticeRow,
  type ReturnedGoodsRow,
} from './field-action.repository';

const iso = (value: Date | null) => (value ? new Date(value).toISOString() : null);

/** The affected set as last traced: the latest re-run, else the opening snapshot. */
export async function latestScope(manager: EntityManager, recallId: number) {
  const reruns = await rerunSnapshots(manager, recallId);
  return (await snapshotContent(manager, recallId, reruns.at(-1)?.id)).content.trace;
}

async function recallOrFail(manager: EntityManager, recallId: number, lock = false): Promise<RecallRow> {
  const row = await findRecallRow(manager, recallId, lock);
  if (!row) throw AppError.notFound('Recall investigation');
  return row;
}

function refuseIfClosed(row: RecallRow, doing: string) {
  if (row.status !== 'open') throw AppError.rule(`${row.recall_number} is closed; ${doing} no longer`);
}

/** A change to an open recall's field action in one transaction, answered with the whole field action. */
async function changeOpenRecall(
  dataSource: DataSource,
  recallId: number,
  refusedWhenClosed: string,
  change: (manager: EntityManager, recall: RecallRow) => Promise<void>,
): Promise<FieldActionView> {
  await inTransaction(dataSource, async (manager) => {
    const recall = await recallOrFail(manager, recallId, true);
    refuseIfClosed(recall, refusedWhenClosed);
    await change(manager, recall);
  });
  return fieldActionView(dataSource, recallId);
}

export const parseNotice = (row: Pick<NoticeRow, 'content'>): NoticeContent =>
  noticeContentSchema.parse(JSON.parse(row.content));

/** What a caller has read already, so that effectiveness does not read it again. */
interface KnownFacts {
  strategy?: Awaited<ReturnType<typeof findStrategy>>;
  notices?: NoticeRow[];
  consigneesInScope?: number;
  returned?: ReturnedGoodsRow[];
}

/** The facts effectiveness is computed from: each notice's lots and replies, and the returns received. */
export async function effectivenessOf(
  manager: EntityManager,
  recallId: number,
  known: KnownFacts = {},
): Promise<Effectiveness | null> {
  const strategy = known.strategy !== undefined ? known.strategy : await findStrategy(manager, recallId);
  if (!strategy) return null;
  const rows = known.notices ?? (await noticeRows(manager, recallId));
  const replies = await replyLotRows(
    manager,
    rows.map((row) => row.id),
  );
  const consigneesInScope = known.consigneesInScope ?? (await latestScope(manager, recallId)).consignees.length;
  const facts: NoticeFacts[] = rows.map((row) => {
    const content = parseNotice(row);
    const byReply = new Map<number, NoticeFacts['replies'][number]>();
    for (const line of replies.filter((reply) => reply.notice_id === row.id)) {
      const reply = byReply.get(line.reply_id) ?? { repliedAt: new Date(line.replied_at).toISOString(), lots: [] };
      reply.lots.push({
        lotId: line.lot_id,
        onHand: line.on_hand,
        returned: line.returned,
        destroyed: line.destroyed,
        used: line.used,
      });
      byReply.set(line.reply_id, reply);
    }
    return {
      consigneeId: row.consignee_id,
      consignee: row.consignee,
      issuedAt: iso(row.issued_at),
      lots: content.lots.map((lot) => ({ lotId: lot.lotId, lotNumber: lot.lotNumber, shipped: lot.shipped })),
      replies: [...byReply.values()],
    };
  });
  const received = (known.returned ?? (await returnedGoodsRows(manager, recallId))).map((row) => ({
    consigneeId: row.consignee_id,
    lotId: row.lot_id,
    units: row.units,
  }));
  return assessEffectiveness({
    level: strategy.effectivenessLevel,
    levelBPercent: strategy.levelBPercent,
    notices: facts,
    consigneesInScope,
    received,
  });
}

export async function fieldActionView(dataSource: DataSource, recallId: number): Promise<FieldActionView> {
  const manager = dataSource.manager;
  const recall = await recallOrFail(manager, recallId);
  const strategy = await findStrategy(manager, recallId);
  const rows = await noticeRows(manager, recallId);
  const scope = await latestScope(manager, recallId);
  const returned = await returnedGoodsRows(manager, recallId);
  const noticed = new Set(rows.map((row) => row.consignee_id));
  return {
    recallId,
    recallNumber: recall.recall_number,
    mode: recall.mode,
    status: recall.status,
    strategy: strategy && {
      level: strategy.effectivenessLevel,
      levelBPercent: strategy.levelBPercent,
      actionAsked: strategy.actionAsked,
      template: strategy.noticeTemplate,
      reminderEveryDays: strategy.reminderEveryDays,
      escalateAfterReminders: strategy.escalateAfterReminders,
      setBy: strategy.setByName,
      setAt: new Date(strategy.setAt).toISOString(),
    },
    notices: rows.map((row) => ({
      id: row.id,
      consigneeId: row.consignee_id,
      consignee: row.consignee,
      recipient: row.recipient,
      lots: parseNotice(row).lots,
      preparedAt: new Date(row.prepared_at).toISOString(),
      issuedAt: iso(row.issued_at),
      replies: Number(row.replies),
      lastReplyAt: iso(row.last_reply_at),
      lastContact: row.last_contact,
      remindersSent: row.reminders_sent,
      lastReminderAt: iso(row.last_reminder_at),
      escalatedAt: iso(row.escalated_at),
    })),
    notPrepared: scope.consignees
      .filter((consignee) => !noticed.has(consignee.id))
      .map((consignee) => ({ id: consignee.id, name: consignee.name })),
    waitingToIssue: rows.filter((row) => !row.issued_at).length,
    effectiveness: await effectivenessOf(manager, recallId, {
      strategy,
      notices: rows,
      consigneesInScope: scope.consignees.length,
      returned,
    }),
    returnedGoods: returned.map((row) => ({
      id: row.id,
      consignee: row.consignee,
      consigneeId: row.consignee_id,
      lotId: row.lot_id,
      lotNumber: row.lot_number,
      units: row.units,
      note: row.note,
      receivedBy: row.received_by,
      receivedAt: new Date(row.received_at).toISOString(),
    })),
  };
}

/** Sets (or changes) the strategy: level, action asked, the notice text and the reminder schedule. */
export async function setStrategy(
  dataSource: DataSource,
  recallId: number,
  input: z.output<typeof fieldActionInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<FieldActionView> {
  return changeOpenRecall(dataSource, recallId, 'its field action cannot change', async (manager) => {
    const before = await findStrategy(manager, recallId);
    await saveStrategy(manager, {
      recallId,
      effectivenessLevel: input.level,
      levelBPercent: input.level === 'B' ? input.levelBPercent : null,
      actionAsked: input.actionAsked,
      noticeTemplate: input.template,
      reminderEveryDays: input.reminderEveryDays,
      escalateAfterReminders: input.escalateAfterReminders,
      setBy: person.id,
    });
    const summary = (strategy: typeof input | null) =>
      strategy && {
        level: strategy.level,
        levelBPercent: strategy.levelBPercent,
        actionAsked: strategy.actionAsked,
        templateSha256: sha256Hex(strategy.template),
        reminderEveryDays: strategy.reminderEveryDays,
        escalateAfterReminders: strategy.escalateAfterReminders,
      };
    await appendLedgerEvent(manager, {
      actor,
      action: 'recall.field-action-set',
      entity: { type: 'recall', id: recallId },
      before: before
        ? summary({
            level: before.effectivenessLevel,
            levelBPercent: before.levelBPercent,
            actionAsked: before.actionAsked,
            template: before.noticeTemplate,
            reminderEveryDays: before.reminderEveryDays,
            escalateAfterReminders: before.escalateAfterReminders,
          })
        : null,
      after: summary(input),
      origin,
    });
  });
}

/** A reply link's secret: 32 random bytes, base64url (43 characters); never a record id. */
export const newReplyToken = () => randomBytes(32).toString('base64url');

export const replyLink = (token: string) => linkTo(`/reply/${token}`);

/**
 * One notice per consignee in the latest traced scope, merged from the strategy's template. A notice
 * not yet issued is rewritten (the strategy or the scope may have changed); an issued one stays as sent.
 */
export async function prepareNotices(
  dataSource: DataSource,
  recallId: number,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<FieldActionView> {
  return changeOpenRecall(dataSource, recallId, 'notices cannot be prepared', async (manager, recall) => {
    const strategy = await findStrategy(manager, recallId);
    if (!strategy) throw AppError.rule('Set the field action (level, action asked and notice text) first');
    const scope = await latestScope(manager, recallId);
    const lines = await shippedLines(
      manager,
      scope.lots.map((lot) => lot.id),
    );
    if (!lines.length) throw AppError.rule('No affected unit was shipped; there is no consignee to notify');
    const organisation = await findOrganisation(manager);
    const firm = organisation?.name ?? '';
    const date = plantDate(new Date(), organisation?.timeZone ?? 'UTC');
    const existing = new Map((await noticeRows(manager, recallId, true)).map((row) => [row.consignee_id, row]));
    const consignees = [...new Set(lines.map((line) => line.consignee_id))];
    const counts = { prepared: 0, rewritten: 0, alreadyIssued: 0 };
    for (const consigneeId of consignees) {
      const own = lines.filter((line) => line.consignee_id === consigneeId);
      const first = own[0]!;
      const notice = existing.get(consigneeId);
      if (notice?.issued_at) {
        counts.alreadyIssued++;
        continue;
      }
      const token = notice?.reply_token ?? newReplyToken();
      const lots: Array<NoticeLot & { lotId: number }> = own.map((line) => ({
        lotId: line.lot_id,
        lotNumber: line.lot_number,
        part: line.part,
        gtin: line.gtin,
        shipped: Number(line.shipped),
        udi: buildElementString({
          gtin: line.gtin,
          lot: line.lot_number,
          serial: null,
          expiry: null,
          productionDate: null,
        }),
      }));
      const drill = recall.mode === 'drill';
      const content: NoticeContent = {
        recallNumber: recall.recall_number,
        drill,
        consignee: { id: consigneeId, name: first.consignee, country: first.country },
        recipient: first.contact_email,
        subject: `${drill ? 'RECALL DRILL (exercise): ' : ''}Medical device recall ${recall.recall_number}`,
        text: mergeNotice(strategy.noticeTemplate, {
          firm,
          consignee: first.consignee,
          recallNumber: recall.recall_number,
          date,
          lots: lotLines(lots),
          actionAsked: strategy.actionAsked,
          replyLink: replyLink(token),
        }),
        lots,
      };
      const text = canonicalJson(content);
      const fields = { recipient: first.contact_email, content: text, sha256: sha256Hex(text), preparedBy: person.id };
      if (notice) {
        await rewriteNotice(manager, notice.id, fields);
        counts.rewritten++;
      } else {
        await insertNotice(manager, { recallId, consigneeId, replyToken: token, ...fields });
        counts.prepared++;
      }
    }
    await appendLedgerEvent(manager, {
      actor,
      action: 'recall.notices-prepared',
      entity: { type: 'recall', id: recallId },
      after: counts,
      origin,
    });
  });
}

export async function noticePreview(
  dataSource: DataSource,
  recallId: number,
  noticeId: number,
): Promise<NoticePreview> {
  const row = await noticeRow(dataSource.manager, recallId, noticeId);
  if (!row) throw AppError.notFound('Notice');
  return { id: row.id, sha256: row.sha256, issuedAt: iso(row.issued_at), content: parseNotice(row) };
}

/**
 * Returned units received at the plant against the recall, a consignee and a lot of its notice;
 * the lot is held under the recall (one hold per lot) until a QA approver decides what becomes of them.
 */
export async function receiveReturnedGoods(
  dataSource: DataSource,
  recallId: number,
  input: z.output<typeof returnedGoodsInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<FieldActionView> {
  return changeOpenRecall(
    dataSource,
    recallId,
    'returned goods cannot be received against it',
    async (manager, recall) => {
      if (recall.mode !== 'recall') throw AppError.rule('A drill recalls nothing; returned goods belong to a recall');
      const notice = (await noticeRows(manager, recallId)).find((row) => row.consignee_id === input.consigneeId);
      if (!notice)
        throw AppError.rule('This consignee has no notice in this recall', {
          consigneeId: 'No notice to this consignee',
        });
      const lot = parseNotice(notice).lots.find((candidate) => candidate.lotId === input.lotId);
      if (!lot)
        throw AppError.rule(`${notice.consignee} received no units of this lot in this recall`, {
          lotId: 'Not shipped to this consignee',
        });
      const receiptId = await insertReturnedGoods(manager, {
        recallId,
        consigneeId: input.consigneeId,
        lotId: input.lotId,
        units: input.units,
        note: input.note || null,
        receivedBy: person.id,
      });
      const held = await placeHolds(
        manager,
        [{ id: lot.lotId, lotNumber: lot.lotNumber }],
        {
          recallId,
          recallNumber: recall.recall_number,
          reason: `Returned goods under ${recall.recall_number}`,
          placedBy: person.id,
        },
        actor,
        origin,
        true,
      );
      await appendLedgerEvent(manager, {
        actor,
        action: 'recall.goods-returned',
        entity: { type: 'recall', id: recallId },
        after: {
          receiptId,
          consignee: notice.consignee,
          lotNumber: lot.lotNumber,
          units: input.units,
          note: input.note ?? null,
          heldNow: held,
        },
        origin,
      });
    },
  );
}
