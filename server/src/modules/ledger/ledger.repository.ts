import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { canonicalJson, ledgerHashInput, type LedgerEventContent } from '@shared/domain/ledger-hash';

export interface Actor {
  id: number | null;
  name: string | null;
  role: string | null;
}

export interface RequestOrigin {
  requestId: string | null;
  clientAddress: string | null;
}

export interface LedgerEventInput {
  actor: Actor;
  action: string;
  entity: { type: string; id: string | number | null };
  before?: unknown;
  after?: unknown;
  reason?: string | null;
  origin?: RequestOrigin;
}

export const sha256Hex = (text: string): string => createHash('sha256').update(text, 'utf8').digest('hex');

/**
 * Appends one event to the audit ledger inside the caller's transaction, so that the event and
 * the change it records commit or roll back together. The chain-head row lock serialises writers.
 */
export async function appendLedgerEvent(manager: EntityManager, input: LedgerEventInput, now = new Date()): Promise<{ seq: number; hash: string }> {
  if (!manager.queryRunner?.isTransactionActive) throw new Error('ledger events are written inside the transaction of the change they record');
  const [head] = (await manager.query('SELECT seq, hash FROM audit_chain_head WHERE id = 1 FOR UPDATE')) as Array<{ seq: string; hash: string }>;
  if (!head) throw new Error('the audit chain head is missing; run the migrations');
  const content: LedgerEventContent = {
    seq: Number(head.seq) + 1,
    occurredAt: now.toISOString(),
    actor: { id: input.actor.id, name: input.actor.name, role: input.actor.role },
    action: input.action,
    entity: { type: input.entity.type, id: input.entity.id === null ? null : String(input.entity.id) },
    before: input.before ?? null,
    after: input.after ?? null,
    reason: input.reason ?? null,
    requestId: input.origin?.requestId ?? null,
    clientAddress: input.origin?.clientAddress ?? null,
  };
  const hash = sha256Hex(ledgerHashInput(head.hash, content));
  await manager.query(
    `INSERT INTO audit_event (seq, occurred_at, actor_id, actor_name, actor_role, action, entity_type, entity_id,
       before_json, after_json, reason, request_id, client_address, previous_hash, hash)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    [
      content.seq,
      now,
      content.actor.id,
      content.actor.name,
      content.actor.role,
      content.action,
      content.entity.type,
      content.entity.id,
      content.before === null ? null : canonicalJson(content.before),
      content.after === null ? null : canonicalJson(content.after),
      content.reason,
      content.requestId,
      content.clientAddress,
      head.hash,
      hash,
    ],
  );
  await manager.query('UPDATE audit_chain_head SET seq = ?, hash = ? WHERE id = 1', [content.seq, hash]);
  return { seq: content.seq, hash };
}
