import type { DataSource, EntityManager } from 'typeorm';
import { canonicalJson } from '@shared/domain/ledger-hash';
import { diffAffectedSets, needsHold } from '@shared/domain/recall/snapshot-diff';
import {
  openRecallInputSchema,
  type OpenRecallInput,
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
import { queueRecallOpenedMail, queueRecallWidenedMail } from './recall-mails';

export interface RecallRow {
  id: number;
  recall_number: string;
  mode: 'recall' | 'drill';
  status: 'open' | 'closed';
  trigger_kind: 'heat' | 'piece' | 'run' | 'supplier' | 'part';
  trigger_id: number;
  window_from: string | null;
  window_to: string | null;
  trigger_label: string;
  reason: string;
  opened_by_id: number;
  opened_by: string;
  opened_at: Date;
  closed_at: Date | null;
  affected_lots: string | number | null;
  active_holds: string | number;
}

interface SnapshotRow {
  id: number;
  kind: 'opening' | 'rerun';
  taken_at: Date;
  taken_by: string;
  sha256: string;
  content?: string;
}

const recallSelect = `SELECT r.id, r.recall_number, r.mode, r.status, r.trigger_kind, r.trigger_id, DATE_FORMAT(r.window_from, '%Y-%m-%d') AS window_from,
                             DATE_FORMAT(r.window_to, '%Y-%m-%d') AS window_to, r.trigger_label, r.reason, r.opened_by AS opened_by_id, p.name AS opened_by, r.opened_at, r.closed_at,
                             (SELECT JSON_LENGTH(s.content, '$.trace.lots') FROM recall_snapshot s WHERE s.recall_id = r.id ORDER BY s.id DESC LIMIT 1) AS affected_lots,
                             (SELECT COUNT(*) FROM lot_hold h WHERE h.recall_id = r.id AND h.lifted_at IS NULL) AS active_holds
                        FROM recall_investigation r JOIN person p ON p.id = r.opened_by`;

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

export async function findRecallRow(manager: EntityManager, id: number, lock = false): Promise<RecallRow | null> {
  const [row]: RecallRow[] = await manager.query(`${recallSelect} WHERE r.id = ?${lock ? ' FOR UPDATE' : ''}`, [id]);
  return row ?? null;
}

export async function listRecalls(dataSource: DataSource, query: RecallListQuery) {
  const where: string[] = [];
  const parameters: unknown[] = [];
  for (const [column, value] of [
    ['r.status', query.status],
    ['r.mode', query.mode],
  ] as const) {
    if (!value) continue;
    where.push(`${column} = ?`);
    parameters.push(value);
  }
  const clause = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [count]: Array<{ total: string }> = await dataSource.query(
    `SELECT COUNT(*) AS total FROM recall_investigation r ${clause}`,
    parameters,
  );
  const rows: RecallRow[] = await dataSource.query(
    `${recallSelect} ${clause} ORDER BY r.opened_at DESC, r.id DESC LIMIT ? OFFSET ?`,
    [...parameters, query.pageSize, (query.page - 1) * query.pageSize],
  );
  return { items: rows.map(toSummary), total: Number(count?.total ?? 0), page: query.page, pageSize: query.pageSize };
}

/** A stored snapshot's content, read back exactly as frozen. */
export async function snapshotContent(
  manager: EntityManager,
  recallId: number,
  snapshotId?: number,
): Promise<{ meta: RecallSnapshotMeta; content: RecallSnapshotContent }> {
  const rows: SnapshotRow[] = await manager.query(
    `SELECT s.id, s.kind, s.taken_at, p.name AS taken_by, s.sha256, s.content FROM recall_snapshot s JOIN person p ON p.id = s.taken_by
      WHERE s.recall_id = ? ${snapshotId ? 'AND s.id = ?' : "AND s.kind = 'opening'"} ORDER BY s.id LIMIT 1`,
    snapshotId ? [recallId, snapshotId] : [recallId],
  );
  const row = rows[0];
  if (!row?.content) throw AppError.notFound('Snapshot');
  return { meta: toMeta(row), content: JSON.parse(row.content) as RecallSnapshotContent };
}

export async function recallDetail(dataSource: DataSource, id: number): Promise<RecallDetail> {
  const manager = dataSource.manager;
  const row = await findRecallRow(manager, id);
  if (!row) throw AppError.notFound('Recall investigation');
  const opening = await snapshotContent(manager, id);
  const reruns: SnapshotRow[] = await manager.query(
    "SELECT s.id, s.kind, s.taken_at, p.name AS taken_by, s.sha256 FROM recall_snapshot s JOIN person p ON p.id = s.taken_by WHERE s.recall_id = ? AND s.kind = 'rerun' ORDER BY s.id",
    [id],
  );
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
  const result: { insertId: number } = await manager.query(
    'INSERT INTO recall_snapshot (recall_id, kind, taken_by, taken_at, content, sha256) VALUES (?, ?, ?, ?, ?, ?)',
    [recall.id, kind, person.id, takenAt, text, sha256],
  );
  return {
    meta: { id: Number(result.insertId), kind, takenAt: takenAt.toISOString(), takenBy: person.name, sha256 },
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
  raw: OpenRecallInput,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<RecallDetail> {
  const input = openRecallInputSchema.parse(raw);
  const id = await inTransaction(dataSource, async (manager) => {
    const preview = await forwardTraceIn(manager, input.trigger);
    const year = new Date().getUTCFullYear();
    const prefix = `${input.mode === 'drill' ? 'DR' : 'RC'}-${year}-`;
    const recallNumber = `${prefix}${String(await nextSequence(manager, 'recall_investigation', prefix)).padStart(4, '0')}`;
    const [kind, triggerId] = (Object.entries(triggerKey) as Array<[RecallRow['trigger_kind'], keyof ForwardStart]>)
      .map(([key, field]) => [key, input.trigger[field]] as const)
      .find(([, value]) => value !== undefined)!;
    const result: { insertId: number } = await manager.query(
      'INSERT INTO recall_investigation (recall_number, mode, trigger_kind, trigger_id, window_from, window_to, trigger_label, reason, opened_by) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)',
      [
        recallNumber,
        input.mode,
        kind,
        triggerId,
        input.trigger.from ?? null,
        input.trigger.to ?? null,
        preview.start.slice(0, 300),
        input.reason,
        person.id,
      ],
    );
    const recall = { id: Number(result.insertId), recallNumber, mode: input.mode };
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

/** Traces again, stores the result beside the opening snapshot and says what differs; a recall holds lots that are newly affected. */
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
