import type { DataSource, EntityManager } from 'typeorm';
import {
  canonicalJson,
  firstBrokenEvent,
  GENESIS_HASH,
  type ChainedEvent,
  type LedgerEventContent,
} from '@shared/domain/ledger-hash';
import type { Verification } from '@shared/schemas/audit';
import { allSignatures } from '../signatures/signatures.repository';
import { chainHead, contentOf, eventAt, eventsInOrder } from './ledger-events.repository';
import { sha256Hex } from './ledger.repository';
import { installationPublicKey, keyIdOf, ledgerSigner } from './ledger-signing-key';
import { SignatureWalk } from './ledger-signatures';
import { checkpointProblem, readWitnessFile, witnessFilePath, type Checkpoint } from './ledger-checkpoints';
import { loadConfig } from '../../config/env';

export interface VerificationKeys {
  /** The trusted public key (PEM); by default this installation's. */
  publicKeyPem?: string;
  /** Checkpoints from the witness file; by default this installation's file. */
  checkpoints?: Checkpoint[];
}

function trusted(keys: VerificationKeys): { publicKeyPem: string; checkpoints: Checkpoint[] } {
  const publicKeyPem = keys.publicKeyPem ?? installationPublicKey();
  return { publicKeyPem, checkpoints: keys.checkpoints ?? readWitnessFile(witnessFilePath(loadConfig())) };
}

function summaryOf(result: Omit<Verification, 'summary'>): string {
  if (result.firstBroken) return `audit trail BROKEN at event ${result.firstBroken.seq}: ${result.firstBroken.why}`;
  if (result.signatureProblems.length) {
    const first = result.signatureProblems[0]!;
    return (
      `signatures BROKEN: signature ${first.id}: ` +
      `${first.why}${result.signatureProblems.length > 1 ? ` (and ${result.signatureProblems.length - 1} more)` : ''}`
    );
  }
  return (
    `audit trail verified: ${result.events} events, ${result.signatures} signatures, chain head ` +
    `${result.chainHead.seq} ${result.chainHead.hash}; ${result.signedEvents} events signed with key ` +
    `${result.keyId}, ${result.checkpoints} checkpoints hold`
  );
}

/**
 * Walks the whole ledger, recomputing every hash; checks the chain head; checks that every
 * signature's stored content still has its hash and that the ledger recorded that same hash.
 */
export async function verifyLedger(manager: EntityManager, keys: VerificationKeys = {}): Promise<Verification> {
  const started = performance.now();
  const { publicKeyPem, checkpoints } = trusted(keys);
  const walk = new SignatureWalk(publicKeyPem);
  const wanted = new Map(checkpoints.map((checkpoint) => [checkpoint.seq, null as string | null]));
  let previousHash = GENESIS_HASH;
  let lastSeq = 0;
  let events = 0;
  let firstBroken: Verification['firstBroken'] = null;
  for await (const batch of eventsInOrder(manager)) {
    const chained: ChainedEvent[] = batch.map((row) => ({
      content: contentOf(row),
      previousHash: row.previous_hash,
      hash: row.hash,
    }));
    firstBroken = firstBrokenEvent(chained, sha256Hex, previousHash, lastSeq);
    for (const row of batch) {
      if (firstBroken && Number(row.seq) >= firstBroken.seq) break;
      const signatureBroken = walk.step({
        content: contentOf(row),
        previousHash: row.previous_hash,
        hash: row.hash,
        signature: row.signature,
        keyId: row.key_id,
      });
      if (signatureBroken) {
        firstBroken = signatureBroken;
        break;
      }
      if (wanted.has(Number(row.seq))) wanted.set(Number(row.seq), row.hash);
    }
    if (firstBroken) break;
    events += batch.length;
    const last = batch[batch.length - 1]!;
    previousHash = last.hash;
    lastSeq = Number(last.seq);
  }
  firstBroken ??= walk.finish();
  const head = await chainHead(manager);
  if (!firstBroken && (head.seq !== lastSeq || head.hash !== previousHash)) {
    firstBroken = {
      seq: head.seq,
      why: `the chain head names event ${head.seq} but the last intact event is ${lastSeq}`,
    };
  }
  firstBroken ??= checkpointProblem(checkpoints, (seq) => wanted.get(seq) ?? null, publicKeyPem);

  const signatureProblems: Verification['signatureProblems'] = [];
  let signatures = 0;
  for await (const signature of allSignatures(manager)) {
    signatures++;
    const id = Number(signature.id);
    let stored: unknown;
    try {
      stored = JSON.parse(signature.content_json);
    } catch {
      signatureProblems.push({ id, why: 'its stored content is not JSON' });
      continue;
    }
    if (sha256Hex(canonicalJson(stored)) !== signature.content_hash) {
      signatureProblems.push({ id, why: 'its stored content no longer matches its hash' });
      continue;
    }
    const event = await eventAt(manager, Number(signature.ledger_seq));
    const after = event?.after as { contentHash?: string } | null;
    if (!event || event.action !== 'signature.signed' || after?.contentHash !== signature.content_hash) {
      signatureProblems.push({
        id,
        why: `the ledger event ${signature.ledger_seq} does not record this signature's hash`,
      });
    }
  }
  const result = {
    ok: !firstBroken && signatureProblems.length === 0,
    events,
    signatures,
    signedEvents: walk.signed,
    keyId: keyIdOf(publicKeyPem),
    checkpoints: checkpoints.length,
    chainHead: head,
    firstBroken,
    signatureProblems,
    milliseconds: Math.round(performance.now() - started),
  };
  return { ...result, summary: summaryOf(result) };
}

