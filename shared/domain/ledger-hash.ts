import canonicalize from 'canonicalize';

/**
 * The audit ledger's hash chain. Each event's hash is SHA-256 over the previous event's hash
 * followed by the RFC 8785 canonical JSON of the event's content, so that changing, removing or
 * reordering any event breaks every hash after it. Pure: the caller supplies the SHA-256.
 */
export const GENESIS_HASH = '0'.repeat(64);

export interface LedgerEventContent {
  seq: number;
  occurredAt: string;
  actor: { id: number | null; name: string | null; role: string | null };
  action: string;
  entity: { type: string; id: string | null };
  before: unknown;
  after: unknown;
  reason: string | null;
  requestId: string | null;
  clientAddress: string | null;
}

export function canonicalJson(value: unknown): string {
  const text = canonicalize(value);
  if (text === undefined) throw new Error('value cannot be represented as canonical JSON');
  return text;
}

export function ledgerHashInput(previousHash: string, content: LedgerEventContent): string {
  return previousHash + canonicalJson(content);
}

export interface ChainedEvent {
  content: LedgerEventContent;
  previousHash: string;
  hash: string;
}

export type Sha256 = (text: string) => string;

/** Walks events in order; returns the first sequence number that breaks the chain, or null. */
export function firstBrokenEvent(
  events: Iterable<ChainedEvent>,
  sha256: Sha256,
  startHash = GENESIS_HASH,
  startSeq = 0,
): { seq: number; why: string } | null {
  let expectedPrevious = startHash;
  let expectedSeq = startSeq + 1;
  for (const event of events) {
    const seq = event.content.seq;
    if (seq !== expectedSeq) return { seq, why: `sequence ${expectedSeq} expected, found ${seq}` };
    if (event.previousHash !== expectedPrevious)
      return { seq, why: 'its previous-hash does not match the hash of the event before it' };
    if (sha256(ledgerHashInput(event.previousHash, event.content)) !== event.hash)
      return { seq, why: 'its content no longer matches its hash' };
    expectedPrevious = event.hash;
    expectedSeq++;
  }
  return null;
}
