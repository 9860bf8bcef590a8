import type { z } from 'zod';
import type { DataSource, EntityManager } from 'typeorm';
import { canonicalJson } from '@shared/domain/ledger-hash';
import { diffAffectedSets, needsHold } from '@shared/domain/recall/snapshot-diff';
import {
  openRecallInputSchema,
  type RecallDetail,
  type RecallListQuery,
  type RecallRerun,
  type RecallSnapshotContent,
  type RecallSnapshotMeta,
  type RecallSummary,
} from '@shared/schemas/recall';
import type { ForwardStart } from '@shared/schemas/trace';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, sha256Hex, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { nextSequence } from '../manufacturing/numbering.repository';
import { forwardTraceIn } from '../trace/trace.service';
import { holdsOfRecall, placeHolds } from './lot-holds';
import {
  findRecallRow,
  insertRecall,
  insertSnapshot,
  recallRows,
  rerunSnapshots,
  snapshotRow,
  type RecallRow,
  type SnapshotRow,
} from './recall.repository';

import { queueRecallOpenedMail, queueRecallWidenedMail } from './recall-mails';

const triggerKey = { heat: 'heatId', piece: 'pieceId', run: 'runId', supplier: 'supplierId', part: 'partId' } as const;

function triggerOf(row: RecallRow): ForwardStart {
  return {
    [triggerKey[row.trigger_kind]]: row.trigger_id,
    ...(row.window_from ? { from: row.window_from } : {}),
    ...(row.window_to ? { to: row.window_to } : {}),
  } as ForwardStart;
}

function toSummary(row: RecallRow): RecallSummary {
  return {
    id: row.id,
    recallNumber: row.recall_number,
    mode: row.mode,
    status: row.status,
    triggerLabel: row.trigger_label,
    reason: row.reason,
    openedBy: row.opened_by,
    openedAt: new Date(row.opened_at).toISOString(),
    closedAt: row.closed_at ? new Date(row.closed_at).toISOString() : null,
    affectedLots: Number(row.affected_lots ?? 0),
    activeHolds: Number(row.active_holds),
  };
}

const toMeta = (row: SnapshotRow): RecallSnapshotMeta => ({
  id: row.id,
  kind: row.kind,
  takenAt: new Date(row.taken_at).toISOString(),
  takenBy: row.taken_by,
  sha256: row.sha256,
});

export async function listRecalls(dataSource: DataSource, query: RecallListQuery) {
  const { total, rows } = await recallRows(dataSource.manager, query);
  return { items: rows.map(toSummary), total, page: query.page, pageSize: query.pageSize };
}

/** A stored snapshot's content, read back exactly as frozen. */
export async function snapshotContent(
  manager: EntityManager,
  recallId: number,
  snapshotId?: number,
): Promise<{ meta: RecallSnapshotMeta; content: RecallSnapshotContent }> {
  const row = await snapshotRow(manager, recallId, snapshotId);
  if (!row?.content) throw AppError.notFound('Snapshot');
  return { meta: toMeta(row), content: JSON.parse(row.content) as RecallSnapshotContent };
}

export async function recallDetail(dataSource: DataSource, id: number): Promise<RecallDetail> {
  const manager = dataSource.manager;
  const row = await findRecallRow(manager, id);
  if (!row) throw AppError.notFound('Recall investigation');
  const opening = await snapshotContent(manager, id);
  const reruns = await rerunSnapshots(manager, id);
  const last = reruns.at(-1);
  const latest = last ? await snapshotContent(manager, id, last.id) : null;
  return {
    ...toSummary(row),
    trigger: triggerOf(row),
    opening: { ...opening.meta, content: opening.content },
    reruns: reruns.map(toMeta),
    latest: latest
      ? { snapshot: latest.meta, diff: diffAffectedSets(opening.content.trace, latest.content.trace) }
      : null,
    holds: await holdsOfRecall(manager, id),
  };
}

/** Traces now and stores what was found, unchangeable, with who asked and when. */
async function freeze(
  manager: EntityManager,
  recall: { id: number; recallNumber: string; mode: 'recall' | 'drill' },
  trigger: ForwardStart,
  kind: 'opening' | 'rerun',
  person: Person,
) {
  const started = performance.now();
  const trace = await forwardTraceIn(manager, trigger);
  const tracedInMs = Math.round(performance.now() - started);
  const takenAt = new Date();
  const content: RecallSnapshotContent = {
    recallNumber: recall.recallNumber,
    mode: recall.mode,
    trigger,
    takenAt: takenAt.toISOString(),
    takenBy: person.name,
    tracedInMs,
    trace,
  };
  const text = canonicalJson(content);
  const sha256 = sha256Hex(text);
  const snapshotId = await insertSnapshot(manager, {
    recallId: recall.id,
    kind,
    takenBy: person.id,
    takenAt,
    content: text,
    sha256,
  });
  return {
    meta: { id: snapshotId, kind, takenAt: takenAt.toISOString(), takenBy: person.name, sha256 },
    content,
  };
}

