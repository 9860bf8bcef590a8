import type { EntityManager } from 'typeorm';
import type { Action } from '@shared/auth/permissions';
import type { SignatureMeaning } from '@shared/domain/signatures';

/** What a record type tells the signing service about one of its records. */
export interface SignableContent {
  title: string;
  /** Exactly what the signer is shown and what the signature's hash covers. */
  content: unknown;
  /** People who created or changed the record. */
  authorIds: number[];
}

export interface SignableRecordType {
  type: string;
  label: string;
  /** The action a signer's roles must allow. */
  action: Action;
  meanings: readonly SignatureMeaning[];
  load(manager: EntityManager, recordId: string): Promise<SignableContent | null>;
  /** Extra rules (separation of duties); returns the reason to refuse, or null. */
  refusal?(input: { signerId: number; meaning: SignatureMeaning; record: SignableContent; earlierSignatures: Array<{ signerId: number; meaning: SignatureMeaning }> }): string | null;
}

const registry = new Map<string, SignableRecordType>();

/** Each record type that can be signed registers itself once, at start-up. */
export function registerSignableRecordType(recordType: SignableRecordType): void {
  registry.set(recordType.type, recordType);
}

export function signableRecordType(type: string): SignableRecordType | undefined {
  return registry.get(type);
}

export function signableRecordTypes(): SignableRecordType[] {
  return [...registry.values()];
}