/** The self-verifying export: every event with its content and hash, and the chain head. */
export interface LedgerExport {
  format: 'ingotrace-ledger-export/2';
  exportedAt: string;
  chainHead: { seq: number; hash: string };
  /** The public key the events are signed with, and its id; a verifier compares it with the one the firm published. */
  publicKey: string;
  keyId: string;
  events: Array<{
    seq: number;
    content: LedgerEventContent;
    previousHash: string;
    hash: string;
    signature: string | null;
    keyId: string | null;
  }>;
}

/** Reads every event in one consistent snapshot (a repeatable-read transaction on one connection). */
export async function exportLedger(dataSource: DataSource): Promise<LedgerExport> {
  const runner = dataSource.createQueryRunner();
  await runner.connect();
  try {
    await runner.startTransaction('REPEATABLE READ');
    const events: LedgerExport['events'] = [];
    for await (const batch of eventsInOrder(runner.manager)) {
      for (const row of batch)
        events.push({
          seq: Number(row.seq),
          content: contentOf(row),
          previousHash: row.previous_hash,
          hash: row.hash,
          signature: row.signature,
          keyId: row.key_id,
        });
    }
    await runner.commitTransaction();
    const last = events[events.length - 1];
    const signer = ledgerSigner();
    return {
      format: 'ingotrace-ledger-export/2',
      exportedAt: new Date().toISOString(),
      chainHead: { seq: last?.seq ?? 0, hash: last?.hash ?? GENESIS_HASH },
      publicKey: signer.publicKeyPem,
      keyId: signer.keyId,
      events,
    };
  } finally {
    await runner.release();
  }
}

/**
 * Checks an export file without a database: hashes, signatures and checkpoints, with a trusted
 * public key (the firm's published one). Without one, the key inside the file is used and the
 * summary says so, with its id to compare: a file recomputed with another key is only caught
 * against the trusted key.
 */
export function verifyLedgerExport(
  bundle: unknown,
  keys: { publicKeyPem?: string | null; checkpoints?: Checkpoint[] } = {},
): { ok: boolean; summary: string; events: number } {
  const candidate = bundle as Partial<LedgerExport>;
  if (
    !candidate ||
    candidate.format !== 'ingotrace-ledger-export/2' ||
    !Array.isArray(candidate.events) ||
    !candidate.chainHead ||
    typeof candidate.publicKey !== 'string'
  ) {
    return {
      ok: false,
      events: 0,
      summary: 'not an Ingotrace audit trail export (format ingotrace-ledger-export/2 expected)',
    };
  }
  for (const event of candidate.events) {
    if (
      !event ||
      typeof event.seq !== 'number' ||
      !event.content ||
      typeof event.content.seq !== 'number' ||
      event.content.seq !== event.seq
    ) {
      return {
        ok: false,
        events: 0,
        summary: `export BROKEN at event ${event?.seq ?? '?'}: its sequence number does not match its content`,
      };
    }
  }
  let publicKeyPem: string;
  try {
    publicKeyPem = keys.publicKeyPem ?? candidate.publicKey;
    keyIdOf(publicKeyPem);
  } catch {
    return { ok: false, events: 0, summary: 'export BROKEN: its public key cannot be read' };
  }
  const broken =
    firstBrokenEvent(
      candidate.events.map((event) => ({ content: event.content, previousHash: event.previousHash, hash: event.hash })),
      sha256Hex,
    ) ?? signatureProblemIn(candidate.events, publicKeyPem);
  if (broken)
    return {
      ok: false,
      events: candidate.events.length,
      summary: `export BROKEN at event ${broken.seq}: ${broken.why}`,
    };
  const last = candidate.events[candidate.events.length - 1];
  if ((last?.seq ?? 0) !== candidate.chainHead.seq || (last?.hash ?? GENESIS_HASH) !== candidate.chainHead.hash) {
    return {
      ok: false,
      events: candidate.events.length,
      summary: `export BROKEN: its chain head does not match its last event`,
    };
  }
  const bySeq = new Map(candidate.events.map((event) => [event.seq, event.hash]));
  // A file holds the ledger as it was when exported: the checkpoints made up to then must hold in it.
  const checkpoints = (keys.checkpoints ?? []).filter((checkpoint) => checkpoint.seq <= candidate.chainHead!.seq);
  const cut = checkpointProblem(checkpoints, (seq) => bySeq.get(seq) ?? null, publicKeyPem);
  if (cut)
    return { ok: false, events: candidate.events.length, summary: `export BROKEN at event ${cut.seq}: ${cut.why}` };
  const keyNote = keys.publicKeyPem
    ? `signed with key ${keyIdOf(publicKeyPem)}`
    : `signed with the key inside the file, ${keyIdOf(publicKeyPem)} (compare it with the key your firm published)`;
  return {
    ok: true,
    events: candidate.events.length,
    summary:
      `export verified: ${candidate.events.length} events, chain head ${candidate.chainHead.seq} ` +
      `${candidate.chainHead.hash}, ${keyNote}, ${checkpoints.length} checkpoints hold`,
  };
}

function signatureProblemIn(events: LedgerExport['events'], publicKeyPem: string): { seq: number; why: string } | null {
  const walk = new SignatureWalk(publicKeyPem);
  for (const event of events) {
    const broken = walk.step({
      content: event.content,
      previousHash: event.previousHash,
      hash: event.hash,
      signature: event.signature ?? null,
      keyId: event.keyId ?? null,
    });
    if (broken) return broken;
  }
  return walk.finish();
}
