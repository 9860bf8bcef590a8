import type { DataSource, EntityManager } from 'typeorm';
import type { Action } from '@shared/auth/permissions';
import type { SignatureMeaning } from '@shared/domain/signatures';
import type { RequestOrigin } from '../ledger/ledger.repository';

/** What every record type tells the signing service about one of its records. */
export interface SignableContent {
  title: string;
  /** Exactly what the signer is shown and what the signature's hash covers. */
  content: unknown;
  /** People who created or changed the record. */
  authorIds: number[];
}

/** A record as its type loaded it: the signed content and the facts its own rules need (not signed). */
export type SignableRecord<Facts extends object = object> = SignableContent & Facts;

/** Who signed, in which role (the one that allowed the signature), for the record type's ledger events. */
export interface Signer {
  id: number;
  name: string;
  role: string;
}

export interface SignableRecordType<Facts extends object = object> {
  type: string;
  label: string;
  /** The action a signer's roles must allow. */
  action: Action;
  /** The action a person's roles must allow to see the record's signatures. */
  readAction: Action;
  /** When meanings belong to different roles (reviewed, approved for release): the action per meaning. */
  actionFor?(meaning: SignatureMeaning): Action;
  meanings: readonly SignatureMeaning[];
  /** Builds the record once per request; the same record goes to the rules and to afterSign. */
  load(manager: EntityManager, recordId: string): Promise<SignableRecord<Facts> | null>;
  /**
   * For signatures that also cover what the signer was shown beside the signed content (a lot's
   * audit trail at its review): the last audit event seq shown and how many events that is. The
   * seq goes out with the preparation and must come back unchanged with the signature, else the
   * signature is refused.
   */
  trailMark?(
    record: SignableRecord<Facts>,
    meaning: SignatureMeaning,
  ): { throughSeq: number; events: number } | undefined;
  /** Extra rules (separation of duties); returns the reason to refuse, or null. */
  refusal?(input: {
    signerId: number;
    meaning: SignatureMeaning;
    record: SignableRecord<Facts>;
    earlierSignatures: Array<{ signerId: number; meaning: SignatureMeaning }>;
  }): string | null;
  /**
   * Work after the signature has committed (e.g. a release checkpoints the audit ledger); its failure does not undo the
   * signature.
   */
  afterCommit?(dataSource: DataSource, input: { recordId: string; meaning: SignatureMeaning }): Promise<void>;
  /** What the signature changes on the record (e.g. a heat's status), inside the signature's transaction. */
  afterSign?(
    manager: EntityManager,
    input: {
      recordId: string;
      meaning: SignatureMeaning;
      signer: Signer;
      reason: string | null;
      signatureLedgerSeq: number;
      /** The request the signature came with, for the ledger events the change writes. */
      origin?: RequestOrigin;
      /** The record as loaded for this signature (what was signed and checked). */
      record: SignableRecord<Facts>;
    },
  ): Promise<void>;
}

const registry = new Map<string, SignableRecordType>();

/** Each record type that can be signed registers itself once, at start-up. */
export function registerSignableRecordType<Facts extends object>(recordType: SignableRecordType<Facts>): void {
  registry.set(recordType.type, recordType as unknown as SignableRecordType);
}

export function signableRecordType(type: string): SignableRecordType | undefined {
  return registry.get(type);
}

export function signableRecordTypes(): SignableRecordType[] {
  return [...registry.values()];
}
