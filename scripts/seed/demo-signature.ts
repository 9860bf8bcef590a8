import { randomBytes } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { SignatureMeaning } from '@shared/domain/signatures';
import { findPersonBySubject } from '../../server/src/modules/people/people.repository';
import { prepareSignature, signRecord } from '../../server/src/modules/signatures/signatures.service';

/** Says on every seeded signature's re-authentication record that no identity provider took part. */
export const seededReauthenticationPurpose = 'demo scenario: confirmed by the seed script, not by an identity provider';

/**
 * Signs a demo record as one of the demo people through the product's own signing service, so
 * the signature, its ledger event and its effects are exactly what a real signature produces.
 * Only the re-authentication is stood in for: the seed records it as confirmed itself, and its
 * purpose says so, so a seeded signature can always be told from a real one.
 */
export async function signAsDemoPerson(
  dataSource: DataSource,
  subject: string,
  intent: { recordType: string; recordId: string; meaning: SignatureMeaning; reason?: string },
): Promise<void> {
  const person = await findPersonBySubject(dataSource.manager, subject);
  if (!person) throw new Error(`demo person ${subject} is missing`);
  const preparation = await prepareSignature(dataSource, person, intent);
  const id = randomBytes(16).toString('hex');
  const now = new Date();
  await dataSource.query(
    'INSERT INTO reauthentication (id, person_id, purpose, binding_hash, return_to, started_at, confirmed_at, ' +
      'authn_instant) VALUES (?, ?, ?, ?, ?, ?, ?, ?)',
    [id, person.id, seededReauthenticationPurpose, preparation.bindingHash, '/', now, now, now],
  );
  await signRecord(
    dataSource,
    person,
    {
      ...intent,
      contentHash: preparation.contentHash,
      reauthenticationId: id,
      ...(preparation.trailThroughSeq === null ? {} : { trailThroughSeq: preparation.trailThroughSeq }),
    },
    { requestId: 'demo-seed', clientAddress: null },
  );
}
