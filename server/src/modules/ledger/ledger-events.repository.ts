import type { EntityManager } from 'typeorm';
import type { LedgerEventContent } from '@shared/domain/ledger-hash';
import type { LedgerEvent, LedgerQuery } from '@shared/schemas/audit';

export interface EventRow {
  seq: string;
  occurred_at: Date;
  actor_id: number | null;
  actor_name: string | null;
  actor_role: string | null;
  action: string;
  entity_type: string;
  entity_id: string | null;
  before_json: string | null;
  after_json: string | null;
  reason: string | null;
  request_id: string | null;
  client_address: string | null;
  previous_hash: string;
  hash: string;
  signature: string | null;
  key_id: string | null;
}

/** The hashed content of a stored event, rebuilt exactly as it was hashed when written. */
export function contentOf(row: EventRow): LedgerEventContent {
  return {
    seq: Number(row.seq),
    occurredAt: new Date(row.occurred_at).toISOString(),
    actor: { id: row.actor_id === null ? null : Number(row.actor_id), name: row.actor_name, role: row.actor_role },
    action: row.action,
    entity: { type: row.entity_type, id: row.entity_id },
    before: row.before_json === null ? null : JSON.parse(row.before_json),
    after: row.after_json === null ? null : JSON.parse(row.after_json),
    reason: row.reason,
    requestId: row.request_id,
    clientAddress: row.client_address,
  };
}

export function toLedgerEvent(row: EventRow): LedgerEvent {
  return { ...contentOf(row), previousHash: row.previous_hash, hash: row.hash };
}

/** Streams events in sequence order, a batch at a time. */
export async function* eventsInOrder(
  manager: EntityManager,
  batchSize = 5000,
  afterSeq = 0,
): AsyncGenerator<EventRow[]> {
  let after = afterSeq;
  for (;;) {
    const rows: EventRow[] = await manager.query('SELECT * FROM audit_event WHERE seq > ? ORDER BY seq LIMIT ?', [
      after,
      batchSize,
    ]);
    if (rows.length === 0) return;
    yield rows;
    after = Number(rows[rows.length - 1]!.seq);
  }
}

export async function chainHead(manager: EntityManager): Promise<{ seq: number; hash: string }> {
  const [head]: Array<{ seq: string; hash: string }> = await manager.query(
    'SELECT seq, hash FROM audit_chain_head WHERE id = 1',
  );
  return { seq: Number(head?.seq ?? 0), hash: head?.hash ?? '' };
}

export async function eventAt(manager: EntityManager, seq: number): Promise<LedgerEvent | null> {
  const [row]: EventRow[] = await manager.query('SELECT * FROM audit_event WHERE seq = ?', [seq]);
  return row ? toLedgerEvent(row) : null;
}

function filters(query: Omit<LedgerQuery, 'page' | 'pageSize' | 'order'>): { clause: string; parameters: unknown[] } {
  const where: string[] = [];
  const parameters: unknown[] = [];
  if (query.actor) {
    where.push('actor_name LIKE ?');
    parameters.push(`%${query.actor.replace(/[\\%_]/g, (character) => `\\${character}`)}%`);
  }
  if (query.action) {
    where.push('action = ?');
    parameters.push(query.action);
  }
  if (query.entityType) {
    where.push('entity_type = ?');
    parameters.push(query.entityType);
  }
  if (query.entityId) {
    where.push('entity_id = ?');
    parameters.push(query.entityId);
  }
  if (query.from) {
    where.push('occurred_at >= ?');
    parameters.push(new Date(query.from));
  }
  if (query.to) {
    where.push('occurred_at <= ?');
    parameters.push(new Date(query.to));
  }
  return { clause: where.length ? `WHERE ${where.join(' AND ')}` : '', parameters };
}

export async function findEvents(
  manager: EntityManager,
  query: LedgerQuery,
): Promise<{ items: LedgerEvent[]; total: number }> {
  const { clause, parameters } = filters(query);
  const [count]: Array<{ total: string }> = await manager.query(
    `SELECT COUNT(*) AS total FROM audit_event ${clause}`,
    parameters,
  );
  const direction = query.order === 'oldest-first' ? 'ASC' : 'DESC';
  const rows: EventRow[] = await manager.query(
    `SELECT * FROM audit_event ${clause} ORDER BY seq ${direction} LIMIT ? OFFSET ?`,
    [...parameters, query.pageSize, (query.page - 1) * query.pageSize],
  );
  return { items: rows.map(toLedgerEvent), total: Number(count?.total ?? 0) };
}

/** Every matching event, oldest first, for exports (bounded). */
export async function* matchingEvents(
  manager: EntityManager,
  query: Omit<LedgerQuery, 'page' | 'pageSize' | 'order'>,
  batchSize = 5000,
): AsyncGenerator<LedgerEvent> {
  const { clause, parameters } = filters(query);
  let after = 0;
  for (;;) {
    const rows: EventRow[] = await manager.query(
      `SELECT * FROM audit_event ${clause ? `${clause} AND` : 'WHERE'} seq > ? ORDER BY seq LIMIT ?`,
      [...parameters, after, batchSize],
    );
    if (rows.length === 0) return;
    for (const row of rows) yield toLedgerEvent(row);
    after = Number(rows[rows.length - 1]!.seq);
  }
}

export async function distinctActions(manager: EntityManager): Promise<string[]> {
  const rows: Array<{ action: string }> = await manager.query(
    'SELECT DISTINCT action FROM audit_event ORDER BY action',
  );
  return rows.map((row) => row.action);
}
