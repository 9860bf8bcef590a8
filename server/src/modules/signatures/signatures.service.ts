import type { DataSource, EntityManager } from 'typeorm';
import { actingRole, rolesAllow } from '@shared/auth/permissions';
import { separationOfDutiesRefusal } from '@shared/auth/separation-of-duties';
import { canonicalJson } from '@shared/domain/ledger-hash';
import {
  contentHash,
  meaningsNeedingReason,
  signatureBinding,
  signatureManifestation,
  signatureStatement,
  type SignatureMeaning,
} from '@shared/domain/signatures';
import type { Person } from '@shared/schemas/people';
import type { Signature, SignatureIntent, SignaturePreparation, SignatureRequest } from '@shared/schemas/signatures';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { consumeReauthentication } from '../auth/reauthentication.service';
import { appendLedgerEvent, sha256Hex, type RequestOrigin } from '../ledger/ledger.repository';
import { signableRecordType, type SignableContent, type SignableRecordType } from './signable-records';
import { insertSignature, newestSignaturesOfType, signaturesFor, type SignatureRow } from './signatures.repository';
import { plantTimeZone } from '../organisation/organisation.repository';

const approvalMeanings: readonly SignatureMeaning[] = [
  'approved',
  'approved-for-release',
  'accepted',
  'justified',
  'confirmed',
];

async function loadSignable(
  manager: EntityManager,
  person: Person,
  intent: SignatureIntent,
): Promise<{ type: SignableRecordType; record: SignableContent }> {
  const type = signableRecordType(intent.recordType);
  if (!type) throw new AppError('NOT_FOUND', `Records of type ${intent.recordType} cannot be signed`);
  if (!type.meanings.includes(intent.meaning)) {
    throw AppError.rule(`This ${type.label} cannot be signed as "${intent.meaning}"`, {
      meaning: `Choose one of: ${type.meanings.join(', ')}`,
    });
  }
  if (!rolesAllow(person.roles, type.actionFor?.(intent.meaning) ?? type.action))
    throw new AppError('FORBIDDEN', `Your roles do not allow signing a ${type.label} as "${intent.meaning}"`);
  const record = await type.load(manager, intent.recordId);
  if (!record) throw AppError.notFound(type.label);
  return { type, record };
}

/** What the signer sees before signing, and the hash their re-authentication must be bound to. */
export async function prepareSignature(
  dataSource: DataSource,
  person: Person,
  intent: SignatureIntent,
): Promise<SignaturePreparation> {
  const { type, record } = await loadSignable(dataSource.manager, person, intent);
  // Refusals that do not depend on the password are told now, before anyone is asked for it.
  if (intent.meaning !== 'withdrawn') {
    const earlier = await signaturesFor(dataSource.manager, intent.recordType, intent.recordId);
    const refusal = signingRefusal(person.id, intent.meaning, type, record, earlier);
    if (refusal) throw AppError.rule(refusal, { meaning: 'Separation of duties' });
  }
  const hash = contentHash(record.content, sha256Hex);
  const trail = type.trailMark?.(record, intent.meaning);
  return {
    recordType: intent.recordType,
    recordId: intent.recordId,
    title: record.title,
    meaning: intent.meaning,
    content: record.content,
    contentHash: hash,
    bindingHash: signatureBinding({ ...intent, contentHash: hash }, sha256Hex),
    statement: signatureStatement,
    reasonRequired: meaningsNeedingReason.includes(intent.meaning),
    trailThroughSeq: trail?.throughSeq ?? null,
    trailEvents: trail?.events ?? null,
  };
}