const holdable = (trace: RecallSnapshotContent['trace']) =>
  trace.lots.filter(needsHold).map((lot) => ({ id: lot.id, lotNumber: lot.lotNumber }));

/**
 * Opens an investigation from any forward-trace start: freezes the affected set; in a recall
 * (not a drill) holds every affected lot with units still here and tells the recall team.
 */
export async function openRecall(
  dataSource: DataSource,
  input: z.output<typeof openRecallInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<RecallDetail> {
  const id = await inTransaction(dataSource, async (manager) => {
    const preview = await forwardTraceIn(manager, input.trigger);
    const year = new Date().getUTCFullYear();
    const prefix = `${input.mode === 'drill' ? 'DR' : 'RC'}-${year}-`;
    const sequence = await nextSequence(manager, 'recall_investigation', prefix);
    const recallNumber = `${prefix}${String(sequence).padStart(4, '0')}`;
    const [kind, triggerId] = (Object.entries(triggerKey) as Array<[RecallRow['trigger_kind'], keyof ForwardStart]>)
      .map(([key, field]) => [key, input.trigger[field]] as const)
      .find(([, value]) => value !== undefined)!;
    const recallId = await insertRecall(manager, {
      recallNumber,
      mode: input.mode,
      triggerKind: kind,
      triggerId: triggerId as number,
      windowFrom: input.trigger.from ?? null,
      windowTo: input.trigger.to ?? null,
      triggerLabel: preview.start.slice(0, 300),
      reason: input.reason,
      openedBy: person.id,
    });
    const recall = { id: recallId, recallNumber, mode: input.mode };
    const snapshot = await freeze(manager, recall, input.trigger, 'opening', person);
    await appendLedgerEvent(manager, {
      actor,
      action: input.mode === 'drill' ? 'recall.drill-opened' : 'recall.opened',
      entity: { type: 'recall', id: recall.id },
      after: {
        recallNumber,
        trigger: input.trigger,
        triggerLabel: preview.start,
        snapshotSha256: snapshot.meta.sha256,
        affectedLots: snapshot.content.trace.lots.length,
      },
      reason: input.reason,
      origin,
    });
    if (input.mode === 'recall') {
      const held = await placeHolds(
        manager,
        holdable(snapshot.content.trace),
        { recallId: recall.id, recallNumber, reason: input.reason, placedBy: person.id },
        actor,
        origin,
      );
      await queueRecallOpenedMail(
        manager,
        { id: recall.id, recallNumber, triggerLabel: preview.start, reason: input.reason, openedBy: person.name, held },
        snapshot.content.trace,
      );
    }
    return recall.id;
  });
  return recallDetail(dataSource, id);
}

/**
 * Traces again, stores the result beside the opening snapshot and says what differs; a recall holds lots that are newly
 * affected.
 */
export async function rerunRecall(
  dataSource: DataSource,
  id: number,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<RecallRerun> {
  return inTransaction(dataSource, async (manager) => {
    const row = await findRecallRow(manager, id, true);
    if (!row) throw AppError.notFound('Recall investigation');
    if (row.status !== 'open') throw AppError.rule(`${row.recall_number} is closed; its trace can no longer be re-run`);
    const opening = await snapshotContent(manager, id);
    const snapshot = await freeze(
      manager,
      { id, recallNumber: row.recall_number, mode: row.mode },
      triggerOf(row),
      'rerun',
      person,
    );
    const diff = diffAffectedSets(opening.content.trace, snapshot.content.trace);
    const held =
      row.mode === 'recall'
        ? await placeHolds(
            manager,
            holdable(snapshot.content.trace),
            { recallId: id, recallNumber: row.recall_number, reason: row.reason, placedBy: person.id },
            actor,
            origin,
          )
        : [];
    await appendLedgerEvent(manager, {
      actor,
      action: 'recall.rerun',
      entity: { type: 'recall', id },
      after: {
        snapshotSha256: snapshot.meta.sha256,
        lotsAdded: diff.lotsAdded.map((lot) => lot.lotNumber),
        lotsRemoved: diff.lotsRemoved.map((lot) => lot.lotNumber),
        lotsChanged: diff.lotsChanged.length,
        held,
      },
      origin,
    });
    if (row.mode === 'recall' && !diff.unchanged)
      await queueRecallWidenedMail(manager, { id, recallNumber: row.recall_number, rerunBy: person.name }, diff, held);
    return { snapshot: snapshot.meta, diff, heldNow: held };
  });
}
