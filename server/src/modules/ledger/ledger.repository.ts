import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { canonicalJson, ledgerHashInput, type LedgerEventContent } from '@shared/domain/ledger-hash';
import { ledgerSigner, type LedgerSigner } from './ledger-signing-key';

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

/** The head of the audit chain (its last event's sequence and hash), locked until the transaction ends. */
export async function lockChainHead(
  manager: EntityManager,
): Promise<{ seq: string; hash: string; signed: number } | undefined> {
  const [head] = (await manager.query(
    'SELECT seq, hash, signed FROM audit_chain_head WHERE id = 1 FOR UPDATE',
  )) as Array<{
    seq: string;
    hash: string;
    signed: number;
  }>;
  return head;
}

export const sha256Hex = (text: string): string => createHash('sha256').update(text, 'utf8').digest('hex');

/**
 * Appends one event to the audit ledger inside the caller's transaction, so that the event and
 * the change it records commit or roll back together. The chain-head row lock serialises writers.
 * Each event is signed (Ed25519) with the installation's ledger key; when the event before it is
 * unsigned (written before signing began), a signed ledger.signing-started event comes first.
 */
export async function appendLedgerEvent(
  manager: EntityManager,
  input: LedgerEventInput,
  now = new Date(),
): Promise<{ seq: number; hash: string }> {
  if (!manager.queryRunner?.isTransactionActive)
    throw new Error('ledger events are written inside the transaction of the change they record');
  const head = await lockChainHead(manager);
  if (!head) throw new Error('the audit chain head is missing; run the migrations');
  const signer = ledgerSigner();
  let previous = { seq: Number(head.seq), hash: head.hash };
  if (previous.seq > 0 && !Number(head.signed)) {
    previous = await insertSigned(
      manager,
      signer,
      previous,
      {
        actor: { id: null, name: 'Ingotrace', role: null },
        action: 'ledger.signing-started',
        entity: { type: 'audit-ledger', id: null },
        after: { unsignedThrough: previous.seq, keyId: signer.keyId, publicKey: signer.publicKeyPem },
      },
      now,
    );
  }
  const written = await insertSigned(manager, signer, previous, input, now);
  await manager.query('UPDATE audit_chain_head SET seq = ?, hash = ?, signed = 1 WHERE id = 1', [
    written.seq,
    written.hash,
  ]);
  return written;
}

async function insertSigned(
  manager: EntityManager,
  signer: LedgerSigner,
  previous: { seq: number; hash: string },
  input: LedgerEventInput,
  now: Date,
): Promise<{ seq: number; hash: string }> {
  const content: LedgerEventContent = {
    seq: previous.seq + 1,
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
  const hash = sha256Hex(ledgerHashInput(previous.hash, content));
  await manager.query(
    `INSERT INTO audit_event (seq, occurred_at, actor_id, actor_name, actor_role, action, entity_type, entity_id,
       before_json, after_json, reason, request_id, client_address, previous_hash, hash, signature, key_id)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
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
      previous.hash,
      hash,
      signer.signEvent(hash),
      signer.keyId,
    ],
  );
  return { seq: content.seq, hash };
}