function separationRefusal(
  personId: number,
  meaning: SignatureMeaning,
  record: SignableContent,
  earlier: SignatureRow[],
): string | null {
  if (meaning === 'reviewed')
    return separationOfDutiesRefusal(personId, 'review', { authorIds: record.authorIds, reviewerIds: [] });
  // Deciding on, closing or lifting a record one raised oneself is approving one's own record.
  if (meaning === 'dispositioned' || meaning === 'closed' || meaning === 'lifted')
    return separationOfDutiesRefusal(personId, 'approval', { authorIds: record.authorIds, reviewerIds: [] });
  if (approvalMeanings.includes(meaning)) {
    const reviewerIds = earlier.filter((row) => row.meaning === 'reviewed').map((row) => row.signer_id);
    return separationOfDutiesRefusal(personId, 'approval', { authorIds: record.authorIds, reviewerIds });
  }
  return null;
}

/** Separation of duties and the record type's own rules: the same answer when preparing and when signing. */
function signingRefusal(
  personId: number,
  meaning: SignatureMeaning,
  type: SignableRecordType,
  record: SignableContent,
  earlier: SignatureRow[],
): string | null {
  return (
    separationRefusal(personId, meaning, record, earlier) ??
    type.refusal?.({
      signerId: personId,
      meaning,
      record,
      earlierSignatures: earlier.map((row) => ({ signerId: row.signer_id, meaning: row.meaning })),
    }) ??
    null
  );
}

function toSignature(row: SignatureRow, currentHash: string | null): Signature {
  return {
    id: Number(row.id),
    recordType: row.record_type,
    recordId: row.record_id,
    meaning: row.meaning,
    reason: row.reason,
    signerId: row.signer_id,
    signerName: row.signer_name,
    signerRole: row.signer_role,
    signedAt: new Date(row.signed_at).toISOString(),
    manifestation: row.signed_at_text,
    contentHash: row.content_hash,
    withdrawsSignatureId: row.withdraws_signature_id === null ? null : Number(row.withdraws_signature_id),
    changedAfterSigning: currentHash !== null && currentHash !== row.content_hash,
  };
}

/**
 * Records an electronic signature: the record must still hold exactly the content the signer
 * was shown, the signer must have re-authenticated for this very signature, separation of duties
 * must allow it; the signature and its ledger event are written in one transaction.
 */
