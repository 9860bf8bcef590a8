import { appendFileSync, existsSync, mkdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import type { DataSource } from 'typeorm';
import { canonicalJson } from '@shared/domain/ledger-hash';
import type { AppConfig } from '../../config/env';
import { inTransaction } from '../../db/transaction';
import { queueMail } from '../mail/mail-outbox';
import { appendLedgerEvent, lockChainHead } from './ledger.repository';
import { keyIdOf, ledgerSigner, verifyWithPublicKey } from './ledger-signing-key';

/**
 * Checkpoints: the chain head, signed, sent to witnesses outside the database — the quality
 * mailbox and an append-only file — at least daily, at every release and at every export. A
 * ledger cut off (or rewritten) after a checkpoint no longer contains the checkpointed event
 * with its hash, which the verification names.
 */
export interface Checkpoint {
  seq: number;
  hash: string;
  at: string;
  keyId: string;
  reason: string;
  signature: string;
}

export const checkpointStatement = ({ seq, hash, at, keyId, reason }: Omit<Checkpoint, 'signature'>) =>
  `ingotrace-ledger-checkpoint:${canonicalJson({ seq, hash, at, keyId, reason })}`;

/**
 * When checkpoints are taken besides daily and at exports; the demo seed, which replays months of releases at once,
 * takes one at its end instead.
 */
export const checkpointTriggers = { onRelease: true };

/** One witness file per ledger (database): a rebuilt database starts a new ledger and a new file. */
export const witnessFilePath = (config: Pick<AppConfig, 'DATA_DIR' | 'DB_NAME'>) =>
  join(config.DATA_DIR, 'ledger-witness', `${config.DB_NAME}.checkpoints.jsonl`);

export function readWitnessFile(path: string): Checkpoint[] {
  if (!existsSync(path)) return [];
  return readFileSync(path, 'utf8')
    .split('\n')
    .filter((line) => line.trim())
    .map((line) => JSON.parse(line) as Checkpoint);
}

/**
 * Checkpoints the chain head now; the mail is queued with the checkpoint's own ledger event, the file line written
 * after it commits.
 */
export async function checkpointLedger(
  dataSource: DataSource,
  config: Pick<AppConfig, 'DATA_DIR' | 'DB_NAME' | 'LEDGER_KEY_FILE' | 'QUALITY_MAILBOX'>,
  reason: 'daily' | 'release' | 'export' | 'seed',
): Promise<Checkpoint> {
  const signer = ledgerSigner(config);
  const checkpoint = await inTransaction(dataSource, async (manager) => {
    const head = await lockChainHead(manager);
    const unsigned = {
      seq: Number(head!.seq),
      hash: head!.hash,
      at: new Date().toISOString(),
      keyId: signer.keyId,
      reason,
    };
    const signed: Checkpoint = { ...unsigned, signature: signer.signStatement(checkpointStatement(unsigned)) };
    await queueMail(manager, {
      to: [config.QUALITY_MAILBOX],
      subject: `Audit trail checkpoint: event ${signed.seq}`,
      text: [
        'Keep this message: it witnesses the state of the Ingotrace audit trail outside its database.',
        `Event ${signed.seq}, hash ${signed.hash}, at ${signed.at} (${reason}).`,
        `Key ${signed.keyId}. An audit trail that no longer holds this event with this hash was cut off or rewritten.`,
        '',
        JSON.stringify(signed),
      ].join('\n'),
      event: 'ledger.checkpointed',
      entity: { type: 'audit-ledger', id: signed.seq },
    });
    await appendLedgerEvent(manager, {
      actor: { id: null, name: 'Ingotrace', role: null },
      action: 'ledger.checkpointed',
      entity: { type: 'audit-ledger', id: signed.seq },
      after: signed,
    });
    return signed;
  });
  const file = witnessFilePath(config);
  mkdirSync(dirname(file), { recursive: true, mode: 0o700 });
  appendFileSync(file, `${JSON.stringify(checkpoint)}\n`, { mode: 0o600, flag: 'a' });
  return checkpoint;
}

/**
 * The first checkpoint the ledger contradicts, or null. `hashAt` gives the ledger's hash of an event (null when it has
 * none).
 */
export function checkpointProblem(
  checkpoints: readonly Checkpoint[],
  hashAt: (seq: number) => string | null,
  publicKeyPem: string,
): { seq: number; why: string } | null {
  const keyId = keyIdOf(publicKeyPem);
  for (const checkpoint of checkpoints) {
    const { signature, ...statement } = checkpoint;
    if (checkpoint.keyId !== keyId || !verifyWithPublicKey(publicKeyPem, checkpointStatement(statement), signature)) {
      return {
        seq: checkpoint.seq,
        why: `the checkpoint of ${checkpoint.at} is not signed with the audit trail's key`,
      };
    }
    const hash = hashAt(checkpoint.seq);
    if (hash === null)
      return {
        seq: checkpoint.seq,
        why:
          `the checkpoint of ${checkpoint.at} names this event, which the audit trail no longer holds: it was ` +
          `cut off after the checkpoint`,
      };
    if (hash !== checkpoint.hash)
      return {
        seq: checkpoint.seq,
        why:
          `the checkpoint of ${checkpoint.at} gives this event another hash: the audit trail was rewritten ` +
          `after the checkpoint`,
      };
  }
  return null;
}

/** Starts the daily checkpoint: one at start when the last is older than a day, then every day. */
export function startDailyCheckpoints(
  config: AppConfig,
  dataSourceOf: () => DataSource | null,
  onError: (error: unknown) => void,
): () => void {
  const day = 24 * 3600_000;
  const run = () => {
    const dataSource = dataSourceOf();
    if (!dataSource?.isInitialized) return;
    const last = readWitnessFile(witnessFilePath(config)).at(-1);
    if (last && Date.now() - new Date(last.at).getTime() < day) return;
    checkpointLedger(dataSource, config, 'daily').catch(onError);
  };
  const first = setTimeout(run, 10_000);
  const timer = setInterval(run, 3600_000);
  first.unref();
  timer.unref();
  return () => {
    clearTimeout(first);
    clearInterval(timer);
  };
}