export async function signRecord(
  dataSource: DataSource,
  person: Person,
  request: SignatureRequest,
  origin: RequestOrigin,
): Promise<Signature> {
  const signature = await inTransaction(dataSource, async (manager) => {
    const { type, record } = await loadSignable(manager, person, request);
    const hash = contentHash(record.content, sha256Hex);
    if (hash !== request.contentHash)
      throw AppError.rule('The record changed while you were signing; review it again and sign anew', {
        contentHash: 'Outdated',
      });
    const trailThroughSeq = type.trailMark?.(record, request.meaning)?.throughSeq;
    if (trailThroughSeq !== undefined && request.trailThroughSeq !== trailThroughSeq) {
      throw AppError.rule(
        request.trailThroughSeq === undefined
          ? `This signature covers the audit trail (through event #${trailThroughSeq}); prepare it again to see ` +
              `how far the trail goes`
          : `The audit trail gained events while you were signing (now through event #${trailThroughSeq}, you ` +
              `were shown through #${request.trailThroughSeq}); review them and sign anew`,
        { trailThroughSeq: 'Outdated' },
      );
    }
    const reason = request.reason?.trim() || null;
    if (meaningsNeedingReason.includes(request.meaning) && (!reason || reason.length < 3)) {
      throw AppError.rule('Give a reason for this signature', {
        reason: 'A reason of at least 3 characters is required',
      });
    }
    const earlier = await signaturesFor(manager, request.recordType, request.recordId);
    if (request.meaning === 'withdrawn') {
      const withdrawn = earlier.find((row) => Number(row.id) === request.withdrawsSignatureId);
      if (!withdrawn)
        throw AppError.rule('Name the signature to withdraw', {
          withdrawsSignatureId: 'Not a signature on this record',
        });
      if (withdrawn.signer_id !== person.id)
        throw AppError.rule('Only the signer can withdraw their signature', {
          withdrawsSignatureId: 'Signed by someone else',
        });
      if (
        earlier.some(
          (row) =>
            row.withdraws_signature_id !== null && Number(row.withdraws_signature_id) === request.withdrawsSignatureId,
        )
      ) {
        throw AppError.rule('That signature is already withdrawn', { withdrawsSignatureId: 'Already withdrawn' });
      }
    } else if (request.withdrawsSignatureId !== undefined) {
      throw AppError.rule('Only a withdrawal names another signature', { withdrawsSignatureId: 'Not allowed here' });
    }
    const refusal = signingRefusal(person.id, request.meaning, type, record, earlier);
    if (refusal) throw AppError.rule(refusal, { meaning: 'Separation of duties' });

    const binding = signatureBinding(
      { recordType: request.recordType, recordId: request.recordId, meaning: request.meaning, contentHash: hash },
      sha256Hex,
    );
    const evidence = await consumeReauthentication(manager, {
      id: request.reauthenticationId,
      personId: person.id,
      bindingHash: binding,
    });
    const signerRole = actingRole(person.roles, type.actionFor?.(request.meaning) ?? type.action) ?? 'unknown';
    const signedAt = new Date();
    const manifestation = signatureManifestation({
      signerName: person.name,
      signedAt,
      meaning: request.meaning,
      timeZone: await plantTimeZone(manager),
    });
    const ledger = await appendLedgerEvent(manager, {
      actor: { id: person.id, name: person.name, role: signerRole },
      action: 'signature.signed',
      entity: { type: request.recordType, id: request.recordId },
      after: {
        meaning: request.meaning,
        contentHash: hash,
        manifestation,
        reauthenticationId: request.reauthenticationId,
        authnInstant: evidence.authnInstant.toISOString(),
        withdrawsSignatureId: request.withdrawsSignatureId ?? null,
      },
      reason,
      origin,
    });
    const row: Omit<SignatureRow, 'id'> = {
      record_type: request.recordType,
      record_id: request.recordId,
      meaning: request.meaning,
      reason,
      signer_id: person.id,
      signer_name: person.name,
      signer_role: signerRole,
      signed_at: signedAt,
      signed_at_text: manifestation,
      content_hash: hash,
      content_json: canonicalJson(record.content),
      reauthentication_id: request.reauthenticationId,
      authn_instant: evidence.authnInstant,
      withdraws_signature_id: request.withdrawsSignatureId === undefined ? null : String(request.withdrawsSignatureId),
      ledger_seq: String(ledger.seq),
    };
    const id = await insertSignature(manager, row);
    await type.afterSign?.(manager, {
      recordId: request.recordId,
      meaning: request.meaning,
      signer: { id: person.id, name: person.name, role: signerRole },
      reason,
      signatureLedgerSeq: ledger.seq,
      origin,
      record,
    });
    return toSignature({ ...row, id: String(id) }, hash);
  });
  await signableRecordType(request.recordType)?.afterCommit?.(dataSource, {
    recordId: request.recordId,
    meaning: request.meaning,
  });
  return signature;
}

/**
 * A record's signatures (or the newest of a record type), each marked when the record no longer
 * matches what was signed.
 */
export async function listSignatures(
  dataSource: DataSource,
  recordType: string,
  recordId?: string,
): Promise<Signature[]> {
  const manager = dataSource.manager;
  const rows = recordId
    ? await signaturesFor(manager, recordType, recordId)
    : await newestSignaturesOfType(manager, recordType);
  const type = signableRecordType(recordType);
  const currentHashes = new Map<string, string | null>();
  for (const id of new Set(rows.map((row) => row.record_id))) {
    const record = type ? await type.load(manager, id) : null;
    currentHashes.set(id, record ? contentHash(record.content, sha256Hex) : null);
  }
  return rows.map((row) => toSignature(row, currentHashes.get(row.record_id) ?? null));
}
